import { afterAll, describe, expect, it } from 'vitest';
import { getDocument, OPS } from 'pdfjs-dist/legacy/build/pdf.mjs';
import { sequelize } from '../../server/models/index.ts';
import { labelsPdf, type Label } from '../../server/pdf/labels.ts';
import { pictogramCodes } from '../../server/pdf/hazard.ts';

afterAll(() => sequelize.close());

// Label grid as laid out by labelsPdf: 3 × 8 on A4 from a 36 pt margin, 174 × 94 pt each.
const W = 174,
  H = 94,
  A4_H = 841.89;
const box = (k: number) => ({ x: 36 + (k % 3) * (W + 0.5), y: 36 + Math.floor(k / 3) * (H + 0.5) });

async function layout(bytes: Buffer) {
  const doc = await getDocument({ data: new Uint8Array(bytes), useSystemFonts: false, isEvalSupported: false }).promise;
  const page = await doc.getPage(1);
  const items = (await page.getTextContent()).items.flatMap((i) =>
    'str' in i && i.str.trim()
      ? [{ str: i.str, x: i.transform[4], base: A4_H - i.transform[5], w: i.width, h: i.height }]
      : [],
  );
  const ops = await page.getOperatorList();
  const strokeColours = ops.fnArray.flatMap((fn, i) =>
    fn === OPS.setStrokeRGBColor ? [Array.from(ops.argsArray[i] as ArrayLike<number>).join(',')] : [],
  );
  await doc.destroy();
  return { items, strokeColours };
}

describe('GHS pictograms from H statements', () => {
  it('assigns the pictogram of each hazard class and drops the exclamation mark under corrosion or the skull', () => {
    expect(pictogramCodes(['H201: Explosive; mass explosion hazard'])).toEqual(['GHS01']);
    expect(pictogramCodes(['H225', 'H319'])).toEqual(['GHS02', 'GHS07']);
    expect(pictogramCodes(['H272'])).toEqual(['GHS03']);
    expect(pictogramCodes(['H280'])).toEqual(['GHS04']);
    expect(pictogramCodes(['H314', 'H302'])).toEqual(['GHS05']);
    expect(pictogramCodes(['H301', 'H315'])).toEqual(['GHS06']);
    expect(pictogramCodes(['H350'])).toEqual(['GHS08']);
    expect(pictogramCodes(['H302', 'H411'])).toEqual(['GHS07', 'GHS09']);
    // Lactation (H362) has no pictogram (UN GHS Annex 1, additional category; recalled from memory).
    expect(pictogramCodes(['H362'])).toEqual([]);
    expect(pictogramCodes(['H360Df', 'H362', 'H373', 'H410'])).toEqual(['GHS08', 'GHS09']);
  });
});

describe('jar labels', () => {
  const long: Label = {
    title:
      'MB-2026-117 · Aluminium potassium sulfate dodecahydrate with calcium acetate and chalk, second top-up for the Turkey red series',
    lines: [
      '2000 mL made 2026-11-01, check by 2026-12-01',
      'potassium aluminium sulfate dodecahydrate 150 g, calcium acetate monohydrate 40 g, wheat starch 30 g, gum tragacanth 5 g, chalk (calcium carbonate) 20 g, tartaric acid 12 g, sodium carbonate 4 g, water to volume',
      'thickener 25 g/L, pH 4.2',
    ],
    hazards: [{ name: 'test', signalWord: 'Danger', hStatements: ['H225', 'H314', 'H302', 'H410'] }],
  };
  const short: Label = {
    title: 'MB-09 · alum',
    lines: ['500 mL made 2026-11-02'],
    hazards: [{ name: 'alum', signalWord: 'Warning', hStatements: ['H319'] }],
  };

  it('keeps every word of every label inside its own box, however long the names', async () => {
    const { items } = await layout(await labelsPdf('labels', [long, short, long, short]));
    expect(items.length).toBeGreaterThan(10);
    for (const it of items) {
      // The label a text item starts in must also hold its end and its full height.
      const k = [0, 1, 2, 3].find(
        (j) => it.x >= box(j).x && it.x < box(j).x + W && it.base > box(j).y && it.base <= box(j).y + H,
      );
      expect(k, `"${it.str}" lies outside every label`).toBeDefined();
      const b = box(k!);
      expect(it.x + it.w, `"${it.str}" runs past its label`).toBeLessThanOrEqual(b.x + W + 0.01);
      expect(it.base - it.h, `"${it.str}" rises above its label`).toBeGreaterThanOrEqual(b.y - 0.01);
    }
    // The long title wraps (several lines) instead of running on one line out of the box.
    const titleLines = items.filter(
      (i) =>
        box(0).y < i.base &&
        i.base < box(0).y + 30 &&
        i.x < box(0).x + W &&
        /Aluminium|dodecahydrate|Turkey/.test(i.str),
    );
    expect(titleLines.length).toBeGreaterThanOrEqual(2);
  });

  it('draws the pictograms (red-framed diamonds, code beneath) instead of naming them, and keeps the SDS caution', async () => {
    const { items, strokeColours } = await layout(await labelsPdf('labels', [long, short]));
    const text = items.map((i) => i.str).join(' ');
    for (const code of ['GHS02', 'GHS05', 'GHS09', 'GHS07']) expect(text).toContain(code);
    expect(text).not.toMatch(/corrosion|flame|exclamation|environment/);
    expect(text).toContain('DANGER');
    expect(text).toContain('WARNING');
    expect(text).toContain('safety data sheet');
    // One red frame per pictogram: three on the first label, one on the second.
    expect(strokeColours.filter((c) => c === '227,0,15')).toHaveLength(4);
  });
});
