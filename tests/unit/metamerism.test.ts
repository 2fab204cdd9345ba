import { describe, expect, it } from 'vitest';
import { metamerism } from '../../shared/colour/metamerism.ts';
import { spectrumToXyz, type Spectrum } from '../../shared/colour/spectral.ts';
import check from '../reference/spectra-check.json' with { type: 'json' };

// Metamerism index for a change in illuminant with the multiplicative XYZ correction (CIE 015:2018;
// the correction's form is recalled from memory, see shared/colour/metamerism.ts). No outside
// figures exist for these pairs, so the tests hold the computation to properties that follow
// from the definition: an identical pair is 0 everywhere; a pair that differs only in depth
// (sample = k × original) is fully taken out by the multiplicative correction; a metameric pair
// built to match exactly under D65 has an index equal to its plain ΔE00 under each test light.
const rose = check.spectra[0] as Spectrum;

/** A metameric black for D65/10° on the 10 nm grid: a smooth bump less its projection on the weights. */
function metamericPair(): Spectrum {
  const n = rose.values.length;
  const unit = (i: number) => ({ ...rose, values: rose.values.map((_, j) => (i === j ? 1 : 0)) });
  const W = Array.from({ length: n }, (_, i) => {
    const { X, Y, Z } = spectrumToXyz(unit(i), 'D65', '10').XYZ;
    return [X, Y, Z];
  });
  const p = rose.values.map((_, i) => 0.08 * Math.sin((i / (n - 1)) * Math.PI * 3));
  // p − W (WᵀW)⁻¹ Wᵀ p, solving the 3×3 system by Cramer's rule.
  const WtW = [0, 1, 2].map((a) => [0, 1, 2].map((b) => W.reduce((s, w) => s + w[a] * w[b], 0)));
  const Wtp = [0, 1, 2].map((a) => W.reduce((s, w, i) => s + w[a] * p[i], 0));
  const det = (m: number[][]) =>
    m[0][0] * (m[1][1] * m[2][2] - m[1][2] * m[2][1]) -
    m[0][1] * (m[1][0] * m[2][2] - m[1][2] * m[2][0]) +
    m[0][2] * (m[1][0] * m[2][1] - m[1][1] * m[2][0]);
  const d = det(WtW);
  const c = [0, 1, 2].map((k) => det(WtW.map((row, r) => row.map((v, j) => (j === k ? Wtp[r] : v)))) / d);
  return { ...rose, values: rose.values.map((v, i) => v + p[i] - W[i].reduce((s, w, k) => s + w * c[k], 0)) };
}

describe('metamerism', () => {
  it('an identical pair: 0 under every light, index 0, words say it holds', () => {
    const m = metamerism(rose, rose, '10');
    expect(m.byIlluminant.map((r) => r.deltaE00)).toEqual([0, 0, 0, 0, 0, 0]);
    expect(m.index).toBe(0);
    expect(m.summary).toBe('matches in daylight, and holds under every light checked');
  });

  it('a paler copy (sample = 0.8 × original): the multiplicative correction takes it all out', () => {
    const pale = { ...rose, values: rose.values.map((v) => v * 0.8) };
    const m = metamerism(rose, pale, '10');
    for (const r of m.byIlluminant) {
      expect(r.deltaE00).toBeGreaterThan(3);
      expect(r.corrected).toBeLessThan(1e-9);
    }
    expect(m.index).toBeLessThan(1e-9);
    expect(m.summary).toMatch(/^differs in daylight \(darker.*\), (most of all|and no worse)/);
  });

  it('a metameric pair matching under D65/10°: index = plain ΔE00 under each test light', () => {
    const m = metamerism(rose, metamericPair(), '10');
    const day = m.byIlluminant.find((r) => r.illuminant === 'D65')!;
    expect(day.deltaE00).toBeLessThan(1e-6);
    for (const r of m.byIlluminant) expect(Math.abs(r.corrected! - r.deltaE00)).toBeLessThan(1e-6);
    expect(m.worst.illuminant).not.toBe('D65');
    expect(m.worst.deltaE00).toBeGreaterThan(1);
    expect(m.index).toBeCloseTo(m.worst.deltaE00, 6);
    expect(m.summary).toMatch(/^matches in daylight, .+ (under|in) .+/);
  });
});
