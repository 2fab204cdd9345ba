import type { Bench, BenchResult } from './index.ts';

/**
 * How well recipe suggestions predict (issue 20, point 3): leave-one-out on ladders, each inner rung's colour
 * predicted from the other rungs at its own strength (shared/compute/kubelka-munk.ts), ΔE00 against its reading
 * under D65/10°. Two sets: the demo's ladders, read from the database as the suggestions service reads them (the
 * demo is seeded into the throwaway database), and a synthetic set made here by single-constant Kubelka–Munk from a
 * few invented dye K/S curves, single dyes and two-dye mixtures, with uptake that fills up at a random rate and
 * reading scatter. Target: median ≤ 2.0 within ladders. The 90th percentile is printed beside it.
 */
const D65_10 = { illuminant: 'D65', observer: '10' } as const;

function rng(seed: number) {
  let s = seed >>> 0;
  return () => {
    s = (s * 1664525 + 1013904223) >>> 0;
    return s / 2 ** 32;
  };
}

export const suggestBench: Bench = {
  name: 'suggest',
  async run() {
    const { migrate, seed } = await import('../../server/db/setup.ts');
    const { ladderEvaluation } = await import('../../server/services/suggestions/recipes.ts');
    const { ksFromR, rFromKs, leaveOneOut, quantile } = await import('../../shared/compute/kubelka-munk.ts');
    const { spectrumToLab } = await import('../../shared/colour/spectral.ts');
    await migrate();
    await seed('demo');

    const out: BenchResult[] = [];
    const report = (label: string, errors: number[], ladders: number) => {
      out.push(
        {
          metric: `${label}: leave-one-out ΔE00 median`,
          value: quantile(errors, 0.5),
          unit: `ΔE00 (${errors.length} predictions on ${ladders} ladders, D65/10°)`,
          target: '≤ 2.0',
          pass: quantile(errors, 0.5) <= 2,
        },
        { metric: `${label}: leave-one-out ΔE00 90th percentile`, value: quantile(errors, 0.9), unit: 'ΔE00' },
      );
    };

    const demo = await ladderEvaluation(D65_10);
    report(
      'demo ladders',
      demo.flatMap((l) => l.errors),
      demo.length,
    );

    // Synthetic ladders: absorption bands where madder, weld, cochineal, indigo and a tannin-iron grey absorb
    // (invented shapes), singly and in pairs, on cotton reflecting 85 %.
    const random = rng(20);
    const grid = Array.from({ length: 31 }, (_x, k) => 400 + 10 * k);
    const band = (c: number, w: number, h: number) => grid.map((nm) => h * Math.exp(-(((nm - c) / w) ** 2)));
    const dyes = [
      band(515, 55, 0.5).map((v, k) => v + band(455, 45, 0.3)[k]),
      band(405, 55, 0.3),
      band(545, 40, 0.7),
      band(630, 60, 0.8),
      grid.map(() => 0.25),
    ];
    const errors: number[] = [];
    let ladders = 0;
    for (let i = 0; i < dyes.length; i++)
      for (let j = i; j < dyes.length; j++)
        for (let rep = 0; rep < 4; rep++) {
          const mix = random();
          const unit = dyes[i].map((v, k) => (i === j ? v : mix * v + (1 - mix) * dyes[j][k]));
          const half = 15 + 45 * random();
          const rungs = [2.5, 5, 10, 20, 40].map((owf) => {
            const onFibre = (owf * half) / (owf + half);
            const values = unit.map((u) => rFromKs(ksFromR(0.85) + onFibre * u) * (1 + 0.006 * (random() - 0.5)));
            const spectrum = { startNm: 400, intervalNm: 10, values };
            return { strength: owf, spectrum, lab: spectrumToLab(spectrum, 'D65', '10').lab };
          });
          errors.push(...leaveOneOut(rungs, D65_10));
          ladders++;
        }
    report('synthetic ladders', errors, ladders);
    return out;
  },
};
