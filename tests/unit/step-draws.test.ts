import { describe, expect, it } from 'vitest';
import { drawWarnings, scaleDraw } from '../../shared/trials/draws.ts';

const mb = (code: string, remainingMl: number, status = 'active') => ({ code, remainingMl, status });

describe('bath draws when a recipe is scaled', () => {
  it('scales the volume drawn with the dry mass (plain proportion)', () => {
    expect(scaleDraw(160, 250, 500)).toBe(320);
    expect(scaleDraw(null, 250, 500)).toBeNull();
  });

  it('warns when the scaled draws from one bath exceed what it holds, summing its steps', () => {
    const steps = [
      { batchId: 1, batchVolumeMl: 100, batch: mb('MB-12', 500) },
      { batchId: 1, batchVolumeMl: 60, batch: mb('MB-12', 500) },
      { batchId: 2, batchVolumeMl: 100, batch: mb('MB-13', 1000) },
      { batchId: null, batchVolumeMl: null, batch: null },
    ];
    // 250 g → 1000 g: MB-12 gives (100 + 60) × 4 = 640 mL of 500 mL; MB-13 400 of 1000 mL.
    const w = drawWarnings(steps, 250, 1000);
    expect(w).toHaveLength(1);
    expect(w[0]).toMatchObject({ code: 'MB-12', neededMl: 640, heldMl: 500 });
    expect(w[0].message).toBe(
      'Scaled, this recipe draws 640 mL from MB-12, which holds 500 mL now: make up or top up the bath first.',
    );
    // At the recorded mass or below, nothing to warn about.
    expect(drawWarnings(steps, 250, 250)).toEqual([]);
    expect(drawWarnings(steps, 250, 100)).toEqual([]);
  });

  it('says when the bath is exhausted', () => {
    const w = drawWarnings([{ batchId: 7, batchVolumeMl: 160, batch: mb('MB-07', 0, 'exhausted') }], 250, 300);
    expect(w[0].message).toBe(
      'Scaled, this recipe draws 192 mL from MB-07, which holds 0 mL now (exhausted): make up or top up the bath first.',
    );
  });
});
