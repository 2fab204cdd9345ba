import jsQR from 'jsqr';
import { getDocument, OPS } from 'pdfjs-dist/legacy/build/pdf.mjs';

type PdfImage = { width: number; height: number; data: Uint8ClampedArray | Uint8Array; kind: number };

/** Text of every page and the QR payloads of every embedded image, read back from the PDF bytes. */
export async function readPdf(bytes: Buffer) {
  const doc = await getDocument({ data: new Uint8Array(bytes), useSystemFonts: false, isEvalSupported: false }).promise;
  const text: string[] = [];
  const qr: string[] = [];
  for (let p = 1; p <= doc.numPages; p++) {
    const page = await doc.getPage(p);
    const content = await page.getTextContent();
    text.push(content.items.map((i) => ('str' in i ? i.str : '')).join(' '));
    const ops = await page.getOperatorList();
    for (const [i, fn] of ops.fnArray.entries()) {
      if (fn !== OPS.paintImageXObject) continue;
      const name = ops.argsArray[i][0] as string;
      const img = (await new Promise((resolve) => page.objs.get(name, resolve))) as PdfImage;
      const rgba = toRgba(img);
      const found = jsQR(rgba, img.width, img.height);
      if (found) qr.push(found.data);
    }
  }
  await doc.destroy();
  return { pages: doc.numPages, text: text.join(' ').replace(/\s+/g, ' '), qr };
}

// pdf.js hands images back as grey (1), RGB (2) or RGBA (3) bytes.
function toRgba(img: PdfImage) {
  const n = img.width * img.height;
  if (img.kind === 3) return new Uint8ClampedArray(img.data);
  const out = new Uint8ClampedArray(n * 4);
  const step = img.kind === 2 ? 3 : 1;
  for (let i = 0; i < n; i++) {
    for (let c = 0; c < 3; c++) out[i * 4 + c] = img.data[i * step + (step === 3 ? c : 0)];
    out[i * 4 + 3] = 255;
  }
  return out;
}
