import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { http } from '../../lib/http';
import type { JobView } from '../../../shared/schemas/jobs';
import type { FixityLatest } from '../../../shared/schemas/fixity';

export const fixityKeys = { latest: ['fixity', 'latest'] as const };

export const fetchFixityLatest = () => http<FixityLatest>('/api/admin/fixity/latest');
export const fixityLatestQuery = () =>
  queryOptions({
    queryKey: fixityKeys.latest,
    queryFn: fetchFixityLatest,
    refetchInterval: (q) =>
      q.state.data?.job && ['queued', 'running'].includes(q.state.data.job.state) ? 1500 : false,
  });
export const useFixityLatest = () => useQuery(fixityLatestQuery());

export const startFixity = () => http<{ job: JobView }>('/api/admin/fixity', { method: 'POST' });
export function useStartFixity() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: startFixity,
    onSuccess: () => qc.invalidateQueries({ queryKey: fixityKeys.latest }),
  });
}
