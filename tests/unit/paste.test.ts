import { describe, expect, it } from 'vitest';
import { dilute, pasteMakeUp, stockVolumeMl } from '../../shared/compute/paste.ts';

describe('print paste make-up', () => {
  it('takes V_stock = c·V/c_stock from a stock solution (c1V1 = c2V2)', () => {
    // Demo paste of MB-07 (invented scenario): 40 g/L aluminium acetate in 300 mL from a 75 g/L stock → 160 mL stock.
    expect(stockVolumeMl(40, 300, 75)).toBeCloseTo(160, 10);
    expect(() => stockVolumeMl(80, 300, 75)).toThrow(/stronger than the stock/);
  });

  it('weighs mordant and thickener from g/L × volume and makes up with water', () => {
    const p = pasteMakeUp({
      finalVolumeMl: 300,
      mordants: [{ name: 'aluminium acetate', gPerL: 40, stockGPerL: 75 }],
      thickener: { name: 'guar gum', gPerL: 20 },
    });
    expect(p.mordants[0]).toMatchObject({ grams: 12, stockMl: 160 });
    expect(p.thickener).toMatchObject({ grams: 6, outsideUsualRange: false });
    expect(p.waterMl).toBeCloseTo(140, 10);
  });

  it('flags a loading outside the usual range of the thickener actually in the paste (guar 20–50 g/L, gum arabic 200–500 g/L: dye-facts.json, common practice)', () => {
    const thin = pasteMakeUp({
      finalVolumeMl: 500,
      mordants: [{ name: 'alum', gPerL: 60 }],
      thickener: { name: 'guar gum', gPerL: 5 },
    });
    expect(thin.thickener?.outsideUsualRange).toBe(true);
    expect(thin.thickener?.usualRange).toMatchObject({ kind: 'guar', min: 20, max: 50 });
    // 300 g/L is right for gum arabic, far too thick for guar.
    const arabic = (gPerL: number) =>
      pasteMakeUp({ finalVolumeMl: 500, mordants: [], thickener: { name: 'gum arabic', gPerL } }).thickener;
    expect(arabic(300)).toMatchObject({ outsideUsualRange: false, usualRange: { kind: 'gum-arabic' } });
    expect(arabic(30)?.outsideUsualRange).toBe(true);
    expect(
      pasteMakeUp({ finalVolumeMl: 500, mordants: [], thickener: { name: 'guar gum', gPerL: 300 } }).thickener
        ?.outsideUsualRange,
    ).toBe(true);
    // A thickener the app has no range for is not flagged.
    expect(
      pasteMakeUp({ finalVolumeMl: 500, mordants: [], thickener: { name: 'locust bean gum', gPerL: 5 } }).thickener,
    ).toMatchObject({ usualRange: null, outsideUsualRange: false });
    expect(thin.mordants[0]).toMatchObject({ grams: 30, stockMl: null });
    expect(thin.waterMl).toBe(500);
  });

  it('refuses stock solutions that alone exceed the paste volume', () => {
    expect(() =>
      pasteMakeUp({
        finalVolumeMl: 100,
        mordants: [
          { name: 'a', gPerL: 60, stockGPerL: 75 },
          { name: 'b', gPerL: 50, stockGPerL: 75 },
        ],
      }),
    ).toThrow(/exceed/);
  });
});

describe('dilutions as child batches', () => {
  it('makes a weak alum paste for pinks from the strong one for reds (1 part in 3), keeping the thickening', () => {
    // c1V1 = c2V2 with the demo's 1:3 dilution (invented scenario): 500 mL child at 1/3 strength.
    const d = dilute({ gPerL: { 'aluminium acetate': 60 }, thickenerGPerL: 20, availableMl: 1000 }, 1 / 3, 500);
    expect(d.parentMl).toBeCloseTo(166.667, 3);
    expect(d.waterMl).toBeCloseTo(333.333, 3);
    expect(d.childGPerL['aluminium acetate']).toBeCloseTo(20, 10);
    expect(d.thickenerG).toBeCloseTo(6.6667, 4);
  });

  it('refuses a dilution that needs more parent than is left, or a strength above the parent', () => {
    expect(() => dilute({ gPerL: { alum: 60 }, availableMl: 100 }, 0.5, 500)).toThrow(/Not enough/);
    expect(() => dilute({ gPerL: { alum: 60 } }, 1.5, 500)).toThrow(RangeError);
  });
});
