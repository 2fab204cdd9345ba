import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useEffect } from 'react';
import { DetailedError, Upload as TusUpload } from 'tus-js-client';
import type { IngestRetryResponse, IngestStage } from '../../../shared/schemas/ingest';
import type {
  PalettesResponse,
  PhotoResponse,
  PhotoUpdateInput,
  Rect,
  ReferencePatchResponse,
  ChartResponse,
  RegionCreateInput,
  RegionOut,
  RegionSavedResponse,
  RegionUpdateInput,
} from '../../../shared/schemas/photo';
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

/** The largest request body a resumed upload sends at once (each a PATCH from the offset the server holds). */
const TUS_CHUNK_BYTES = 16 * 1024 * 1024;

/** A tus refusal in the API's JSON shape, in words; a network failure that outlasted the retries otherwise. */
function tusError(err: Error | DetailedError) {
  const res = err instanceof DetailedError ? err.originalResponse : null;
  if (res) {
    let body: { error?: { code?: string; message?: string } } = {};
    try {
      body = JSON.parse(res.getBody());
    } catch {
      // tus' own refusals are plain text
    }
    return new ApiError(
      res.getStatus(),
      body.error?.code ?? 'http_error',
      body.error?.message ?? (res.getBody().trim() || `Upload failed (${res.getStatus()}).`),
    );
  }
  return new ApiError(0, 'network', 'The upload was interrupted; check the connection and try again: it resumes.');
}

/**
 * One photo sent with the tus resumable-upload protocol (POST /api/uploads, then PATCHes of TUS_CHUNK_BYTES): a
 * dropped connection is retried from the offset the server holds, and after a page reload the same file (same
 * piece, name, size and date) resumes from there, found through its fingerprint in localStorage. Resolves with the
 * id of the stored photo (the Photo-Id header of the last PATCH).
 */
export function uploadPhotoResumable(
  pieceId: number,
  file: File,
  on: { progress: (fraction: number) => void; uploaded: () => void },
) {
  return new Promise<{ photoId: number }>((resolve, reject) => {
    let photoId = 0;
    const upload = new TusUpload(file, {
      endpoint: '/api/uploads',
      chunkSize: TUS_CHUNK_BYTES,
      retryDelays: [0, 1000, 3000, 5000, 10000, 20000, 30000],
      metadata: { pieceId: String(pieceId), filename: file.name, filetype: file.type },
      // One upload per piece and file: the same file dropped on another piece starts afresh.
      fingerprint: async (f) => ['tinctoria-photo', pieceId, f.name, f.type, f.size, f.lastModified].join(':'),
      storeFingerprintForResuming: true,
      removeFingerprintOnSuccess: true,
      onProgress: (sent, total) => {
        on.progress(total ? sent / total : 0);
        if (sent === total) on.uploaded();
      },
      onAfterResponse: (_req, res) => {
        const id = Number(res.getHeader('Photo-Id'));
        if (id > 0) photoId = id;
      },
      // A refusal (4xx) is final; a lost connection or a busy server (5xx, 423) is tried again from the offset.
      onShouldRetry: (err) => {
        const status = err.originalResponse?.getStatus() ?? 0;
        return status === 0 || status === 423 || status === 409 || status >= 500;
      },
      onSuccess: () =>
        photoId ? resolve({ photoId }) : reject(new ApiError(0, 'http_error', 'The upload ended without a photo.')),
      onError: (err) => reject(tusError(err)),
    });
    void upload.findPreviousUploads().then((previous) => {
      if (previous.length) upload.resumeFromPreviousUpload(previous[0]);
      upload.start();
    }, reject);
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
