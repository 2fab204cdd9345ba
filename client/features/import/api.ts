import { keepPreviousData, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { http } from '../../lib/http';
import { upload } from '../../lib/upload';
import type { Paged } from '../../../shared/schemas/common';
import type {
  ColumnMapping,
  ImportPreview,
  ImportPreviewRow,
  ImportResult,
} from '../../../shared/schemas/piece-import';

export const importKeys = { all: ['import'] as const };
// The archive's lists live under this key prefix (owned by the catalogue feature).
const pieceListKey = ['pieces'] as const;

export type ImportInput = { file: File; mapping: ColumnMapping; onProgress?: (fraction: number) => void };

function form({ file, mapping }: ImportInput) {
  const f = new FormData();
  f.append('mapping', JSON.stringify(mapping));
  f.append('file', file);
  return f;
}

export const previewImport = (input: ImportInput) =>
  upload<ImportPreview>('/api/import/pieces?dryRun=true', form(input), input.onProgress);
export const runImport = (input: ImportInput) =>
  upload<ImportResult>('/api/import/pieces', form(input), input.onProgress);

export const usePreviewImport = () =>
  useMutation({ mutationKey: [...importKeys.all, 'preview'], mutationFn: previewImport });

/**
 * One page of a dry run's rows (all, or only those with errors) read from the server (the
 * preview is kept there for a day); page 1 comes with the dry run's own answer and is not asked again.
 */
export function usePreviewRows(preview: ImportPreview | null, page: number, only: 'all' | 'invalid') {
  const first: Paged<ImportPreviewRow> | undefined =
    preview && only === 'all'
      ? { items: preview.items, total: preview.rows, page: 1, pageSize: preview.pageSize }
      : undefined;
  return useQuery({
    queryKey: [...importKeys.all, 'preview', preview?.id, 'rows', only, page],
    queryFn: () =>
      http<Paged<ImportPreviewRow>>(
        `/api/import/previews/${preview!.id}/rows?${new URLSearchParams({ page: String(page), pageSize: String(preview!.pageSize), only })}`,
      ),
    enabled: preview !== null && !(page === 1 && first),
    initialData: page === 1 ? first : undefined,
    placeholderData: keepPreviousData,
  });
}

export function useRunImport() {
  const qc = useQueryClient();
  return useMutation({
    mutationKey: [...importKeys.all, 'run'],
    mutationFn: runImport,
    onSuccess: () => qc.invalidateQueries({ queryKey: pieceListKey }),
  });
}

/** The header row of a chosen file, read in the browser to offer the column mapping. */
export async function readHeader(file: File): Promise<string[]> {
  const head = await file.slice(0, 64 * 1024).text();
  const line = head.replace(/^\uFEFF/, '').split(/\r?\n/, 1)[0] ?? '';
  const cells: string[] = [];
  let cur = '';
  let quoted = false;
  for (let i = 0; i < line.length; i++) {
    const c = line[i];
    if (quoted && c === '"' && line[i + 1] === '"') {
      cur += '"';
      i++;
    } else if (c === '"') {
      quoted = !quoted;
    } else if (c === ',' && !quoted) {
      cells.push(cur.trim());
      cur = '';
    } else {
      cur += c;
    }
  }
  cells.push(cur.trim());
  return cells.filter((c, i) => c !== '' || i < cells.length - 1);
}
