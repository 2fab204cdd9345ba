import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type {
  SeriesCreateInput,
  SeriesDetail,
  SeriesList,
  SeriesPreview,
  SeriesSummary,
  SeriesTrialsAnswer,
  SeriesUpdateInput,
} from '../../../shared/schemas/series';
import { http } from '../../lib/http';

export type { SeriesDetail, SeriesSummary };

export const seriesKeys = {
  all: ['series'] as const,
  list: () => [...seriesKeys.all, 'list'] as const,
  one: (id: number) => [...seriesKeys.all, 'one', id] as const,
};

export const fetchSeriesList = () => http<SeriesList>('/api/series?pageSize=100');
export const seriesListQuery = () => queryOptions({ queryKey: seriesKeys.list(), queryFn: fetchSeriesList });
export const useSeriesList = () => useQuery(seriesListQuery());

export const fetchSeries = (id: number) => http<SeriesDetail>(`/api/series/${id}`);
export const seriesQuery = (id: number) =>
  queryOptions({ queryKey: seriesKeys.one(id), queryFn: () => fetchSeries(id) });
export const useSeries = (id: number) => useQuery(seriesQuery(id));

export const previewCells = (factors: SeriesCreateInput['factors']) =>
  http<SeriesPreview>('/api/series/preview', { method: 'POST', json: { factors } });

export function useCreateSeries() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: Partial<SeriesCreateInput>) =>
      http<SeriesDetail>('/api/series', { method: 'POST', json: input }),
    onSuccess: () => qc.invalidateQueries({ queryKey: seriesKeys.all }),
  });
}

export function useUpdateSeries(id: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: SeriesUpdateInput) => http<SeriesDetail>(`/api/series/${id}`, { method: 'PATCH', json: input }),
    onSuccess: (s) => qc.setQueryData(seriesKeys.one(id), s),
  });
}

export function useCreateSeriesTrials(id: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: () => http<SeriesTrialsAnswer>(`/api/series/${id}/trials`, { method: 'POST' }),
    onSuccess: (r) => {
      qc.setQueryData(seriesKeys.one(id), r.series);
      void qc.invalidateQueries({ queryKey: ['trials'] });
    },
  });
}
