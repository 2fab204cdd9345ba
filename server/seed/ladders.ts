import { ksFromR, rFromKs } from '../../shared/compute/kubelka-munk.ts';
import type { Spectrum } from '../../shared/colour/spectral.ts';

/**
 * The demo's strength ladders (madder and weld, 5–40 % owf on alum-mordanted cotton) need readings, and the demo has
 * no instrument: their reflectance spectra are made here by single-constant Kubelka–Munk from invented unit K/S
 * curves (broad absorption bands where madder's aluminium lake and weld's absorb, madder's with a little all-round
 * absorption that dulls it towards a Turkey red), an uptake that fills up
 * at high strengths, and a small fixed wobble standing in for a real reading's scatter. Invented demo data, shaped to
 * look like such readings; not measurements.
 */
const GRID = { startNm: 400, intervalNm: 10, n: 31 };
const nmAt = (k: number) => GRID.startNm + k * GRID.intervalNm;
const band = (nm: number, centre: number, width: number, height: number) =>
  height * Math.exp(-(((nm - centre) / width) ** 2));

/** Bleached, alum-and-tannin mordanted cotton: a little yellower than white (tannin), so K/S rises into the blue. */
const substrateKs = (nm: number) => ksFromR(0.86) + band(nm, 400, 60, 0.05);

export const LADDER_DYES = {
  madder: { unitKs: (nm: number) => band(nm, 520, 55, 0.45) + band(nm, 470, 45, 0.8) + 0.015, halfSaturation: 50 },
  weld: { unitKs: (nm: number) => band(nm, 405, 55, 0.3) + band(nm, 465, 25, 0.04), halfSaturation: 30 },
} as const;
export type LadderDye = keyof typeof LADDER_DYES;

/** The reflectance spectrum of a dyeing at `owf` % of one dye, with a fixed wobble of a few tenths of a percent. */
export function ladderSpectrum(dye: LadderDye, owf: number): Spectrum {
  const { unitKs, halfSaturation } = LADDER_DYES[dye];
  const onFibre = (owf * halfSaturation) / (owf + halfSaturation);
  const values = Array.from({ length: GRID.n }, (_x, k) => {
    const nm = nmAt(k);
    const wobble = 1 + 0.004 * Math.sin(owf * 1.7 + k * 0.9);
    return Math.round(rFromKs(substrateKs(nm) + onFibre * unitKs(nm)) * wobble * 10_000) / 10_000;
  });
  return { startNm: GRID.startNm, intervalNm: GRID.intervalNm, values };
}
