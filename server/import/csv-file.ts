import { createReadStream } from 'node:fs';
import { setImmediate as nextTurn } from 'node:timers/promises';
import { parse } from 'csv-parse';
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

/**
 * Offset of the first byte that breaks UTF-8 (RFC 3629: no overlongs, no surrogates, ≤ U+10FFFF), or -1. With
 * `cut`, the buffer is one chunk of a longer stream: a sequence cut off by the end is not an error, and its start
 * is answered as `-2 - offset` so the caller can carry it into the next chunk.
 */
export function firstInvalidUtf8(buf: Uint8Array, cut = false): number {
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
      if (c === undefined && cut) return -2 - i;
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

const countLines = (buf: Uint8Array, end: number) => {
  let n = 0;
  for (let i = buf.indexOf(0x0a); i !== -1 && i < end; i = buf.indexOf(0x0a, i + 1)) n += 1;
  return n;
};

/**
 * Checks that an uploaded CSV file is UTF-8, reading it as a stream (never whole): anything else is refused with
 * the line of the first offending byte.
 */
export async function checkUtf8File(file: string): Promise<void> {
  let carry: Buffer = Buffer.alloc(0);
  let line = 1;
  let first = true;
  for await (const chunk of createReadStream(file, { highWaterMark: 256 * 1024 })) {
    const buf = carry.length ? Buffer.concat([carry, chunk as Buffer]) : (chunk as Buffer);
    if (first && ((buf[0] === 0xff && buf[1] === 0xfe) || (buf[0] === 0xfe && buf[1] === 0xff)))
      throw notUtf8('The file is UTF-16, not UTF-8. Save it as "CSV UTF-8" and upload it again.', 1);
    first = false;
    const at = firstInvalidUtf8(buf, true);
    if (at >= 0) {
      line += countLines(buf, at);
      const byte = buf[at].toString(16).toUpperCase().padStart(2, '0');
      throw notUtf8(
        `The file is not UTF-8: line ${line} has the byte 0x${byte}, which is not valid UTF-8 (the file was probably saved as Latin-1 or Windows-1252). Save it as "CSV UTF-8" and upload it again; nothing was imported.`,
        line,
      );
    }
    const end = at === -1 ? buf.length : -2 - at;
    line += countLines(buf, end);
    carry = Buffer.from(buf.subarray(end));
  }
  if (carry.length)
    throw notUtf8(
      `The file is not UTF-8: line ${line} ends in the middle of a character (the file is cut short or not UTF-8). Save it as "CSV UTF-8" and upload it again; nothing was imported.`,
      line,
    );
}

export type CsvRow = { line: number; cells: Record<PieceCsvField, string>; errors: ImportError[] };

/** A problem with the file as a whole (header, unreadable CSV, no rows): nothing in it is checked further. */
export class CsvFileErrors extends Error {
  constructor(public errors: ImportError[]) {
    super(errors[0]?.message ?? 'The CSV cannot be read.');
  }
}

/** Rows between two turns of the event loop: other requests (and /api/health) are answered in between. */
export const ROWS_PER_TURN = 50;

/**
 * Streams the CSV (csv-parse's stream API over the file, a UTF-8 file already checked by checkUtf8File), applies
 * the column mapping, checks the header and yields one row at a time. Each row keeps the line it starts on (a
 * quoted cell may span lines), so errors point at the file. A bad header, an unreadable CSV or an empty file
 * throws CsvFileErrors. Every ROWS_PER_TURN rows the loop yields to the event loop (setImmediate).
 */
export async function* readPieceCsv(file: string, mapping: ColumnMapping = {}): AsyncGenerator<CsvRow> {
  // 16 kB reads: csv-parse parses each read in one go, so a read is about a hundred rows of work, not several hundred.
  const parser = createReadStream(file, { highWaterMark: 16 * 1024 }).pipe(
    parse({ info: true, relax_column_count: true, skip_empty_lines: true, trim: false, bom: true }),
  );
  let fieldAt: Array<PieceCsvField | null> | null = null;
  let header: string[] = [];
  let prevEnd = 0;
  let prevEmpty = 0;
  let count = 0;
  try {
    for await (const { record, info } of parser as AsyncIterable<{
      record: string[];
      info: { lines: number; empty_lines: number };
    }>) {
      if (!fieldAt) {
        header = record.map((h) => h.trim());
        fieldAt = header.map((h) => {
          const mapped =
            h in mapping
              ? mapping[h]
              : (PIECE_CSV_FIELDS as readonly string[]).includes(h)
                ? (h as PieceCsvField)
                : null;
          return mapped || null;
        });
        const fileErrors = headerErrors(header, fieldAt);
        if (fileErrors.length) throw new CsvFileErrors(fileErrors);
        prevEnd = info.lines;
        prevEmpty = info.empty_lines;
        continue;
      }
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
        const f = fieldAt![i];
        if (f) cells[f] = restoreCell(value);
      });
      yield { line, cells, errors };
      if (++count % ROWS_PER_TURN === 0) await nextTurn();
    }
  } catch (err) {
    if (err instanceof CsvFileErrors) throw err;
    const e = err as { lines?: number; message: string };
    throw new CsvFileErrors([{ line: e.lines ?? 1, field: null, message: `The CSV cannot be read: ${e.message}` }]);
  } finally {
    parser.destroy();
  }
  if (!fieldAt)
    throw new CsvFileErrors([
      { line: 1, field: null, message: 'The file is empty: a header row and at least one piece are needed.' },
    ]);
}

function headerErrors(header: string[], fieldAt: Array<PieceCsvField | null>): ImportError[] {
  const fileErrors: ImportError[] = [];
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
  return fileErrors;
}
