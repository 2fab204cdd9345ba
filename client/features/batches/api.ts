import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type {
  BatchCreateInput,
  BatchDetail,
  BatchEventInput,
  BatchEventOut,
  BatchList,
  BatchSummary,
} from '../../../shared/schemas/batches';
import { http } from '../../lib/http';

export type { BatchDetail, BatchSummary };
export type BatchFilters = { status?: string; kind?: string; due?: boolean };

export const batchKeys = {
  all: ['batches'] as const,
  list: (f: BatchFilters) => [...batchKeys.all, 'list', f] as const,
  one: (id: number) => [...batchKeys.all, 'one', id] as const,
};

const qs = (f: BatchFilters) => {
  const p = new URLSearchParams({ pageSize: '100' });
  if (f.status) p.set('status', f.status);
  if (f.kind) p.set('kind', f.kind);
  if (f.due) p.set('due', '1');
  return p.toString();
};

export const fetchBatches = (f: BatchFilters) => http<BatchList>(`/api/batches?${qs(f)}`);
export const batchesQuery = (f: BatchFilters = {}) =>
  queryOptions({ queryKey: batchKeys.list(f), queryFn: () => fetchBatches(f) });
export const useBatches = (f: BatchFilters = {}) => useQuery(batchesQuery(f));

export const fetchBatch = (id: number) => http<BatchDetail>(`/api/batches/${id}`);
export const batchQuery = (id: number) => queryOptions({ queryKey: batchKeys.one(id), queryFn: () => fetchBatch(id) });
export const useBatch = (id: number) => useQuery(batchQuery(id));

export function useAddBatchEvent(id: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: Partial<BatchEventInput> & { reason?: string }) =>
      http<{ event: BatchEventOut; batch: BatchDetail }>(`/api/batches/${id}/events`, { method: 'POST', json: input }),
    onSuccess: (r) => {
      qc.setQueryData(batchKeys.one(id), r.batch);
      void qc.invalidateQueries({ queryKey: batchKeys.all });
    },
  });
}

export function useCreateBatch() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: Partial<BatchCreateInput>) =>
      http<BatchDetail>('/api/batches', { method: 'POST', json: input }),
    onSuccess: () => qc.invalidateQueries({ queryKey: batchKeys.all }),
  });
}
