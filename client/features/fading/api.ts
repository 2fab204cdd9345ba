import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { FadingPairCreateInput, FadingPairList } from '../../../shared/schemas/fading';
import { http } from '../../lib/http';
import { pieceKeys } from '../pieces';

export const fadingKeys = { of: (pieceId: number) => ['fading-pairs', pieceId] as const };
export const fadingQuery = (pieceId: number) =>
  queryOptions({
    queryKey: fadingKeys.of(pieceId),
    queryFn: () => http<FadingPairList>(`/api/pieces/${pieceId}/fading-pairs`),
  });
export const useFadingPairs = (pieceId: number) => useQuery(fadingQuery(pieceId));

function useInvalidate(pieceId: number) {
  const qc = useQueryClient();
  return () => {
    void qc.invalidateQueries({ queryKey: fadingKeys.of(pieceId) });
    void qc.invalidateQueries({ queryKey: pieceKeys.history(pieceId) });
  };
}

export function useAddFadingPair(pieceId: number) {
  const invalidate = useInvalidate(pieceId);
  return useMutation({
    mutationFn: (input: FadingPairCreateInput) =>
      http(`/api/pieces/${pieceId}/fading-pairs`, { method: 'POST', json: input }),
    onSuccess: invalidate,
  });
}

export function useRemoveFadingPair(pieceId: number) {
  const invalidate = useInvalidate(pieceId);
  return useMutation({
    mutationFn: (pairId: number) => http<void>(`/api/pieces/${pieceId}/fading-pairs/${pairId}`, { method: 'DELETE' }),
    onSuccess: invalidate,
  });
}
