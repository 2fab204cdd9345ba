import { parse } from 'csv-parse/sync';
import { restoreCell } from '../export/csv.ts';
import { HttpError } from '../http/errors.ts';
import {
  PIECE_CSV_FIELDS,
  REQUIRED_PIECE_FIELDS,
  FIELD_LABELS,
  type ColumnMapping,
  type ImportError,
  type PieceCsvField,
} from '../../shared/schemas/piece-import.ts';

/** Offset of the first byte that breaks UTF-8 (RFC 3629: no overlongs, no surrogates, ≤ U+10FFFF), or -1. */
export function firstInvalidUtf8(buf: Uint8Array): number {
  let i = 0;
  while (i < buf.length) {
    const b = buf[i];
    if (b < 0x80) {
      i += 1;
      continue;
    }
    let n: number, min: number, cp: number;
    if (b >= 0xc2 && b <= 0xdf) {
      n = 1;
      min = 0x80;
      cp = b & 0x1f;
    } else if (b >= 0xe0 && b <= 0xef) {
      n = 2;
      min = 0x800;
      cp = b & 0x0f;
    } else if (b >= 0xf0 && b <= 0xf4) {
      n = 3;
      min = 0x10000;
      cp = b & 0x07;
    } else return i;
    for (let k = 1; k <= n; k++) {
      const c = buf[i + k];
      if (c === undefined || (c & 0xc0) !== 0x80) return i;
      cp = (cp << 6) | (c & 0x3f);
    }
    if (cp < min || cp > 0x10ffff || (cp >= 0xd800 && cp <= 0xdfff)) return i;
    i += n + 1;
  }
  return -1;
}

const notUtf8 = (message: string, line: number | null) =>
  new HttpError(422, 'not_utf8', message, {
    errors: [{ line: line ?? 1, field: null, message } satisfies ImportError],
  });

/** The text of an uploaded CSV; anything but UTF-8 is refused with the line of the first offending byte. */
export function decodeUtf8(buf: Buffer): string {
  if ((buf[0] === 0xff && buf[1] === 0xfe) || (buf[0] === 0xfe && buf[1] === 0xff)) {
    throw notUtf8('The file is UTF-16, not UTF-8. Save it as "CSV UTF-8" and upload it again.', 1);
  }
  const bad = firstInvalidUtf8(buf);
  if (bad >= 0) {
    let line = 1;
    for (let i = 0; i < bad; i++) if (buf[i] === 0x0a) line += 1;
    const byte = buf[bad].toString(16).toUpperCase().padStart(2, '0');
    throw notUtf8(
      `The file is not UTF-8: line ${line} has the byte 0x${byte}, which is not valid UTF-8 (the file was probably saved as Latin-1 or Windows-1252). Save it as "CSV UTF-8" and upload it again; nothing was imported.`,
      line,
    );
  }
  const text = buf.toString('utf8');
  return text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
}

export type CsvRow = { line: number; cells: Record<PieceCsvField, string>; errors: ImportError[] };

/**
 * Parse the CSV, apply the column mapping and check the header. Each row keeps the
 * line it starts on (a quoted cell may span lines), so errors point at the file.
 */
export function readPieceCsv(text: string, mapping: ColumnMapping = {}): { rows: CsvRow[]; fileErrors: ImportError[] } {
  let records: Array<{ record: string[]; info: { lines: number; empty_lines: number } }>;
  try {
    records = parse(text, {
      info: true,
      relax_column_count: true,
      skip_empty_lines: true,
      trim: false,
    }) as unknown as typeof records;
  } catch (err) {
    const e = err as { lines?: number; message: string };
    return {
      rows: [],
      fileErrors: [{ line: e.lines ?? 1, field: null, message: `The CSV cannot be read: ${e.message}` }],
    };
  }
  if (!records.length)
    return {
      rows: [],
      fileErrors: [
        { line: 1, field: null, message: 'The file is empty: a header row and at least one piece are needed.' },
      ],
    };

  const header = records[0].record.map((h) => h.trim());
  const fileErrors: ImportError[] = [];
  const fieldAt: Array<PieceCsvField | null> = header.map((h) => {
    const mapped =
      h in mapping ? mapping[h] : (PIECE_CSV_FIELDS as readonly string[]).includes(h) ? (h as PieceCsvField) : null;
    return mapped || null;
  });
  const seen = new Set<PieceCsvField>();
  fieldAt.forEach((f, i) => {
    if (!f) return;
    if (seen.has(f))
      fileErrors.push({ line: 1, field: f, message: `Two columns map to ${FIELD_LABELS[f]} ("${header[i]}").` });
    seen.add(f);
  });
  for (const f of REQUIRED_PIECE_FIELDS) {
    if (!seen.has(f))
      fileErrors.push({
        line: 1,
        field: f,
        message: `The required column ${FIELD_LABELS[f]} (${f}) is missing; map one of the file's columns to it.`,
      });
  }

  const rows: CsvRow[] = [];
  let prevEnd = records[0].info.lines;
  let prevEmpty = records[0].info.empty_lines;
  for (const { record, info } of records.slice(1)) {
    const line = prevEnd + 1 + (info.empty_lines - prevEmpty);
    prevEnd = info.lines;
    prevEmpty = info.empty_lines;
    const cells = Object.fromEntries(PIECE_CSV_FIELDS.map((f) => [f, ''])) as Record<PieceCsvField, string>;
    const errors: ImportError[] = [];
    if (record.length !== header.length)
      errors.push({
        line,
        field: null,
        message: `The row has ${record.length} cells; the header has ${header.length}.`,
      });
    record.forEach((value, i) => {
      const f = fieldAt[i];
      if (f) cells[f] = restoreCell(value);
    });
    rows.push({ line, cells, errors });
  }
  return { rows, fileErrors };
}
