import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Vocabularies } from '../../../shared/schemas/vocabularies';
import { http } from '../../lib/http';

export type { Vocabularies };

export const vocabularyKeys = { all: ['vocabularies'] as const };
export const fetchVocabularies = () => http<Vocabularies>('/api/vocabularies');
export const vocabulariesQuery = () =>
  queryOptions({ queryKey: vocabularyKeys.all, queryFn: fetchVocabularies, staleTime: 10 * 60_000 });
export const useVocabularies = () => useQuery(vocabulariesQuery());
