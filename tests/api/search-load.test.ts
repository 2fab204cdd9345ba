import { QueryTypes } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Chemical, sequelize } from '../../server/models/index.ts';
import { loadAll, loadPiece, loadTrial } from '../../server/search/docs.ts';
import { readShade } from '../../server/search/read.ts';
import { bestVariantOnly } from '../../server/search/engine.ts';
import { ShadeIndex, type ShadeRow } from '../../server/search/shade-index.ts';
import {
  makePaletteColour,
  makePhoto,
  makePiece,
  makeRecipeStep,
  makeSubstitution,
  makeTrial,
} from '../../server/seed/factories.ts';

// The full load reads each table once over a raw connection (server/search/read.ts, docs.ts loadAll); a single
// piece or trial, and the engine's photo updates, still read through Sequelize. Both must give the same values.
let pieceId = 0;
let trialId = 0;

beforeAll(async () => {
  const mordant = await Chemical.findOne({ where: { role: 'mordant' } });
  const piece = await makePiece({
    status: 'published',
    title: 'Loaded twice: madder chintz',
    dyestuffs: [{ name: 'madder', evidence: 'identified' }],
    historicalMordants: [{ name: 'alum', evidence: 'attributed' }],
    earliestYear: 1790,
    latestYear: 1810,
  });
  pieceId = piece.id;
  const trial = await makeTrial({ pieceId, notes: 'trial notes' });
  trialId = trial.id;
  // Steps made out of recipe order: notes follow the recipe (position), not the order the rows were made in.
  await makeRecipeStep({
    trialId,
    position: 2,
    notes: 'second step',
    operation: 'dye-bath',
    ingredients: [{ kind: 'dyestuff', refId: 1, name: 'weld' }] as never,
  });
  await makeRecipeStep({
    trialId,
    position: 1,
    notes: 'first step',
    operation: 'mordant-bath',
    ingredients: [{ kind: 'chemical', refId: mordant!.id, name: mordant!.name }] as never,
  });
  await makeSubstitution({
    trialId,
    stepId: null,
    historicalChemicalId: null,
    historicalPractice: 'red liquor',
    historicalAmountG: null,
    modernChemicalId: mordant!.id,
    modernPractice: null,
    modernAmountG: null,
    reason: 'toxicity',
    notes: null,
  });
  const { photo } = await makePhoto({ pieceId });
  // Doubles that have no short decimal form.
  await makePaletteColour({ photoId: photo.id, L: 0.1 + 0.2, a: -1 / 3, b: Math.PI, share: 1 / 7, hex: '#0a0b0c' });
});

afterAll(async () => {
  await sequelize.close();
});

describe('the full index load (read.ts, docs.ts loadAll)', () => {
  it('builds the same piece and trial documents as loading one piece or trial through Sequelize', async () => {
    const { pieces, trials } = await loadAll();
    const one = await loadPiece(pieceId);
    expect(pieces.find((p) => p.id === pieceId)).toEqual(one.piece);
    const trial = trials.find((t) => t.id === trialId);
    expect(trial).toEqual(await loadTrial(trialId));
    expect(trial!.notes).toBe('trial notes\nfirst step\nsecond step');
    expect(trial!.dyestuffs).toEqual(['weld']);
    expect(one.piece!.modernMordants.length).toBe(1);
  });

  it('reads every palette colour and photo with the same values as a Sequelize query, and the shade index answers alike', async () => {
    const { colours, photos } = await readShade();
    const rows = bestVariantOnly(
      await sequelize.query<ShadeRow & { variant: string }>(
        'SELECT id, photoId, L, a, b, hex, share, variant FROM palette_colours WHERE background = 0 ORDER BY id',
        { type: QueryTypes.SELECT },
      ),
    );
    const c = colours.cols;
    expect(colours.size).toBe(rows.length);
    expect(rows.length).toBeGreaterThan(0);
    rows.forEach((r, j) => {
      expect([c.id[j], c.photo[j], c.L[j], c.A[j], c.B[j], c.rgb[j], c.share[j]]).toEqual([
        r.id,
        r.photoId,
        r.L,
        r.a,
        r.b,
        parseInt(r.hex.slice(1), 16),
        Math.fround(r.share),
      ]);
    });
    expect(rows.some((r) => r.L === 0.1 + 0.2 && r.a === -1 / 3 && r.b === Math.PI)).toBe(true);
    const photoRows = await sequelize.query<{ id: number; pieceId: number | null }>(
      'SELECT id, pieceId FROM photos ORDER BY id',
      { type: QueryTypes.SELECT },
    );
    expect(photos).toEqual(photoRows);
    const fromRows = new ShadeIndex();
    fromRows.load(rows, photoRows);
    const fromColumns = new ShadeIndex();
    fromColumns.load(colours, photos);
    for (const q of [
      { L: 0.3, a: -0.3, b: 3.1, maxDeltaE: 5, limit: 50 },
      { L: 40, a: 40, b: 20, maxDeltaE: 30, limit: 50 },
    ])
      expect(fromColumns.query(q).items).toEqual(fromRows.query(q).items);
  });

  it("keeps each photo's most trustworthy palette variant only: calibrated, then corrected, then raw", async () => {
    const { photo } = await makePhoto({ pieceId });
    const raw = await makePaletteColour({ photoId: photo.id, variant: 'raw', L: 50, a: 40, b: 20, hex: '#a05050' });
    const corrected = await makePaletteColour({ photoId: photo.id, variant: 'corrected', L: 51, a: 39, b: 21 });
    const { photo: other } = await makePhoto({ pieceId });
    const otherRaw = await makePaletteColour({ photoId: other.id, variant: 'raw', L: 30, a: 10, b: -20 });
    let { colours } = await readShade();
    let ids = Array.from(colours.cols.id.subarray(0, colours.size));
    expect(ids).toContain(corrected.id);
    expect(ids).not.toContain(raw.id);
    expect(ids).toContain(otherRaw.id);
    const calibrated = await makePaletteColour({ photoId: photo.id, variant: 'calibrated', L: 52, a: 38, b: 22 });
    ({ colours } = await readShade());
    ids = Array.from(colours.cols.id.subarray(0, colours.size));
    expect(ids).toContain(calibrated.id);
    expect(ids).not.toContain(corrected.id);
    expect(ids).not.toContain(raw.id);
    expect(ids).toContain(otherRaw.id);
    // The columns stay in id order after the compaction (ShadeIndex.load relies on nothing else).
    expect(ids).toEqual([...ids].sort((x, y) => x - y));
  });
});
