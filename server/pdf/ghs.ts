/**
 * GHS hazard pictograms (UN GHS, Annex 3: a black symbol on white in a square set on its point,
 * with a red frame), drawn as vector paths in a 100 × 100 box. The symbols are our own simplified
 * drawings of the standard's shapes; they warn at a glance and never replace the supplier's SDS.
 */
export const GHS_PICTOGRAMS = {
  GHS01: 'exploding bomb',
  GHS02: 'flame',
  GHS03: 'flame over circle',
  GHS04: 'gas cylinder',
  GHS05: 'corrosion',
  GHS06: 'skull and crossbones',
  GHS07: 'exclamation mark',
  GHS08: 'health hazard',
  GHS09: 'environment',
} as const;
export type GhsCode = keyof typeof GHS_PICTOGRAMS;

type Doc = PDFKit.PDFDocument;
const RED = '#e3000f';
const BLACK = '#000000';

function flame(doc: Doc, cx: number, base: number, h: number) {
  const w = h * 0.42;
  doc
    .moveTo(cx - w, base)
    .bezierCurveTo(cx - w * 1.25, base - h * 0.45, cx - w * 0.2, base - h * 0.55, cx - w * 0.15, base - h)
    .bezierCurveTo(cx + w * 0.35, base - h * 0.7, cx + w * 0.25, base - h * 0.55, cx + w * 0.55, base - h * 0.75)
    .bezierCurveTo(cx + w * 1.3, base - h * 0.4, cx + w * 1.05, base - h * 0.1, cx + w, base)
    .closePath()
    .fill(BLACK);
}

const SYMBOLS: Record<GhsCode, (doc: Doc) => void> = {
  GHS01: (doc) => {
    // A bomb bursting: a ball with rays and flying pieces.
    doc.circle(44, 58, 10).fill(BLACK);
    for (let k = 0; k < 9; k++) {
      const t = (-150 + k * 30) * (Math.PI / 180);
      doc
        .moveTo(44 + Math.cos(t) * 14, 58 + Math.sin(t) * 14)
        .lineTo(44 + Math.cos(t) * 24, 58 + Math.sin(t) * 24)
        .lineWidth(3)
        .stroke(BLACK);
    }
    doc.rect(58, 66, 6, 6).fill(BLACK);
    doc.rect(32, 70, 5, 5).fill(BLACK);
  },
  GHS02: (doc) => {
    flame(doc, 50, 66, 40);
    doc.rect(30, 70, 40, 4).fill(BLACK);
  },
  GHS03: (doc) => {
    doc.circle(50, 58, 10).lineWidth(5).stroke(BLACK);
    flame(doc, 50, 46, 22);
    doc.rect(30, 72, 40, 4).fill(BLACK);
  },
  GHS04: (doc) => {
    // A gas cylinder lying on its side, valve to the right.
    doc.roundedRect(26, 48, 40, 16, 8).fill(BLACK);
    doc.rect(66, 52, 6, 8).fill(BLACK);
    doc.rect(72, 50, 3, 12).fill(BLACK);
  },
  GHS05: (doc) => {
    // Liquid pouring from two tubes onto a surface and a hand.
    doc
      .save()
      .rotate(-30, { origin: [36, 34] })
      .rect(30, 22, 8, 20)
      .fill(BLACK)
      .restore();
    doc
      .save()
      .rotate(30, { origin: [64, 34] })
      .rect(62, 22, 8, 20)
      .fill(BLACK)
      .restore();
    doc.circle(40, 50, 2.5).circle(40, 57, 2.5).fill(BLACK);
    doc.circle(60, 50, 2.5).circle(60, 57, 2.5).fill(BLACK);
    doc.rect(30, 64, 16, 4).fill(BLACK);
    doc.moveTo(54, 64).lineTo(72, 64).lineTo(72, 70).lineTo(56, 70).closePath().fill(BLACK);
    doc.rect(26, 74, 48, 4).fill(BLACK);
  },
  GHS06: (doc) => {
    // Skull over crossed bones.
    doc
      .save()
      .rotate(35, { origin: [50, 62] })
      .roundedRect(28, 59, 44, 6, 3)
      .fill(BLACK)
      .restore();
    doc
      .save()
      .rotate(-35, { origin: [50, 62] })
      .roundedRect(28, 59, 44, 6, 3)
      .fill(BLACK)
      .restore();
    doc.circle(50, 42, 13).fill(BLACK);
    doc.rect(43, 50, 14, 9).fill(BLACK);
    doc.circle(45, 42, 3.5).circle(55, 42, 3.5).fill('#ffffff');
  },
  GHS07: (doc) => {
    doc.moveTo(45, 26).lineTo(55, 26).lineTo(52.5, 62).lineTo(47.5, 62).closePath().fill(BLACK);
    doc.circle(50, 70, 5).fill(BLACK);
  },
  GHS08: (doc) => {
    // A head and shoulders with a star-burst on the chest.
    doc.circle(50, 30, 7).fill(BLACK);
    doc
      .moveTo(34, 78)
      .lineTo(34, 50)
      .bezierCurveTo(34, 42, 40, 39, 50, 39)
      .bezierCurveTo(60, 39, 66, 42, 66, 50)
      .lineTo(66, 78)
      .closePath()
      .fill(BLACK);
    const pts: Array<[number, number]> = [];
    for (let k = 0; k < 12; k++) {
      const r = k % 2 ? 4 : 10;
      const t = (k * 30 - 90) * (Math.PI / 180);
      pts.push([50 + Math.cos(t) * r, 58 + Math.sin(t) * r]);
    }
    doc.polygon(...pts).fill('#ffffff');
  },
  GHS09: (doc) => {
    // A bare tree and a dead fish over the water line.
    doc.rect(38, 30, 4, 36).fill(BLACK);
    doc.moveTo(40, 44).lineTo(30, 34).lineWidth(3).stroke(BLACK);
    doc.moveTo(40, 38).lineTo(48, 28).lineWidth(3).stroke(BLACK);
    doc.moveTo(40, 52).lineTo(50, 44).lineWidth(3).stroke(BLACK);
    doc.ellipse(58, 70, 12, 5).fill(BLACK);
    doc.polygon([68, 70], [76, 64], [76, 76]).fill(BLACK);
    doc.rect(26, 66, 20, 2).fill(BLACK);
  },
};

/** Draws one pictogram with its top-left corner at (x, y), `size` points across. */
export function drawPictogram(doc: Doc, code: GhsCode, x: number, y: number, size: number) {
  doc
    .save()
    .translate(x, y)
    .scale(size / 100);
  doc.polygon([50, 4], [96, 50], [50, 96], [4, 50]).lineWidth(7).lineJoin('miter').fillAndStroke('#ffffff', RED);
  SYMBOLS[code](doc);
  doc.restore();
}
