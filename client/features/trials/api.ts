import { keepPreviousData, queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type {
  MeasurementInput,
  MeasurementView,
  PieceTrials,
  StepsInput,
  SubstitutionInput,
  TrialCreateInput,
  TrialList,
  TrialListQuery,
  TrialSummaryView,
  TrialUpdateInput,
  TrialView,
  TrialPhotoAnswer,
} from '../../../shared/schemas/trial';
import type { PhotoResponse } from '../../../shared/schemas/photo';
import { UPLOAD_FIELD } from '../../../shared/schemas/photo';
import { ApiError, http } from '../../lib/http';
import { fadingKeys } from '../fading';
import { pieceKeys } from '../pieces';

export type { TrialSummaryView, TrialView, MeasurementView, TrialList, PieceTrials };

/** Every trial query key comes from here, so mutations invalidate exactly what changed. */
export const trialKeys = {
  all: ['trials'] as const,
  lists: () => [...trialKeys.all, 'list'] as const,
  list: (q: TrialListQuery) => [...trialKeys.lists(), q] as const,
  detail: (id: number) => [...trialKeys.all, 'detail', id] as const,
  ofPiece: (pieceId: number) => [...trialKeys.all, 'piece', pieceId] as const,
};

const qs = (q: Record<string, unknown>) => {
  const p = new URLSearchParams();
  for (const [k, v] of Object.entries(q)) if (v !== undefined && v !== null && v !== '') p.set(k, String(v));
  const s = p.toString();
  return s ? `?${s}` : '';
};

export const fetchTrials = (q: TrialListQuery) => http<TrialList>(`/api/trials${qs(q)}`);
export const fetchTrial = (id: number) => http<{ trial: TrialView }>(`/api/trials/${id}`).then((r) => r.trial);
export const fetchPieceTrials = (pieceId: number) => http<PieceTrials>(`/api/pieces/${pieceId}/trials`);
/** The printable sample card of one trial (a plain link: the browser opens the PDF). */
export const trialCardUrl = (id: number) => `/api/trials/${id}/card.pdf`;

export const trialsQuery = (q: TrialListQuery) =>
  queryOptions({ queryKey: trialKeys.list(q), queryFn: () => fetchTrials(q), placeholderData: keepPreviousData });
export const trialQuery = (id: number) =>
  queryOptions({ queryKey: trialKeys.detail(id), queryFn: () => fetchTrial(id) });
export const pieceTrialsQuery = (pieceId: number) =>
  queryOptions({ queryKey: trialKeys.ofPiece(pieceId), queryFn: () => fetchPieceTrials(pieceId) });

export const useTrials = (q: TrialListQuery) => useQuery(trialsQuery(q));
export const useTrial = (id: number) => useQuery(trialQuery(id));
export const usePieceTrials = (pieceId: number) => useQuery(pieceTrialsQuery(pieceId));

type Created = { trial: TrialView; notified: boolean };
export const createTrial = (input: TrialCreateInput) =>
  input.pieceId != null
    ? http<Created>(`/api/pieces/${input.pieceId}/trials`, { method: 'POST', json: input })
    : http<Created>('/api/trials', { method: 'POST', json: input });

/** After any change to one trial: its page, the lists and its piece's side-by-side view. */
function useTrialInvalidation() {
  const qc = useQueryClient();
  // Returned so the mutation waits for the refetch: a form that closes on success then shows the saved values.
  return (trial?: Pick<TrialView, 'id'> | null) =>
    Promise.all([
      trial ? qc.invalidateQueries({ queryKey: trialKeys.detail(trial.id) }) : null,
      qc.invalidateQueries({ queryKey: trialKeys.lists() }),
      qc.invalidateQueries({ queryKey: [...trialKeys.all, 'piece'] }),
    ]);
}

export function useCreateTrial() {
  const invalidate = useTrialInvalidation();
  return useMutation({ mutationFn: createTrial, onSuccess: ({ trial }) => invalidate(trial) });
}

export function useUpdateTrial(id: number) {
  const invalidate = useTrialInvalidation();
  return useMutation({
    mutationFn: (input: TrialUpdateInput) =>
      http<{ trial: TrialView }>(`/api/trials/${id}`, { method: 'PATCH', json: input }),
    onSuccess: () => invalidate({ id }),
  });
}

export function useDeleteTrial(id: number) {
  const invalidate = useTrialInvalidation();
  return useMutation({
    mutationFn: () => http<void>(`/api/trials/${id}`, { method: 'DELETE' }),
    onSuccess: () => invalidate(null),
  });
}

export function useReplaceSteps(id: number) {
  const invalidate = useTrialInvalidation();
  return useMutation({
    mutationFn: (input: StepsInput) =>
      http<{ trial: TrialView; warning: boolean }>(`/api/trials/${id}/steps`, { method: 'PUT', json: input }),
    onSuccess: () => invalidate({ id }),
  });
}

export function useSaveSubstitution(trialId: number) {
  const invalidate = useTrialInvalidation();
  return useMutation({
    mutationFn: ({ id, ...input }: SubstitutionInput & { id?: number }) =>
      id
        ? http(`/api/trials/${trialId}/substitutions/${id}`, { method: 'PUT', json: input })
        : http(`/api/trials/${trialId}/substitutions`, { method: 'POST', json: input }),
    onSuccess: () => invalidate({ id: trialId }),
  });
}

export function useDeleteSubstitution(trialId: number) {
  const invalidate = useTrialInvalidation();
  return useMutation({
    mutationFn: (id: number) => http<void>(`/api/trials/${trialId}/substitutions/${id}`, { method: 'DELETE' }),
    onSuccess: () => invalidate({ id: trialId }),
  });
}

export function useAddMeasurement(trialId: number) {
  const invalidate = useTrialInvalidation();
  return useMutation({
    mutationFn: (input: MeasurementInput) =>
      http<{ measurement: MeasurementView }>(`/api/trials/${trialId}/measurements`, { method: 'POST', json: input }),
    onSuccess: () => invalidate({ id: trialId }),
  });
}

export function useDeleteMeasurement(trialId: number) {
  const invalidate = useTrialInvalidation();
  return useMutation({
    mutationFn: (id: number) => http<void>(`/api/trials/${trialId}/measurements/${id}`, { method: 'DELETE' }),
    onSuccess: () => invalidate({ id: trialId }),
  });
}

export function useImportMeasurements(trialId: number) {
  const invalidate = useTrialInvalidation();
  return useMutation({
    mutationFn: (csv: string) =>
      http<{ imported: number }>(`/api/trials/${trialId}/measurements/import`, {
        method: 'POST',
        body: csv,
        headers: { 'Content-Type': 'text/csv' },
      }),
    onSuccess: () => invalidate({ id: trialId }),
  });
}

export function useUploadSwatch(trialId: number) {
  const invalidate = useTrialInvalidation();
  return useMutation({
    mutationFn: async (file: File) => {
      const form = new FormData();
      form.append(UPLOAD_FIELD, file);
      const { photo } = await http<TrialPhotoAnswer>(`/api/trials/${trialId}/photos`, { method: 'POST', body: form });
      // The swatch's palette is read by its ingest job: wait for it, so the trial shows its colour when this ends.
      let ingest = photo.ingest;
      while (ingest.stage !== 'done' && ingest.stage !== 'failed') {
        await new Promise((r) => setTimeout(r, 1500));
        ingest = (await http<PhotoResponse>(`/api/photos/${photo.id}`)).photo.ingest;
      }
      if (ingest.stage === 'failed')
        throw new ApiError(422, 'ingest_failed', `The swatch photo could not be processed: ${ingest.error ?? ''}`);
      return { photo };
    },
    onSuccess: () => invalidate({ id: trialId }),
  });
}

/** A piece's readings are trial targets, fading-pair sides and history lines: each of those is read again. */
const invalidatePieceReadings = (qc: ReturnType<typeof useQueryClient>, pieceId: number) =>
  Promise.all([
    qc.invalidateQueries({ queryKey: trialKeys.all }),
    qc.invalidateQueries({ queryKey: fadingKeys.of(pieceId) }),
    qc.invalidateQueries({ queryKey: pieceKeys.history(pieceId) }),
  ]);

/** Readings of the original (the piece itself): trials aiming at them are recomputed, so every trial query refreshes. */
export function useAddPieceReading(pieceId: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: MeasurementInput) =>
      http<{ measurement: MeasurementView }>(`/api/pieces/${pieceId}/measurements`, { method: 'POST', json: input }),
    onSuccess: () => invalidatePieceReadings(qc, pieceId),
  });
}

export function useDeletePieceReading(pieceId: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (id: number) => http<void>(`/api/pieces/${pieceId}/measurements/${id}`, { method: 'DELETE' }),
    onSuccess: () => invalidatePieceReadings(qc, pieceId),
  });
}
