import { describe, expect, it } from 'vitest';
import {
  cellKey,
  expandCells,
  materialsList,
  pruneCells,
  scaleCells,
  type SeriesStep,
} from '../../shared/compute/series.ts';
import { gramsFromOwf } from '../../shared/compute/recipe.ts';

// The series of issue 6: madder 25/50/100 % owf × mordant strong Al / weak Al / Fe / Al+Fe × tannin 0/10 % owf.
const factors = [
  { name: 'madder', levels: ['25', '50', '100'] },
  { name: 'mordant', levels: ['strong Al', 'weak Al', 'Fe', 'Al+Fe'] },
  { name: 'tannin', levels: ['0', '10'] },
];

describe('series expansion', () => {
  it('expands 3 × 4 × 2 levels into 24 distinct cells, first factor slowest', () => {
    const cells = expandCells(factors);
    expect(cells).toHaveLength(24);
    expect(new Set(cells.map(cellKey)).size).toBe(24);
    expect(cells[0]).toEqual({ madder: '25', mordant: 'strong Al', tannin: '0' });
    expect(cells[1]).toEqual({ madder: '25', mordant: 'strong Al', tannin: '10' });
    expect(cells[23]).toEqual({ madder: '100', mordant: 'Al+Fe', tannin: '10' });
  });

  it('prunes cells by value, whatever the key order', () => {
    const cells = expandCells(factors);
    const kept = pruneCells(cells, [
      { tannin: '10', mordant: 'Fe', madder: '25' },
      { madder: '100', mordant: 'Al+Fe', tannin: '0' },
    ]);
    expect(kept).toHaveLength(22);
    expect(kept.map(cellKey)).not.toContain(cellKey({ madder: '25', mordant: 'Fe', tannin: '10' }));
  });

  it('refuses a factor without levels or a repeated factor', () => {
    expect(() => expandCells([{ name: 'madder', levels: [] }])).toThrow(RangeError);
    expect(() => expandCells([factors[0], factors[0]])).toThrow(/twice/);
    expect(expandCells([])).toEqual([]);
  });
});

describe('series materials', () => {
  const recipeFor = (cell: Record<string, string>): SeriesStep[] => [
    {
      liquorRatio: 30,
      ingredients: [
        { kind: 'chemical', refId: 1, name: 'potash alum', amount: cell.mordant === 'weak Al' ? 5 : 15, basis: 'owf' },
      ],
    },
    {
      liquorRatio: 30,
      ingredients: [{ kind: 'dyestuff', refId: 7, name: 'madder', amount: Number(cell.madder), basis: 'owf' }],
    },
  ];

  it('scales each cell to its dry mass and sums materials per chemical and dyestuff, with a dead-volume allowance', () => {
    const cells = expandCells([factors[0], { name: 'mordant', levels: ['strong Al', 'weak Al'] }]);
    const scaled = scaleCells(
      cells.map((cell) => ({ cell, steps: recipeFor(cell), fromDryMassG: 250 })),
      10,
    );
    expect(scaled).toHaveLength(6);
    const m = materialsList(scaled, { deadVolumePct: 15 });
    // Hand sums with BRIEF §4.1 (common practice): madder (25+50+100) % × 2 mordants on 10 g = 35 g;
    // alum 3 × (15 % + 5 %) of 10 g = 6 g; bath 6 cells × 2 steps × 10 g × 30 = 3.6 L.
    const madder = m.perParticipant.lines.find((l) => l.name === 'madder')!;
    const alum = m.perParticipant.lines.find((l) => l.name === 'potash alum')!;
    expect(madder.grams).toBeCloseTo(35, 10);
    expect(madder.gramsWithAllowance).toBeCloseTo(35 * 1.15, 10);
    expect(alum.grams).toBeCloseTo(6, 10);
    expect(m.perParticipant.bathL).toBeCloseTo(3.6, 10);
    expect(m.perParticipant.fibreG).toBe(60);
    expect(m.total).toEqual(m.perParticipant);
  });

  it('multiplies the per-participant list for a workshop', () => {
    const cells = expandCells([
      { name: 'madder', levels: ['50'] },
      { name: 'mordant', levels: ['strong Al', 'weak Al', 'Fe'] },
    ]);
    const scaled = scaleCells(
      cells.map((cell) => ({ cell, steps: recipeFor(cell), fromDryMassG: 100 })),
      () => 10,
    );
    const m = materialsList(scaled, { deadVolumePct: 10, participants: 4 });
    const per = m.perParticipant.lines.find((l) => l.name === 'madder')!;
    const all = m.total.lines.find((l) => l.name === 'madder')!;
    expect(per.grams).toBeCloseTo(3 * gramsFromOwf(50, 10), 10);
    expect(all.grams).toBeCloseTo(per.grams * 4, 10);
    expect(all.gramsWithAllowance).toBeCloseTo(per.grams * 4 * 1.1, 10);
    expect(m.total.fibreG).toBe(120);
  });

  it('lists ingredients it cannot resolve instead of guessing', () => {
    const m = materialsList([
      {
        cell: {},
        dryMassG: 10,
        steps: [{ ingredients: [{ kind: 'chemical', name: 'guar gum', amount: 20, basis: 'g/L' }] }],
      },
    ]);
    expect(m.unresolved).toEqual(['guar gum']);
    expect(m.perParticipant.lines).toEqual([]);
  });
});
