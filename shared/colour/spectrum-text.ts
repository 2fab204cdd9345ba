// Reading a pasted or CSV reflectance spectrum. Three layouts are taken, the way instruments and
// spreadsheets write them:
//   - one wavelength and its value per line ("400, 12.3" or "400\t0.123"), any header line skipped;
//   - a row of wavelengths over a row of values (the first two rows holding numbers);
//   - values alone (one per line or separated by commas), with the first wavelength and step given.
// The spectrum's range, step and values are then checked by spectrumSchema (shared/schemas/spectral.ts).
import type { Spectrum } from './spectral.ts';

export type SpectrumText = { ok: true; spectrum: Spectrum } | { ok: false; message: string };

const numbersOf = (line: string) =>
  line
    .split(/[,;\t ]+/)
    .map((x) => x.trim())
    .filter(Boolean);
const isNumber = (x: string) => /^[-+]?(\d+(\.\d*)?|\.\d+)(e[-+]?\d+)?%?$/i.test(x);
const toNumber = (x: string) => Number(x.replace('%', ''));

function fromPairs(wavelengths: number[], values: number[]): SpectrumText {
  if (wavelengths.length < 2) return { ok: false, message: 'Give at least two wavelengths with their values' };
  const step = wavelengths[1] - wavelengths[0];
  for (let i = 1; i < wavelengths.length; i++)
    if (Math.abs(wavelengths[i] - wavelengths[i - 1] - step) > 1e-6)
      return {
        ok: false,
        message: `The wavelengths must be evenly spaced: ${wavelengths[i - 1]} nm is followed by ${wavelengths[i]} nm where ${wavelengths[i - 1] + step} nm was expected`,
      };
  return { ok: true, spectrum: { startNm: wavelengths[0], intervalNm: step, values } };
}

/** Reads pasted text or a CSV file's text into a spectrum (values as written: fractions or %). */
export function parseSpectrumText(text: string, given?: { startNm?: number; intervalNm?: number }): SpectrumText {
  const rows = text
    .split(/\r?\n/)
    .map(numbersOf)
    .filter((r) => r.length && r.every(isNumber))
    .map((r) => r.map(toNumber));
  if (!rows.length) return { ok: false, message: 'Paste the spectrum: a wavelength and a value on each line' };
  if (rows.every((r) => r.length === 2) && rows.length > 2)
    return fromPairs(
      rows.map((r) => r[0]),
      rows.map((r) => r[1]),
    );
  if (rows.length >= 2 && rows[0].length > 2 && rows[0].length === rows[1].length && rows[0][0] >= 300)
    return fromPairs(rows[0], rows[1]);
  const values = rows.flat();
  if (given?.startNm == null || given.intervalNm == null)
    return {
      ok: false,
      message: 'These are values alone: give the first wavelength and the step, or paste wavelengths beside the values',
    };
  return { ok: true, spectrum: { startNm: given.startNm, intervalNm: given.intervalNm, values } };
}
