import { keepPreviousData, queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type {
  AuditEventOut,
  PieceCreateInput,
  PieceDetailResponse,
  PieceHistoryResponse,
  PieceListQuery,
  PieceListResponse,
  PieceOut,
  PieceResponse,
  PieceSummary,
  PieceUpdateInput,
} from '../../../shared/schemas/piece';
import type { PhotoOut } from '../../../shared/schemas/photo';
import type { AnalysisListResponse } from '../../../shared/schemas/records';
import { http } from '../../lib/http';

export type Piece = PieceOut;
export type PieceRow = PieceSummary;
export type Photo = PhotoOut;
export type HistoryEvent = AuditEventOut;
export type PieceDetail = PieceDetailResponse;
export type PieceList = PieceListResponse;
export type ListParams = Partial<PieceListQuery>;

export const pieceKeys = {
  all: ['pieces'] as const,
  lists: () => [...pieceKeys.all, 'list'] as const,
  list: (q: ListParams) => [...pieceKeys.lists(), q] as const,
  detail: (id: number) => [...pieceKeys.all, 'detail', id] as const,
  history: (id: number) => [...pieceKeys.all, 'history', id] as const,
};

const queryString = (q: ListParams) => {
  const s = new URLSearchParams();
  for (const [k, v] of Object.entries(q)) if (v !== undefined && v !== '') s.set(k, String(v));
  return s.toString();
};

export const fetchPieces = (q: ListParams) => http<PieceList>(`/api/pieces?${queryString(q)}`);
export const piecesQuery = (q: ListParams) =>
  queryOptions({ queryKey: pieceKeys.list(q), queryFn: () => fetchPieces(q), placeholderData: keepPreviousData });
export const usePieces = (q: ListParams) => useQuery(piecesQuery(q));

export const fetchPiece = (id: number) => http<PieceDetail>(`/api/pieces/${id}`);
export const pieceQuery = (id: number) =>
  queryOptions({ queryKey: pieceKeys.detail(id), queryFn: () => fetchPiece(id) });
export const usePiece = (id: number, enabled = true) => useQuery({ ...pieceQuery(id), enabled });

/** The piece's analyses, for the "identified by" choice of the edit form (the records feature shows them in full). */
export const usePieceAnalysisChoices = (id: number | undefined) =>
  useQuery({
    queryKey: ['records', 'analyses', id ?? 0],
    queryFn: () => http<AnalysisListResponse>(`/api/pieces/${id}/analyses`),
    enabled: id !== undefined,
    select: (r) =>
      r.items.map((a) => ({
        id: a.id,
        label: `${a.method}, ${a.analysedOn}${a.laboratory ? `, ${a.laboratory}` : ''}`,
      })),
  });

export const fetchHistory = (id: number) => http<PieceHistoryResponse>(`/api/pieces/${id}/history`);
export const historyQuery = (id: number) =>
  queryOptions({ queryKey: pieceKeys.history(id), queryFn: () => fetchHistory(id) });
export const useHistory = (id: number, enabled: boolean) => useQuery({ ...historyQuery(id), enabled });

function useInvalidatePiece() {
  const qc = useQueryClient();
  return (id?: number) => {
    void qc.invalidateQueries({ queryKey: pieceKeys.lists() });
    if (id) {
      void qc.invalidateQueries({ queryKey: pieceKeys.detail(id) });
      void qc.invalidateQueries({ queryKey: pieceKeys.history(id) });
    }
  };
}

export function useCreatePiece() {
  const invalidate = useInvalidatePiece();
  return useMutation({
    mutationFn: (input: PieceCreateInput) => http<PieceResponse>('/api/pieces', { method: 'POST', json: input }),
    onSuccess: () => invalidate(),
  });
}

export function useUpdatePiece(id: number) {
  const invalidate = useInvalidatePiece();
  return useMutation({
    mutationFn: (input: PieceUpdateInput) => http<PieceResponse>(`/api/pieces/${id}`, { method: 'PATCH', json: input }),
    onSuccess: () => invalidate(id),
  });
}

export function useDeletePiece(id: number) {
  const invalidate = useInvalidatePiece();
  return useMutation({
    mutationFn: () => http<void>(`/api/pieces/${id}`, { method: 'DELETE' }),
    onSuccess: () => invalidate(id),
  });
}

export function useRestorePiece(id: number) {
  const invalidate = useInvalidatePiece();
  return useMutation({
    mutationFn: () => http<PieceResponse>(`/api/pieces/${id}/restore`, { method: 'POST' }),
    onSuccess: () => invalidate(id),
  });
}
