import { Op } from 'sequelize';
import { Chemical, type MordantBatch } from '../models/index.ts';
import { finish, newDoc } from './doc.ts';
import { pictogramWords, strongestSignal, type Hazard } from './hazard.ts';

export type Label = { title: string; lines: string[]; hazards: Hazard[] };

const COLS = 3;
const ROWS = 8;
const W = 174;
const H = 94;

/** A sheet of small labels (3 × 8 on A4) for bath jars and swatches. */
export async function labelsPdf(title: string, labels: Label[]) {
  const doc = newDoc(title);
  for (const [i, l] of labels.entries()) {
    if (i > 0 && i % (COLS * ROWS) === 0) doc.addPage();
    const k = i % (COLS * ROWS);
    const x = 36 + (k % COLS) * (W + 0.5);
    const y = 36 + Math.floor(k / COLS) * (H + 0.5);
    doc.rect(x, y, W, H).lineWidth(0.4).dash(2, { space: 2 }).strokeColor('#999').stroke().undash();
    doc.font('sans-bold').fontSize(9).fillColor('#111').text(l.title, x + 6, y + 5, { width: W - 12, lineBreak: false, ellipsis: true });
    doc.font('sans').fontSize(6.5).fillColor('#222').text(l.lines.join('\n'), x + 6, y + 18, { width: W - 12, height: 44, ellipsis: true });
    const signal = strongestSignal(l.hazards);
    const words = [...new Set(l.hazards.flatMap((h) => pictogramWords(h.hStatements)))];
    doc.font('sans-bold').fontSize(7).text(signal ? `${signal.toUpperCase()}` : 'No GHS signal word', x + 6, y + H - 28, { width: W - 12 });
    doc.font('sans').fontSize(6).text(`${words.length ? `Pictograms: ${words.join(', ')}. ` : ''}See the supplier's safety data sheet.`, { width: W - 12, height: 16, ellipsis: true });
  }
  if (!labels.length) doc.font('sans').fontSize(11).text('Nothing to label.');
  return finish(doc);
}

export async function hazardsFor(refIds: number[]): Promise<Hazard[]> {
  if (!refIds.length) return [];
  const rows = await Chemical.findAll({ where: { id: { [Op.in]: refIds } }, attributes: ['name', 'signalWord', 'hStatements'] });
  return rows.map((c) => ({ name: c.name, signalWord: c.signalWord, hStatements: c.hStatements ?? [] }));
}

export async function batchLabel(b: MordantBatch): Promise<Label> {
  const contents = b.ingredients.map((i) => `${i.name} ${i.grams} g`).join(', ');
  return {
    title: `${b.code} · ${b.name}`,
    lines: [
      `${b.volumeMl} mL made ${b.madeOn}${b.checkBy ? `, check by ${b.checkBy}` : ''}`,
      contents || 'no ingredients recorded',
      [b.thickenerGPerL != null ? `thickener ${b.thickenerGPerL} g/L` : null, b.ph != null ? `pH ${b.ph}` : null].filter(Boolean).join(', '),
    ].filter(Boolean),
    hazards: await hazardsFor(b.ingredients.filter((i) => i.kind === 'chemical').map((i) => i.refId)),
  };
}

export async function batchLabelPdf(batches: MordantBatch[]) {
  return labelsPdf(`Jar labels ${batches.map((b) => b.code).join(', ')}`, await Promise.all(batches.map(batchLabel)));
}
