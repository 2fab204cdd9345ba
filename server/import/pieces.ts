import { Op, type Transaction } from 'sequelize';
import { Chemical, Dyestuff, Piece, VocabularyTerm, sequelize } from '../models/index.ts';
import type { Actor } from '../policies/index.ts';
import { HttpError } from '../http/errors.ts';
import { accessionKey } from '../../shared/accession.ts';
import {
  pieceImportRow,
  type ColumnMapping,
  type ImportError,
  type ImportPreview,
  type ImportResult,
  type PieceImportRow,
} from '../../shared/schemas/piece-import.ts';
import { decodeUtf8, readPieceCsv } from './csv-file.ts';

const CHUNK = 1000;
type Checked = {
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

/** Check every row: shape and dates (shared schema), vocabularies, and accession numbers unique in the file and the archive. */
export async function checkCsv(buffer: Buffer, mapping: ColumnMapping, transaction?: Transaction) {
  const text = decodeUtf8(buffer);
  const { rows, fileErrors } = readPieceCsv(text, mapping);
  if (fileErrors.length) return { checked: [] as Checked[], fileErrors };
  const vocab = await vocabularies(transaction);
  const firstLine = new Map<string, number>();
  const checked: Checked[] = rows.map((row) => {
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
      const first = firstLine.get(key);
      if (first !== undefined)
        errors.push({
          line: row.line,
          field: 'accessionNumber',
          message: `Accession number ${value.accessionNumber} is also on line ${first} of this file.`,
        });
      else firstLine.set(key, row.line);
    }
    return {
      line: row.line,
      value,
      accessionNumber: row.cells.accessionNumber.trim(),
      title: row.cells.title.trim(),
      errors,
    };
  });
  const inArchive = await existingAccessions([...firstLine.keys()], transaction);
  for (const c of checked) {
    if (c.value && inArchive.has(accessionKey(c.value.accessionNumber)))
      c.errors.push({
        line: c.line,
        field: 'accessionNumber',
        message: `Accession number ${c.value.accessionNumber} is already in the archive.`,
      });
  }
  if (!checked.length) fileErrors.push({ line: 2, field: null, message: 'The file has a header but no pieces.' });
  return { checked, fileErrors };
}

const allErrors = (checked: Checked[], fileErrors: ImportError[]) => [
  ...fileErrors,
  ...checked.flatMap((c) => c.errors),
];

export function preview(checked: Checked[], fileErrors: ImportError[]): ImportPreview {
  const invalid = checked.filter((c) => c.errors.length).length;
  return {
    dryRun: true,
    rows: checked.length,
    valid: checked.length - invalid,
    invalid,
    items: checked.map((c) => ({ line: c.line, accessionNumber: c.accessionNumber, title: c.title, errors: c.errors })),
    errors: allErrors(checked, fileErrors),
  };
}

/** All rows or none: every piece is created in one transaction, in chunks so 10,000 rows stay quick. */
export async function importPieces({
  actor,
  input,
}: {
  actor: NonNullable<Actor>;
  input: { buffer: Buffer; mapping: ColumnMapping };
}): Promise<ImportResult> {
  return sequelize.transaction(async (transaction) => {
    const { checked, fileErrors } = await checkCsv(input.buffer, input.mapping, transaction);
    const errors = allErrors(checked, fileErrors);
    if (errors.length) {
      const lines = new Set(errors.map((e) => e.line)).size;
      throw new HttpError(
        422,
        'import_invalid',
        `${errors.length} error(s) on ${lines} line(s); nothing was imported.`,
        { errors },
      );
    }
    const ids: number[] = [];
    for (let i = 0; i < checked.length; i += CHUNK) {
      const created = await Piece.bulkCreate(
        checked.slice(i, i + CHUNK).map((c) => ({ ...c.value!, createdById: actor.id })),
        { transaction, validate: false, returning: ['id'] },
      );
      ids.push(...created.map((p) => p.id));
    }
    return { dryRun: false, imported: ids.length, ids };
  });
}
