import type { CardData } from './card-data.ts';
import { signed } from '../../shared/colour/conditions.ts';
import { finish, fitText, newDoc, qrPng } from './doc.ts';

const CARD_W = 523;
const CARD_H = 240;
const GREY = '#8a8a86';

/** Sample cards, three to an A4 page: swatch, recipe summary, ΔE00 to the target, QR to the trial page. */
export async function cardsPdf(title: string, cards: CardData[]) {
  const doc = newDoc(title);
  for (const [i, c] of cards.entries()) {
    if (i > 0 && i % 3 === 0) doc.addPage();
    const x = 36;
    const y = 36 + (i % 3) * (CARD_H + 18);
    doc.rect(x, y, CARD_W, CARD_H).lineWidth(0.5).strokeColor('#c8c8c4').stroke();
    // Swatch on a neutral grey surround so the colour is judged fairly.
    doc.rect(x + 12, y + 12, 130, 130).fill('#bdbdb9');
    if (c.colour) doc.rect(x + 20, y + 20, 114, 114).fill(c.colour.hex);
    else
      doc
        .fillColor('#444')
        .font('sans')
        .fontSize(8)
        .text('no colour recorded yet', x + 24, y + 72, { width: 106, align: 'center' });
    if (c.target) {
      doc.rect(x + 12, y + 150, 130, 30).fill('#bdbdb9');
      doc.rect(x + 20, y + 155, 114, 20).fill(c.target.hex);
    }
    // Every figure printed with the illuminant and observer it is under.
    const labLine = (v: { L: number; a: number; b: number }) =>
      `L* ${v.L.toFixed(1)}  a* ${v.a.toFixed(1)}  b* ${v.b.toFixed(1)}`;
    // One flowing block under the swatches, so a long conditions line pushes the next down instead of overprinting it.
    const colourText = [
      c.colour
        ? `swatch: ${c.colour.conditions}${c.colour.readings && c.colour.readings > 1 ? ` (mean of ${c.colour.readings})` : ''}\n${labLine(c.colour)}`
        : 'swatch: no colour yet',
      c.target ? `target (lower strip): ${c.target.conditions}\n${labLine(c.target)}` : 'no target colour',
    ].join('\n');
    doc.fillColor('#222');
    fitText(doc, colourText, { x: x + 12, y: y + 183, w: 136, h: CARD_H - 188 }, 'sans', 6.5, 5);

    const tx = x + 156;
    doc
      .font('sans-bold')
      .fontSize(14)
      .fillColor('#111')
      .text(c.code, tx, y + 14, { width: 260 });
    doc.font('sans').fontSize(8.5).fillColor('#333');
    fitText(
      doc,
      [`${c.fibre ?? 'fibre not set'}, ${c.massLine}`, c.cell, `status: ${c.status}`].filter(Boolean).join('\n'),
      { x: tx, y: y + 36, w: 260, h: 46 },
      'sans',
      8.5,
      6.5,
    );
    // The recipe shrinks to fit above the ΔE00 block rather than losing its mordant and tannin steps.
    const top = Math.max(doc.y + 4, y + 64);
    fitText(
      doc,
      c.steps.length ? c.steps.join('\n') : 'No recipe steps yet.',
      { x: tx, y: top, w: 260, h: y + CARD_H - 62 - top },
      'sans',
      7.5,
      5.5,
    );
    doc
      .font('sans-bold')
      .fontSize(10)
      .fillColor('#111')
      .text(
        c.deltaE00 != null ? `ΔE00 to target: ${c.deltaE00.toFixed(2)} (${c.verdict})` : 'ΔE00 to target: —',
        tx,
        y + CARD_H - 58,
        { width: 260 },
      );
    doc.font('sans').fontSize(7.5).fillColor('#333');
    if (c.dL != null && c.dC != null && c.dH != null && c.cmc21 != null) {
      doc.text(
        `ΔL* ${signed(c.dL)}   ΔC*ab ${signed(c.dC)}   ΔH*ab ${signed(c.dH)}   CMC(2:1) ${c.cmc21.toFixed(2)}`,
        tx,
        y + CARD_H - 44,
        { width: 260 },
      );
    }
    const lines = [c.words.length ? `than the target: ${c.words.join(', ')}` : null, c.note].filter(Boolean).join('\n');
    if (lines) doc.text(lines, tx, y + CARD_H - 33, { width: 260, height: 30, ellipsis: true });

    doc.image(await qrPng(c.url), x + CARD_W - 102, y + 12, { width: 90, height: 90 });
    doc
      .font('sans')
      .fontSize(6.5)
      .fillColor(GREY)
      .text(c.url, x + CARD_W - 106, y + 106, { width: 98, align: 'center' });
  }
  if (!cards.length) doc.font('sans').fontSize(11).text('This series has no trials yet.');
  return finish(doc);
}
