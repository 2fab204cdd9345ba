import { Op } from 'sequelize';
import { Chemical, type MordantBatch } from '../models/index.ts';
import { finish, fitText, newDoc } from './doc.ts';
import { drawPictogram } from './ghs.ts';
import { pictogramCodes, strongestSignal, type Hazard } from './hazard.ts';

export type Label = { title: string; lines: string[]; hazards: Hazard[] };

const COLS = 3;
const ROWS = 8;
const W = 174;
const H = 94;

const PAD = 6;
const PICTO = 24;

/** A sheet of small labels (3 × 8 on A4) for bath jars and swatches: each part of a label keeps to its own box. */
export async function labelsPdf(title: string, labels: Label[]) {
  const doc = newDoc(title);
  for (const [i, l] of labels.entries()) {
    if (i > 0 && i % (COLS * ROWS) === 0) doc.addPage();
    const k = i % (COLS * ROWS);
    const x = 36 + (k % COLS) * (W + 0.5);
    const y = 36 + Math.floor(k / COLS) * (H + 0.5);
    doc.rect(x, y, W, H).lineWidth(0.4).dash(2, { space: 2 }).strokeColor('#999').stroke().undash();
    const inner = W - 2 * PAD;
    // Title: up to two lines, shrinking before it is cut.
    doc.fillColor('#111');
    fitText(doc, l.title, { x: x + PAD, y: y + 4, w: inner, h: 24 }, 'sans-bold', 9, 6);
    // Hazard strip at the foot: the pictograms (drawn, each with its code), then the signal word and the SDS line.
    const codes = [...new Set(l.hazards.flatMap((h) => pictogramCodes(h.hStatements)))].sort();
    const textMin = 64;
    const size = codes.length ? Math.min(PICTO, (inner - textMin) / codes.length) : 0;
    const stripTop = y + H - PAD - PICTO - 5;
    const bodyTop = y + 29;
    doc.fillColor('#222');
    fitText(doc, l.lines.join('\n'), { x: x + PAD, y: bodyTop, w: inner, h: stripTop - 2 - bodyTop }, 'sans', 6.5, 4.5);
    for (const [j, code] of codes.entries()) {
      const px = x + PAD + j * size;
      drawPictogram(doc, code, px, stripTop, size);
      doc
        .font('sans')
        .fontSize(Math.min(4.5, size / 5.2))
        .fillColor('#222')
        .text(code, px, stripTop + size + 0.5, { width: size, align: 'center', lineBreak: false });
    }
    const signal = strongestSignal(l.hazards);
    const tx = x + PAD + codes.length * size + (codes.length ? 4 : 0);
    const tw = x + W - PAD - tx;
    doc.fillColor('#111');
    fitText(
      doc,
      signal ? signal.toUpperCase() : 'No GHS signal word',
      { x: tx, y: stripTop, w: tw, h: 10 },
      'sans-bold',
      7,
      5,
    );
    fitText(
      doc,
      "See the supplier's safety data sheet and local rules.",
      { x: tx, y: stripTop + 10, w: tw, h: PICTO - 5 },
      'sans',
      6,
      4.5,
    );
  }
  if (!labels.length) doc.font('sans').fontSize(11).text('Nothing to label.');
  return finish(doc);
}

export async function hazardsFor(refIds: number[]): Promise<Hazard[]> {
  if (!refIds.length) return [];
  const rows = await Chemical.findAll({
    where: { id: { [Op.in]: refIds } },
    attributes: ['name', 'signalWord', 'hStatements'],
  });
  return rows.map((c) => ({ name: c.name, signalWord: c.signalWord, hStatements: c.hStatements ?? [] }));
}

export async function batchLabel(b: MordantBatch): Promise<Label> {
  const contents = b.ingredients.map((i) => `${i.name} ${i.grams} g`).join(', ');
  return {
    title: `${b.code} · ${b.name}`,
    lines: [
      `${b.volumeMl} mL made ${b.madeOn}${b.checkBy ? `, check by ${b.checkBy}` : ''}`,
      contents || 'no ingredients recorded',
      [b.thickenerGPerL != null ? `thickener ${b.thickenerGPerL} g/L` : null, b.ph != null ? `pH ${b.ph}` : null]
        .filter(Boolean)
        .join(', '),
    ].filter(Boolean),
    hazards: await hazardsFor(b.ingredients.filter((i) => i.kind === 'chemical').map((i) => i.refId)),
  };
}

export async function batchLabelPdf(batches: MordantBatch[]) {
  return labelsPdf(`Jar labels ${batches.map((b) => b.code).join(', ')}`, await Promise.all(batches.map(batchLabel)));
}
