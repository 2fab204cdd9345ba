import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtemp, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { checkUtf8File, CsvFileErrors, readPieceCsv } from '../../server/import/csv-file.ts';
import type { HttpError } from '../../server/http/errors.ts';

let dir: string;
beforeAll(async () => {
  dir = await mkdtemp(path.join(tmpdir(), 'csv-stream-'));
});
afterAll(() => rm(dir, { recursive: true, force: true }));

const file = async (name: string, bytes: Buffer | string) => {
  const f = path.join(dir, name);
  await writeFile(f, bytes);
  return f;
};
const refusal = (p: Promise<unknown>) =>
  p.then(
    () => null,
    (e: HttpError) => ({ code: e.code, message: e.message }),
  );

// The file is checked in reads of 256 kB: a character cut by the end of one read must not count as invalid.
const READ = 256 * 1024;

describe('the streamed UTF-8 check', () => {
  it('accepts characters cut across reads, and counts lines across them', async () => {
    // "é" is C3 A9 and "茜" E8 8C 9C (RFC 3629): both start on the last bytes of the first read.
    for (const [ch, at] of [
      ['é', READ - 1],
      ['茜', READ - 1],
      ['茜', READ - 2],
    ] as const) {
      const head = `${'a,b\n'.repeat(Math.floor(at / 4))}${'x'.repeat(at % 4)}`;
      const f = await file('cut.csv', Buffer.concat([Buffer.from(head), Buffer.from(`${ch},z\n`)]));
      await expect(checkUtf8File(f)).resolves.toBeUndefined();
    }
  });

  it('names the line of a Latin-1 byte after several reads, and refuses UTF-16 and a cut-off last character', async () => {
    const lines = 3 * (READ / 4) + 10; // past the third read
    // "é" in Latin-1 is the single byte E9, which cannot stand alone in UTF-8 (RFC 3629 §3).
    const latin1 = Buffer.concat([Buffer.from('a,b\n'.repeat(lines)), Buffer.from([0x61, 0xe9, 0x0a])]);
    expect(await refusal(checkUtf8File(await file('latin1.csv', latin1)))).toEqual({
      code: 'not_utf8',
      message: expect.stringContaining(`line ${lines + 1} has the byte 0xE9`),
    });
    const utf16 = Buffer.from('\ufeffa,b\n', 'utf16le');
    expect(await refusal(checkUtf8File(await file('utf16.csv', utf16)))).toMatchObject({
      message: expect.stringMatching(/UTF-16/),
    });
    const cut = Buffer.concat([Buffer.from('a,b\nc,'), Buffer.from([0xe8, 0x8c])]);
    expect(await refusal(checkUtf8File(await file('cut-off.csv', cut)))).toMatchObject({
      message: expect.stringMatching(/line 2 ends in the middle of a character/),
    });
  });
});

describe('the streamed CSV reader', () => {
  it('yields rows with the line each starts on (quoted cells over lines, blank lines), and a BOM is not a header', async () => {
    const csv = '\ufeffaccessionNumber,objectName,title\nA.1,panel,"Two\nlines"\n\nA.2,panel,Plain\n';
    const rows = [];
    for await (const r of readPieceCsv(await file('rows.csv', csv))) rows.push([r.line, r.cells.title]);
    expect(rows).toEqual([
      [2, 'Two\nlines'],
      [5, 'Plain'],
    ]);
  });

  it('throws the file errors for a missing required column and for a CSV it cannot read', async () => {
    const read = async (csv: string) => {
      try {
        for await (const _ of readPieceCsv(await file('bad.csv', csv))) void _;
        return null;
      } catch (e) {
        return e instanceof CsvFileErrors ? e.errors : e;
      }
    };
    expect(await read('accessionNumber,objectName\nA.1,panel\n')).toEqual([
      { line: 1, field: 'title', message: expect.stringMatching(/required column Title/) },
    ]);
    expect(await read('accessionNumber,objectName,title\nA.1,panel,"open quote\n')).toEqual([
      { line: expect.any(Number), field: null, message: expect.stringMatching(/^The CSV cannot be read/) },
    ]);
    expect(await read('')).toEqual([{ line: 1, field: null, message: expect.stringMatching(/file is empty/) }]);
  });
});
