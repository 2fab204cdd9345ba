import { queryOptions, useQuery } from '@tanstack/react-query';
import { http } from '../../lib/http';

export type Vocabularies = {
  fibres: { term: string; note: string | null }[];
  weaves: { term: string; note: string | null }[];
  techniques: { term: string; note: string | null }[];
  dyestuffs: { name: string; ciName: string | null }[];
  mordants: { name: string; formula: string | null; status: string; signalWord: string | null; hStatements: string[]; ppe: string | null }[];
};

export const vocabularyKeys = { all: ['vocabularies'] as const };
export const fetchVocabularies = () => http<Vocabularies>('/api/vocabularies');
export const vocabulariesQuery = () => queryOptions({ queryKey: vocabularyKeys.all, queryFn: fetchVocabularies, staleTime: 10 * 60_000 });
export const useVocabularies = () => useQuery(vocabulariesQuery());
