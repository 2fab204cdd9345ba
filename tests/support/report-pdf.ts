import PDFDocument from 'pdfkit';
import { mkdtemp, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { sha256OfFile, storeReport } from '../../server/services/records/report-file.ts';

/** A small real PDF (pdfkit), as a lab report would be. */
export function reportPdf(text = 'HPLC-DAD report: alizarin and purpurin found.'): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    const doc = new PDFDocument({ size: 'A4', info: { Title: 'Test report' } });
    const chunks: Buffer[] = [];
    doc.on('data', (c: Buffer) => chunks.push(c));
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
    doc.text(text);
    doc.end();
  });
}

/** Stores a report file as the upload route would, and answers its sha256 and size. */
export async function storedReport(text?: string) {
  const buffer = await reportPdf(text);
  const dir = await mkdtemp(path.join(tmpdir(), 'report-'));
  const file = path.join(dir, 'r.pdf');
  await writeFile(file, buffer);
  const sha256 = await sha256OfFile(file);
  await storeReport(file, sha256);
  return { sha256, bytes: buffer.length };
}
