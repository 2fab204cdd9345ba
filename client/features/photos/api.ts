import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useEffect } from 'react';
import type { IngestRetryResponse, IngestStage } from '../../../shared/schemas/ingest';
import type {
  PalettesResponse,
  PhotoResponse,
  PhotoUpdateInput,
  PhotoUploadResponse,
  Rect,
  ReferencePatchResponse,
  ChartResponse,
  RegionCreateInput,
  RegionOut,
  RegionSavedResponse,
  RegionUpdateInput,
} from '../../../shared/schemas/photo';
import { UPLOAD_FIELD } from '../../../shared/schemas/photo';
import type { ChartInput, ToleranceLevelsInput as ToleranceLevels } from '../../../shared/schemas/chart';
import { ApiError, http } from '../../lib/http';
import { pieceKeys, type Photo } from '../pieces';

export type { Palettes } from '../../../shared/schemas/photo';
export type Region = RegionOut;

export const photoKeys = { one: (id: number) => ['photos', id] as const };
export const fetchPhoto = (id: number) => http<PhotoResponse>(`/api/photos/${id}`);
export const photoQuery = (id: number) => queryOptions({ queryKey: photoKeys.one(id), queryFn: () => fetchPhoto(id) });
/** One photo with its palettes and regions (the zoom page names it and links back to its piece). */
export const usePhoto = (id: number, enabled = true) => useQuery({ ...photoQuery(id), enabled });

const settled = (stage: IngestStage | undefined) => stage === 'done' || stage === 'failed';

/**
 * A photo whose processing (the ingest job) is under way, asked for again every 1.5 s until it is done or failed;
 * then the piece is read again, so its panel shows the previews and palettes.
 */
export function useIngestProgress(photo: Photo) {
  const qc = useQueryClient();
  const query = useQuery({
    ...photoQuery(photo.id),
    enabled: !settled(photo.ingest.stage),
    refetchInterval: (q) => (settled(q.state.data?.photo.ingest.stage) ? false : 1500),
  });
  const ingest = query.data?.photo.ingest ?? photo.ingest;
  const finished = settled(ingest.stage) && !settled(photo.ingest.stage);
  useEffect(() => {
    if (!finished) return;
    if (photo.pieceId) void qc.invalidateQueries({ queryKey: pieceKeys.detail(photo.pieceId) });
    void qc.invalidateQueries({ queryKey: ['jobs'] });
  }, [finished, photo.pieceId, qc]);
  return ingest;
}

/** Start a failed ingest again (who may edit the photo). */
export function useRetryIngest(photo: Photo) {
  const qc = useQueryClient();
  const invalidate = useInvalidate(photo.pieceId);
  return useMutation({
    mutationFn: () => http<IngestRetryResponse>(`/api/photos/${photo.id}/ingest/retry`, { method: 'POST' }),
    onSuccess: () => {
      void qc.invalidateQueries({ queryKey: photoKeys.one(photo.id) });
      invalidate();
    },
  });
}

/**
 * One file per request so each gets its own progress bar. XMLHttpRequest because
 * fetch() reports no upload progress; `onUploaded` marks the switch to processing.
 */
export function uploadPhoto(
  pieceId: number,
  file: File,
  on: { progress: (fraction: number) => void; uploaded: () => void },
) {
  return new Promise<PhotoUploadResponse>((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', `/api/pieces/${pieceId}/photos`);
    xhr.setRequestHeader('Accept', 'application/json');
    xhr.responseType = 'json';
    xhr.upload.onprogress = (e) => e.lengthComputable && on.progress(e.loaded / e.total);
    xhr.upload.onload = () => on.uploaded();
    xhr.onload = () => {
      const body = xhr.response;
      if (xhr.status >= 200 && xhr.status < 300) return resolve(body);
      const e = body?.error ?? {};
      reject(
        new ApiError(xhr.status, e.code ?? 'http_error', e.message ?? `Upload failed (${xhr.status}).`, e.details),
      );
    };
    xhr.onerror = () =>
      reject(new ApiError(0, 'network', 'The upload was interrupted; check the connection and try again.'));
    const form = new FormData();
    form.append(UPLOAD_FIELD, file, file.name);
    xhr.send(form);
  });
}

function useInvalidate(pieceId: number | null) {
  const qc = useQueryClient();
  return () => {
    if (pieceId) {
      void qc.invalidateQueries({ queryKey: pieceKeys.detail(pieceId) });
      void qc.invalidateQueries({ queryKey: pieceKeys.history(pieceId) });
    }
    void qc.invalidateQueries({ queryKey: pieceKeys.lists() });
  };
}

export function useUploadDone(pieceId: number) {
  return useInvalidate(pieceId);
}

export function useUpdatePhoto(photo: Photo) {
  const invalidate = useInvalidate(photo.pieceId);
  return useMutation({
    mutationFn: (input: PhotoUpdateInput) =>
      http<PhotoResponse>(`/api/photos/${photo.id}`, { method: 'PATCH', json: input }),
    onSuccess: invalidate,
  });
}

export function useDeletePhoto(photo: Photo) {
  const invalidate = useInvalidate(photo.pieceId);
  return useMutation({
    mutationFn: () => http<void>(`/api/photos/${photo.id}`, { method: 'DELETE' }),
    onSuccess: invalidate,
  });
}

export function useAddRegion(photo: Photo) {
  const invalidate = useInvalidate(photo.pieceId);
  return useMutation({
    mutationFn: (input: RegionCreateInput) =>
      http<RegionSavedResponse>(`/api/photos/${photo.id}/regions`, { method: 'POST', json: input }),
    onSuccess: invalidate,
  });
}

export function useUpdateRegion(photo: Photo) {
  const invalidate = useInvalidate(photo.pieceId);
  return useMutation({
    mutationFn: ({ id, ...input }: RegionUpdateInput & { id: number }) =>
      http<RegionSavedResponse>(`/api/photos/${photo.id}/regions/${id}`, { method: 'PATCH', json: input }),
    onSuccess: invalidate,
  });
}

export function useDeleteRegion(photo: Photo) {
  const invalidate = useInvalidate(photo.pieceId);
  return useMutation({
    mutationFn: (id: number) => http<PalettesResponse>(`/api/photos/${photo.id}/regions/${id}`, { method: 'DELETE' }),
    onSuccess: invalidate,
  });
}

export function useReferencePatch(photo: Photo) {
  const invalidate = useInvalidate(photo.pieceId);
  return useMutation({
    mutationFn: (rect: Rect | null) =>
      http<ReferencePatchResponse>(
        `/api/photos/${photo.id}/reference-patch`,
        rect ? { method: 'PUT', json: rect } : { method: 'DELETE' },
      ),
    onSuccess: invalidate,
  });
}

export function useToggleBackground(photo: Photo) {
  const invalidate = useInvalidate(photo.pieceId);
  return useMutation({
    mutationFn: ({ colourId, background }: { colourId: number; background: boolean }) =>
      http<PalettesResponse>(`/api/photos/${photo.id}/palette/${colourId}`, { method: 'PATCH', json: { background } }),
    onSuccess: invalidate,
  });
}

/** Mark (or remove, with null) the photo's colour chart: every palette is recomputed, a calibrated one added. */
export function useChart(photo: Photo) {
  const invalidate = useInvalidate(photo.pieceId);
  return useMutation({
    mutationFn: (input: ChartInput | null) =>
      http<ChartResponse>(
        `/api/photos/${photo.id}/chart`,
        input ? { method: 'PUT', json: input } : { method: 'DELETE' },
      ),
    onSuccess: invalidate,
  });
}

/** The imaging tolerance levels a chart's capture is graded against (admins change them, naming their source). */
export const chartTolerancesKey = ['photos', 'chart-tolerances'] as const;
export const useChartTolerances = () =>
  useQuery({ queryKey: chartTolerancesKey, queryFn: () => http<ToleranceLevels>('/api/photos/chart-tolerances') });
export function useSetChartTolerances() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: ToleranceLevels) =>
      http<ToleranceLevels>('/api/photos/chart-tolerances', { method: 'PUT', json: input }),
    onSuccess: (saved) => {
      qc.setQueryData(chartTolerancesKey, saved);
      // Photos carry the levels they were graded against: read them again.
      void qc.invalidateQueries({ queryKey: ['photos'] });
    },
  });
}
