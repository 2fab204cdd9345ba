import path from 'node:path';
import PDFDocument from 'pdfkit';
import QRCode from 'qrcode';
import { ROOT_DIR } from '../env.ts';

const FONT_DIR = path.join(ROOT_DIR, 'fonts');

/** A new A4 document with the shipped IBM Plex Sans (pdfkit reads WOFF, not WOFF2). */
export function newDoc(title: string) {
  const doc = new PDFDocument({ size: 'A4', margin: 36, info: { Title: title, Creator: 'Tinctoria' } });
  doc.registerFont('sans', path.join(FONT_DIR, 'IBMPlexSans-Regular.woff'));
  doc.registerFont('sans-bold', path.join(FONT_DIR, 'IBMPlexSans-SemiBold.woff'));
  doc.font('sans');
  return doc;
}

export function finish(doc: PDFKit.PDFDocument): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    const chunks: Buffer[] = [];
    doc.on('data', (c: Buffer) => chunks.push(c));
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
    doc.end();
  });
}

/** The QR image drawn on cards: exposed on its own so tests can decode exactly what is embedded. */
export const qrPng = (url: string) =>
  QRCode.toBuffer(url, { type: 'png', errorCorrectionLevel: 'M', margin: 2, scale: 6 });

/**
 * Writes `text` in the box at the largest size from `max` down to `min` at which it fits; at `min`
 * whatever still does not fit is cut with an ellipsis, so nothing prints outside its box.
 */
export function fitText(
  doc: PDFKit.PDFDocument,
  text: string,
  box: { x: number; y: number; w: number; h: number },
  font: string,
  max: number,
  min: number,
) {
  doc.font(font);
  let size = max;
  for (; size > min; size -= 0.25) if (doc.fontSize(size).heightOfString(text, { width: box.w }) <= box.h) break;
  doc.fontSize(size).text(text, box.x, box.y, { width: box.w, height: box.h, ellipsis: true });
  return size;
}
