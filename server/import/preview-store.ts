import { randomBytes } from 'node:crypto';
import { QueryTypes } from 'sequelize';
import { sequelize } from '../models/index.ts';
import { notFound } from '../http/errors.ts';
import {
  IMPORT_PREVIEW_PAGE,
  type ColumnMapping,
  type ImportError,
  type ImportPreview,
  type ImportPreviewRow,
} from '../../shared/schemas/piece-import.ts';
import { toPaged, type Paged } from '../../shared/schemas/common.ts';
import { checkCsv, type Checked } from './pieces.ts';

/**
 * A CSV import dry run, kept in MariaDB (migration 0024) so that its rows are answered a page at a time by any
 * app server, and no process holds the whole preview: the rows are written BATCH at a time as the file streams.
 * A preview is its maker's alone (another user gets 404) and is removed a day after it was made (a day to read it
 * and decide: common practice for temporary results, not a published rule).
 */
export const PREVIEW_TTL_MS = 24 * 60 * 60_000;

type PreviewRecord = {
  id: string;
  createdById: number | null;
  rowCount: number;
  valid: number;
  invalid: number;
  errorCount: number;
  fileErrors: string | null;
  complete: number | boolean;
  expiresAt: Date;
};

/** Removes previews past their day (their rows go with them: ON DELETE CASCADE). */
export async function sweepExpiredPreviews(now = new Date()) {
  await sequelize.query('DELETE FROM import_previews WHERE expiresAt < :now', {
    type: QueryTypes.DELETE,
    replacements: { now },
  });
}

/** Checks the file (streamed) and stores every checked row; answers the counts and the first pages. */
export async function dryRunImport({
  actor,
  input,
}: {
  actor: { id: number };
  input: { file: string; mapping: ColumnMapping };
}): Promise<ImportPreview> {
  await sweepExpiredPreviews();
  const id = randomBytes(16).toString('hex');
  const now = new Date();
  const expiresAt = new Date(now.getTime() + PREVIEW_TTL_MS);
  await sequelize.query(
    'INSERT INTO import_previews (id, createdById, createdAt, expiresAt) VALUES (:id, :createdById, :now, :expiresAt)',
    { type: QueryTypes.INSERT, replacements: { id, createdById: actor.id, now, expiresAt } },
  );
  try {
    let seq = 0,
      invalidSeq = 0,
      errorEnd = 0;
    const store = async (batch: Checked[]) => {
      const rows = batch.map((c) => {
        errorEnd += c.errors.length;
        return {
          previewId: id,
          seq: seq++,
          invalidSeq: c.errors.length ? invalidSeq++ : null,
          errorEnd,
          line: c.line,
          accessionNumber: c.accessionNumber,
          title: c.title,
          errors: c.errors.length ? JSON.stringify(c.errors) : null,
        };
      });
      await sequelize.getQueryInterface().bulkInsert('import_preview_rows', rows);
    };
    const summary = await checkCsv(input.file, input.mapping, store);
    // A file that cannot be read as a whole keeps no rows: only its file errors are shown, as before any row.
    if (summary.fileErrors.length)
      await sequelize.query('DELETE FROM import_preview_rows WHERE previewId = :id', {
        type: QueryTypes.DELETE,
        replacements: { id },
      });
    await sequelize.query(
      `UPDATE import_previews SET rowCount = :rows, valid = :valid, invalid = :invalid, errorCount = :errorCount,
         fileErrors = :fileErrors, complete = 1 WHERE id = :id`,
      {
        type: QueryTypes.UPDATE,
        replacements: {
          ...summary,
          fileErrors: summary.fileErrors.length ? JSON.stringify(summary.fileErrors) : null,
          id,
        },
      },
    );
  } catch (err) {
    await sequelize
      .query('DELETE FROM import_previews WHERE id = :id', { type: QueryTypes.DELETE, replacements: { id } })
      .catch(() => undefined);
    throw err;
  }
  const preview = await loadPreview(id, actor.id);
  const [items, errors] = await Promise.all([
    previewRows(preview, 1, IMPORT_PREVIEW_PAGE, 'all'),
    previewErrors(preview, 1, IMPORT_PREVIEW_PAGE),
  ]);
  return {
    dryRun: true,
    id,
    rows: preview.rowCount,
    valid: preview.valid,
    invalid: preview.invalid,
    errorCount: preview.errorCount,
    pageSize: IMPORT_PREVIEW_PAGE,
    expiresAt: new Date(preview.expiresAt).toISOString(),
    items: items.items,
    errors: errors.items,
  };
}

/** A finished preview of this user's, or 404 (someone else's, expired, or still being made). */
export async function loadPreview(id: string, userId: number): Promise<PreviewRecord> {
  const [row] = await sequelize.query<PreviewRecord>(
    'SELECT * FROM import_previews WHERE id = :id AND createdById = :userId AND complete = 1 AND expiresAt >= :now',
    { type: QueryTypes.SELECT, replacements: { id, userId, now: new Date() } },
  );
  if (!row) throw notFound('Import preview');
  return row;
}

type StoredRow = { line: number; accessionNumber: string; title: string; errors: string | null; errorEnd: number };
const presentRow = (r: StoredRow): ImportPreviewRow => ({
  line: r.line,
  accessionNumber: r.accessionNumber,
  title: r.title,
  errors: r.errors ? (JSON.parse(r.errors) as ImportError[]) : [],
});

/** One page of the rows (every row, or only those with errors), read by range on (previewId, seq | invalidSeq). */
export async function previewRows(
  preview: PreviewRecord,
  page: number,
  pageSize: number,
  only: 'all' | 'invalid',
): Promise<Paged<ImportPreviewRow>> {
  const from = (page - 1) * pageSize;
  const column = only === 'invalid' ? 'invalidSeq' : 'seq';
  const rows = await sequelize.query<StoredRow>(
    `SELECT line, accessionNumber, title, errors, errorEnd FROM import_preview_rows
      WHERE previewId = :id AND ${column} >= :from AND ${column} < :to ORDER BY ${column}`,
    { type: QueryTypes.SELECT, replacements: { id: preview.id, from, to: from + pageSize } },
  );
  return toPaged(rows.map(presentRow), only === 'invalid' ? preview.invalid : preview.rowCount, page, pageSize);
}

/** One page of the errors in file order: the file's own errors, or the rows' errors read by range on errorEnd. */
export async function previewErrors(
  preview: PreviewRecord,
  page: number,
  pageSize: number,
): Promise<Paged<ImportError>> {
  const from = (page - 1) * pageSize;
  if (preview.fileErrors) {
    const all = JSON.parse(preview.fileErrors) as ImportError[];
    return toPaged(all.slice(from, from + pageSize), all.length, page, pageSize);
  }
  // Every row listed holds at least one error of the page, so at most pageSize rows are read.
  const rows = await sequelize.query<StoredRow>(
    `SELECT line, accessionNumber, title, errors, errorEnd FROM import_preview_rows
      WHERE previewId = :id AND errorEnd > :from AND errors IS NOT NULL ORDER BY errorEnd LIMIT :limit`,
    { type: QueryTypes.SELECT, replacements: { id: preview.id, from, limit: pageSize } },
  );
  const errors: ImportError[] = [];
  for (const r of rows) {
    const list = presentRow(r).errors;
    const start = r.errorEnd - list.length;
    for (const [i, e] of list.entries()) {
      const at = start + i;
      if (at >= from && at < from + pageSize) errors.push(e);
    }
  }
  return toPaged(errors, preview.errorCount, page, pageSize);
}
