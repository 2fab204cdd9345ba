import { createHash } from 'node:crypto';
import { createReadStream } from 'node:fs';
import { open, rm, stat } from 'node:fs/promises';
import path from 'node:path';
import { pipeline } from 'node:stream/promises';
import { badRequest } from '../../http/errors.ts';
import { storage } from '../../storage/index.ts';

const SHA = /^[0-9a-f]{64}$/;

/** Relative path of a report PDF: reports/<first two hex digits>/<sha256>.pdf (beside masters, not among them). */
export function reportPath(sha256: string) {
  if (!SHA.test(sha256)) throw new Error(`Bad report name ${sha256}`);
  return path.posix.join('reports', sha256.slice(0, 2), `${sha256}.pdf`);
}

async function readRange(file: string, start: number, length: number) {
  const fh = await open(file, 'r');
  try {
    const buf = Buffer.alloc(length);
    const { bytesRead } = await fh.read(buf, 0, length, start);
    return buf.subarray(0, bytesRead);
  } finally {
    await fh.close();
  }
}

const notPdf = (why: string) =>
  badRequest(`The report is not a PDF we can read: ${why}.`, { fields: { report: [`Attach a PDF (${why})`] } });

/**
 * Checks by content that a file is a PDF and its structure can be followed (ISO 32000-1 §7.5: the %PDF-n.m
 * header, and at the end the startxref offset pointing at a cross-reference table or stream, then %%EOF).
 * It does not render the pages: a structurally sound file with broken page content would pass.
 */
export async function checkPdf(file: string) {
  const { size } = await stat(file);
  if (size < 32) throw notPdf('the file is empty or too short');
  const head = (await readRange(file, 0, Math.min(1024, size))).toString('latin1');
  if (!/%PDF-\d\.\d/.test(head)) throw notPdf('it does not start with the PDF header');
  const tailStart = Math.max(0, size - 2048);
  const tail = (await readRange(file, tailStart, size - tailStart)).toString('latin1');
  if (!tail.includes('%%EOF')) throw notPdf('it has no end-of-file marker, it may be cut short');
  const m = /startxref\s+(\d+)\s+%%EOF/.exec(tail.slice(tail.lastIndexOf('startxref')));
  const offset = m ? Number(m[1]) : NaN;
  if (!Number.isFinite(offset) || offset <= 0 || offset >= size) throw notPdf('its cross-reference offset is missing');
  const at = (await readRange(file, offset, 64)).toString('latin1');
  if (!/^\s*(xref|\d+\s+\d+\s+obj)/.test(at)) throw notPdf('its cross-reference table cannot be found');
  return size;
}

export async function sha256OfFile(file: string) {
  const hash = createHash('sha256');
  await pipeline(createReadStream(file), hash);
  return hash.digest('hex');
}

/** Moves a checked upload (staged on this machine) into its content-addressed place in storage (an identical report already there is kept). */
export async function storeReport(tempFile: string, sha256: string) {
  const rel = reportPath(sha256);
  if (await storage().exists(rel)) await rm(tempFile, { force: true });
  else await storage().put(rel, { file: tempFile, move: true, sha256 });
  return rel;
}
