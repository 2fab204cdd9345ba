import { Op, type Transaction } from 'sequelize';
import { Chemical, Dyestuff, Piece, VocabularyTerm, sequelize } from '../models/index.ts';
import type { Actor } from '../policies/index.ts';
import { HttpError } from '../http/errors.ts';
import { accessionKey } from '../../shared/accession.ts';
import {
  pieceImportRow,
  type ColumnMapping,
  type ImportError,
  type ImportResult,
  type PieceImportRow,
} from '../../shared/schemas/piece-import.ts';
import { checkUtf8File, CsvFileErrors, readPieceCsv } from './csv-file.ts';

const CHUNK = 1000;
export type Checked = {
  line: number;
  value: PieceImportRow | null;
  accessionNumber: string;
  title: string;
  errors: ImportError[];
};

/** Names the archive knows, compared case-insensitively; the stored spelling is the archive's. */
async function vocabularies(transaction?: Transaction) {
  const [terms, dyes, chems] = await Promise.all([
    VocabularyTerm.findAll({ attributes: ['vocabulary', 'term'], transaction }),
    Dyestuff.findAll({ attributes: ['name'], transaction }),
    Chemical.findAll({ attributes: ['name'], transaction }),
  ]);
  const index = (names: string[]) => new Map(names.map((n) => [n.toLowerCase(), n]));
  return {
    fibre: index(terms.filter((t) => t.vocabulary === 'fibre').map((t) => t.term)),
    technique: index(terms.filter((t) => t.vocabulary === 'technique').map((t) => t.term)),
    dyestuff: index(dyes.map((d) => d.name)),
    mordant: index(chems.map((c) => c.name)),
  };
}

/** Accession keys (no case, no spaces) already in the archive, soft-deleted ones included (they keep their number). */
async function existingAccessions(numbers: string[], transaction?: Transaction) {
  const found = new Set<string>();
  for (let i = 0; i < numbers.length; i += CHUNK) {
    const rows = await Piece.findAll({
      attributes: ['accessionKey'],
      where: { accessionKey: { [Op.in]: numbers.slice(i, i + CHUNK) } },
      paranoid: false,
      transaction,
    });
    for (const r of rows) found.add(r.accessionKey);
  }
  return found;
}

/** Rows checked together: one query for their accession numbers, one write of their results. */
export const BATCH = 500;

export type CheckSummary = {
  rows: number;
  valid: number;
  invalid: number;
  errorCount: number;
  fileErrors: ImportError[];
};

/**
 * Check every row as the file streams (never the whole file in memory): shape and dates (shared schema),
 * vocabularies, and accession numbers unique in the file and the archive. Rows are handed to `onBatch` BATCH at a
 * time, in file order, each with all its errors. A problem with the file as a whole answers `fileErrors` (rows
 * already handed over are then to be discarded by the caller); a file that is not UTF-8 throws 422 not_utf8.
 * Memory grows only with the accession numbers seen (for the duplicate check).
 */
export async function checkCsv(
  file: string,
  mapping: ColumnMapping,
  onBatch: (batch: Checked[]) => Promise<void>,
  transaction?: Transaction,
): Promise<CheckSummary> {
  await checkUtf8File(file);
  const vocab = await vocabularies(transaction);
  // Per accession key: the first line it is on, and whether the archive held it before this file (null: not asked yet).
  const seen = new Map<string, { line: number; inArchive: boolean | null }>();
  const summary: CheckSummary = { rows: 0, valid: 0, invalid: 0, errorCount: 0, fileErrors: [] };
  let batch: Checked[] = [];
  let ask: string[] = []; // keys first seen in this batch
  const flush = async () => {
    if (!batch.length) return;
    const inArchive = await existingAccessions(ask, transaction);
    for (const k of ask) seen.get(k)!.inArchive = inArchive.has(k);
    ask = [];
    for (const c of batch) {
      if (c.value && seen.get(accessionKey(c.value.accessionNumber))?.inArchive)
        c.errors.push({
          line: c.line,
          field: 'accessionNumber',
          message: `Accession number ${c.value.accessionNumber} is already in the archive.`,
        });
      summary.rows += 1;
      if (c.errors.length) summary.invalid += 1;
      else summary.valid += 1;
      summary.errorCount += c.errors.length;
    }
    const done = batch;
    batch = [];
    await onBatch(done);
  };
  try {
    for await (const row of readPieceCsv(file, mapping)) {
      batch.push(checkRow(row, vocab, seen, ask));
      if (batch.length >= BATCH) await flush();
    }
    await flush();
  } catch (err) {
    if (!(err instanceof CsvFileErrors)) throw err;
    return { rows: 0, valid: 0, invalid: 0, errorCount: err.errors.length, fileErrors: err.errors };
  }
  if (!summary.rows) {
    const fileErrors = [{ line: 2, field: null, message: 'The file has a header but no pieces.' }];
    return { ...summary, errorCount: 1, fileErrors };
  }
  return summary;
}

function checkRow(
  row: { line: number; cells: Record<string, string>; errors: ImportError[] },
  vocab: Awaited<ReturnType<typeof vocabularies>>,
  seen: Map<string, { line: number; inArchive: boolean | null }>,
  ask: string[],
): Checked {
  const errors = [...row.errors];
  const parsed = pieceImportRow.safeParse(row.cells);
  if (!parsed.success) {
    for (const issue of parsed.error.issues)
      errors.push({ line: row.line, field: String(issue.path[0] ?? '') || null, message: issue.message });
  }
  const value = parsed.success ? parsed.data : null;
  if (value) {
    const known = (list: string[], map: Map<string, string>, field: string, what: string) =>
      list.map((name) => {
        const hit = map.get(name.toLowerCase());
        if (!hit) errors.push({ line: row.line, field, message: `Unknown ${what} "${name}".` });
        return hit ?? name;
      });
    value.fibres = known(value.fibres, vocab.fibre, 'fibres', 'fibre');
    value.techniques = known(value.techniques, vocab.technique, 'techniques', 'technique');
    const names = known(
      value.dyestuffs.map((d) => d.name),
      vocab.dyestuff,
      'dyestuffs',
      'dyestuff',
    );
    value.dyestuffs = value.dyestuffs.map((d, i) => ({ ...d, name: names[i] }));
    const mordants = known(
      value.historicalMordants.map((d) => d.name),
      vocab.mordant,
      'historicalMordants',
      'mordant (chemical)',
    );
    value.historicalMordants = value.historicalMordants.map((d, i) => ({ ...d, name: mordants[i] }));
    const key = accessionKey(value.accessionNumber);
    const first = seen.get(key);
    if (first !== undefined)
      errors.push({
        line: row.line,
        field: 'accessionNumber',
        message: `Accession number ${value.accessionNumber} is also on line ${first.line} of this file.`,
      });
    else {
      seen.set(key, { line: row.line, inArchive: null });
      ask.push(key);
    }
  }
  return {
    line: row.line,
    value,
    accessionNumber: (row.cells.accessionNumber ?? '').trim(),
    title: (row.cells.title ?? '').trim(),
    errors,
  };
}

/** At most this many errors are listed in a refused import's answer (the message gives the total); the dry run pages them all. */
export const MAX_LISTED_ERRORS = 1000;

/**
 * All rows or none: every piece is created in one transaction, BATCH rows at a time as the file streams. Once any
 * row has an error nothing more is written (the rest is still checked, to list every error) and the transaction
 * is rolled back.
 */
export async function importPieces({
  actor,
  input,
}: {
  actor: NonNullable<Actor>;
  input: { file: string; mapping: ColumnMapping };
}): Promise<ImportResult> {
  return sequelize.transaction(async (transaction) => {
    const ids: number[] = [];
    const errors: ImportError[] = [];
    const lines = new Set<number>();
    const summary = await checkCsv(
      input.file,
      input.mapping,
      async (batch) => {
        for (const c of batch)
          for (const e of c.errors) {
            lines.add(e.line);
            if (errors.length < MAX_LISTED_ERRORS) errors.push(e);
          }
        if (lines.size) return;
        const created = await Piece.bulkCreate(
          batch.map((c) => ({ ...c.value!, createdById: actor.id })),
          { transaction, validate: false, returning: ['id'] },
        );
        ids.push(...created.map((p) => p.id));
      },
      transaction,
    );
    if (summary.fileErrors.length) {
      // A file that cannot be read as a whole: only that is reported, as before any row.
      errors.splice(0, errors.length, ...summary.fileErrors);
      lines.clear();
      for (const e of summary.fileErrors) lines.add(e.line);
    }
    if (summary.errorCount) {
      const listed = errors.slice(0, MAX_LISTED_ERRORS);
      throw new HttpError(
        422,
        'import_invalid',
        `${summary.errorCount} error(s) on ${lines.size} line(s); nothing was imported.${
          summary.errorCount > listed.length ? ` The first ${listed.length} are listed; a dry run lists them all.` : ''
        }`,
        { errors: listed },
      );
    }
    return { dryRun: false, imported: ids.length, ids };
  });
}
