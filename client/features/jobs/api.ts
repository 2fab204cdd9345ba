import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { http } from '../../lib/http';
import type { JobList, JobView } from '../../../shared/schemas/jobs';

export const jobKeys = {
  all: ['jobs'] as const,
  forPhoto: (photoId: number) => ['jobs', 'photo', photoId] as const,
};

export const fetchPhotoJobs = (photoId: number) => http<JobList>(`/api/jobs?photoId=${photoId}&pageSize=5`);

const busy = (list?: JobList) => list?.items.some((j) => j.state === 'queued' || j.state === 'running') ?? false;

/** The jobs of one photo, newest first; polls while one is queued or running. */
export const photoJobsQuery = (photoId: number) =>
  queryOptions({
    queryKey: jobKeys.forPhoto(photoId),
    queryFn: () => fetchPhotoJobs(photoId),
    refetchInterval: (q) => (busy(q.state.data) ? 1500 : false),
  });
export const usePhotoJobs = (photoId: number, enabled = true) => useQuery({ ...photoJobsQuery(photoId), enabled });

export const retryJob = (id: number) => http<{ job: JobView }>(`/api/jobs/${id}/retry`, { method: 'POST' });

export function useRetryJob() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: retryJob, onSuccess: () => qc.invalidateQueries({ queryKey: jobKeys.all }) });
}
