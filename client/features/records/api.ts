import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type {
  AnalysisCreateInput,
  AnalysisListResponse,
  AnalysisOut,
  ConditionCreateInput,
  ConditionListResponse,
  DisplayCheckResponse,
  DisplayCreateInput,
  DisplayListResponse,
} from '../../../shared/schemas/records';
import { REPORT_FIELD } from '../../../shared/schemas/records';
import { http } from '../../lib/http';
import { pieceKeys } from '../pieces';

export type Analysis = AnalysisOut;

export const recordKeys = {
  analyses: (pieceId: number) => ['records', 'analyses', pieceId] as const,
  conditions: (pieceId: number) => ['records', 'conditions', pieceId] as const,
  displays: (pieceId: number) => ['records', 'displays', pieceId] as const,
};

export const analysesQuery = (pieceId: number) =>
  queryOptions({
    queryKey: recordKeys.analyses(pieceId),
    queryFn: () => http<AnalysisListResponse>(`/api/pieces/${pieceId}/analyses`),
  });
export const useAnalyses = (pieceId: number) => useQuery(analysesQuery(pieceId));

export const conditionsQuery = (pieceId: number) =>
  queryOptions({
    queryKey: recordKeys.conditions(pieceId),
    queryFn: () => http<ConditionListResponse>(`/api/pieces/${pieceId}/condition-reports`),
  });
export const useConditions = (pieceId: number, enabled: boolean) => useQuery({ ...conditionsQuery(pieceId), enabled });

export const displaysQuery = (pieceId: number) =>
  queryOptions({
    queryKey: recordKeys.displays(pieceId),
    queryFn: () => http<DisplayListResponse>(`/api/pieces/${pieceId}/displays`),
  });
export const useDisplays = (pieceId: number, enabled: boolean) => useQuery({ ...displaysQuery(pieceId), enabled });

function useInvalidate(pieceId: number) {
  const qc = useQueryClient();
  return (key: readonly unknown[]) => {
    void qc.invalidateQueries({ queryKey: key });
    void qc.invalidateQueries({ queryKey: pieceKeys.detail(pieceId) });
    void qc.invalidateQueries({ queryKey: [...pieceKeys.all, 'history', pieceId] });
  };
}

/** Records the analysis, then sends its report PDF (if any) to the analysis it made. */
export function useCreateAnalysis(pieceId: number) {
  const invalidate = useInvalidate(pieceId);
  return useMutation({
    mutationFn: async ({ input, report }: { input: AnalysisCreateInput; report: File | null }) => {
      const { analysis } = await http<{ analysis: Analysis }>(`/api/pieces/${pieceId}/analyses`, {
        method: 'POST',
        json: input,
      });
      if (!report) return analysis;
      const form = new FormData();
      form.append(REPORT_FIELD, report, report.name);
      return (await http<{ analysis: Analysis }>(`/api/analyses/${analysis.id}/report`, { method: 'POST', body: form }))
        .analysis;
    },
    onSettled: () => invalidate(recordKeys.analyses(pieceId)),
  });
}

export function useCreateCondition(pieceId: number) {
  const invalidate = useInvalidate(pieceId);
  return useMutation({
    mutationFn: (input: ConditionCreateInput) =>
      http(`/api/pieces/${pieceId}/condition-reports`, { method: 'POST', json: input }),
    onSuccess: () => invalidate(recordKeys.conditions(pieceId)),
  });
}

export function useCheckDisplay(pieceId: number) {
  return useMutation({
    mutationFn: (input: DisplayCreateInput) =>
      http<DisplayCheckResponse>(`/api/pieces/${pieceId}/displays/check`, { method: 'POST', json: input }),
  });
}

export function useCreateDisplay(pieceId: number) {
  const invalidate = useInvalidate(pieceId);
  return useMutation({
    mutationFn: (input: DisplayCreateInput) => http(`/api/pieces/${pieceId}/displays`, { method: 'POST', json: input }),
    onSuccess: () => invalidate(recordKeys.displays(pieceId)),
  });
}
