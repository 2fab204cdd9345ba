import { describe, expect, it } from 'vitest';
import spectral from 'spectral.js';
import {
  commonGrid,
  ksFromR,
  leaveOneOut,
  predictOnLadder,
  quantile,
  rFromKs,
  strengthForTarget,
  type Rung,
} from '../../shared/compute/kubelka-munk.ts';
import { deltaE00 } from '../../shared/colour/difference.ts';
import { spectrumToLab, type Spectrum } from '../../shared/colour/spectral.ts';

// shared/compute/kubelka-munk.ts: the Kubelka–Munk function and its inverse, checked against an independent
// implementation on npm (spectral.js 3.0.0, whose `Color.KS` is K/S of each band and whose `mix` of one colour turns
// K/S back into reflectance), and ladders interpolated in strength, checked on ladders made in the test by
// single-constant Kubelka–Munk from a dye's unit K/S spectrum.
const D65_10 = { illuminant: 'D65', observer: '10' } as const;

describe('the Kubelka–Munk function', () => {
  it('agrees with spectral.js band by band, both ways (38 reflectances from 0.01 to 0.99)', () => {
    const R = Array.from({ length: 38 }, (_x, i) => 0.01 + (0.98 * i) / 37);
    const colour = new spectral.Color(R);
    R.forEach((r, i) => expect(ksFromR(r)).toBeCloseTo(colour.KS[i], 12));
    const back = spectral.mix([colour, 1]).R;
    colour.KS.forEach((ks: number, i: number) => expect(rFromKs(ks)).toBeCloseTo(back[i], 12));
  });

  it('gives the values of (1 − R)² / 2R at round reflectances (arithmetic of the formula, Allen 1980 eq. 20)', () => {
    expect(ksFromR(0.5)).toBe(0.25);
    expect(ksFromR(0.2)).toBeCloseTo(1.6, 12);
    expect(ksFromR(0.1)).toBeCloseTo(4.05, 12);
    expect(ksFromR(1)).toBe(0);
    expect(rFromKs(0)).toBe(1);
    for (const r of [0.02, 0.3, 0.77]) expect(rFromKs(ksFromR(r))).toBeCloseTo(r, 12);
  });
});

// A dye made in the test: an absorption band at 510 nm (a red dye absorbs green), and cotton that reflects 85 %.
const grid = { startNm: 400, intervalNm: 10, n: 31 };
const unitKs = Array.from({ length: grid.n }, (_x, k) => {
  const nm = grid.startNm + k * grid.intervalNm;
  return 0.35 * Math.exp(-(((nm - 510) / 45) ** 2)) + 0.02;
});
const substrateKs = ksFromR(0.85);
/** Single-constant K–M: K/S = substrate + uptake(c) × unit K/S; uptake linear or filling up (Langmuir-like). */
function dyed(strength: number, uptake = (c: number) => c): Spectrum {
  const values = unitKs.map((k) => rFromKs(substrateKs + uptake(strength) * k));
  return { startNm: grid.startNm, intervalNm: grid.intervalNm, values };
}
const rung = (strength: number, uptake?: (c: number) => number): Rung => {
  const spectrum = dyed(strength, uptake);
  return { strength, spectrum, lab: spectrumToLab(spectrum, 'D65', '10').lab };
};
const saturating = (c: number) => (c * 30) / (c + 30);

describe('ladders', () => {
  it('reproduces a dyeing between rungs exactly when uptake is linear (K/S is linear in strength)', () => {
    const ladder = [5, 10, 20, 40].map((c) => rung(c));
    for (const c of [7, 15, 33]) {
      const p = predictOnLadder(ladder, c, D65_10);
      expect(p.method).toBe('kubelka-munk');
      expect(p.extrapolated).toBe(false);
      expect(deltaE00(p.lab, rung(c).lab)).toBeLessThan(1e-6);
    }
    expect(predictOnLadder(ladder, 60, D65_10).extrapolated).toBe(true);
    expect(predictOnLadder(ladder, 2, D65_10).extrapolated).toBe(true);
  });

  it('predicts each inner rung from the others within ΔE00 2 when uptake fills up (leave-one-out)', () => {
    const ladder = [2.5, 5, 10, 20, 40].map((c) => rung(c, saturating));
    const errors = leaveOneOut(ladder, D65_10);
    expect(errors).toHaveLength(3);
    expect(quantile(errors, 0.5)).toBeLessThan(2);
    // Linear uptake: nothing to miss.
    expect(
      Math.max(
        ...leaveOneOut(
          [5, 10, 20, 40].map((c) => rung(c)),
          D65_10,
        ),
      ),
    ).toBeLessThan(1e-6);
  });

  it('finds the strength that gives a target colour, inside the ladder', () => {
    const ladder = [5, 10, 20, 40].map((c) => rung(c));
    const target = rung(13.7).lab;
    const found = strengthForTarget(ladder, target, D65_10);
    expect(found.strength).toBeCloseTo(13.7, 1);
    expect(found.deltaE00).toBeLessThan(0.01);
    expect(found.prediction.extrapolated).toBe(false);
  });

  it('without spectra, follows the measured L*a*b* path in log strength', () => {
    const ladder: Rung[] = [
      { strength: 10, lab: { L: 60, a: 30, b: 10 } },
      { strength: 40, lab: { L: 40, a: 40, b: 20 } },
    ];
    const mid = predictOnLadder(ladder, 20, D65_10);
    expect(mid.method).toBe('lab-path');
    expect(mid.lab.L).toBeCloseTo(50, 10);
    expect(mid.lab.a).toBeCloseTo(35, 10);
    expect(mid.lab.b).toBeCloseTo(15, 10);
    expect(mid.spectrum).toBeNull();
  });

  it('works on the rungs’ common wavelengths when their spectra differ in range and step', () => {
    const g = commonGrid([
      { startNm: 380, intervalNm: 5, values: Array(81).fill(0.5) },
      { startNm: 400, intervalNm: 10, values: Array(31).fill(0.5) },
    ]);
    expect(g).toEqual({ startNm: 400, intervalNm: 10, n: 31 });
  });

  it('quantile is the usual interpolated order statistic', () => {
    expect(quantile([1, 2, 3, 4], 0.5)).toBe(2.5);
    expect(quantile([5, 1, 3], 0.9)).toBeCloseTo(4.6, 12);
  });
});
