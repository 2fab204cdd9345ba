import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type {
  SavedSearchCreateInput,
  SavedSearchListResponse,
  SavedSearchOut,
} from '../../../shared/schemas/saved-search';
import { http } from '../../lib/http';

export type SavedSearch = SavedSearchOut;

export const savedSearchKeys = { all: ['saved-searches'] as const };
// The home page lists saved searches too: saving or deleting one refreshes it.
const homeKey = ['home'] as const;

export const fetchSavedSearches = () => http<SavedSearchListResponse>('/api/saved-searches');
export const savedSearchesQuery = () => queryOptions({ queryKey: savedSearchKeys.all, queryFn: fetchSavedSearches });
export const useSavedSearches = (enabled = true) => useQuery({ ...savedSearchesQuery(), enabled });

export function useSaveSearch() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: SavedSearchCreateInput) =>
      http<{ savedSearch: SavedSearch }>('/api/saved-searches', { method: 'POST', json: input }),
    onSuccess: () =>
      Promise.all([
        qc.invalidateQueries({ queryKey: savedSearchKeys.all }),
        qc.invalidateQueries({ queryKey: homeKey }),
      ]),
  });
}

export function useDeleteSavedSearch() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (id: number) => http<void>(`/api/saved-searches/${id}`, { method: 'DELETE' }),
    onSuccess: () =>
      Promise.all([
        qc.invalidateQueries({ queryKey: savedSearchKeys.all }),
        qc.invalidateQueries({ queryKey: homeKey }),
      ]),
  });
}
