import { describe, expect, it } from 'vitest';
import { parseSpectrumText } from '../../shared/colour/spectrum-text.ts';

// How a pasted or CSV spectrum is read (the layouts instruments and spreadsheets write; common practice).
describe('reading a pasted spectrum', () => {
  it('takes wavelength/value lines with a header, tabs, commas or spaces', () => {
    const r = parseSpectrumText('nm,R%\n400,12.5\n410, 13\n420\t14\n430 15.5\n');
    expect(r).toEqual({ ok: true, spectrum: { startNm: 400, intervalNm: 10, values: [12.5, 13, 14, 15.5] } });
  });
  it('takes a row of wavelengths over a row of values', () => {
    const r = parseSpectrumText('400;420;440;460\n0.1;0.2;0.3;0.4');
    expect(r).toEqual({ ok: true, spectrum: { startNm: 400, intervalNm: 20, values: [0.1, 0.2, 0.3, 0.4] } });
  });
  it('takes values alone with the first wavelength and step given, and asks for them otherwise', () => {
    expect(parseSpectrumText('0.1\n0.2\n0.3', { startNm: 380, intervalNm: 5 })).toEqual({
      ok: true,
      spectrum: { startNm: 380, intervalNm: 5, values: [0.1, 0.2, 0.3] },
    });
    const r = parseSpectrumText('0.1, 0.2, 0.3');
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.message).toMatch(/first wavelength and the step/);
  });
  it('refuses unevenly spaced wavelengths, saying where', () => {
    const r = parseSpectrumText('400 1\n410 2\n425 3\n430 4');
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.message).toMatch(/410 nm is followed by 425 nm where 420 nm was expected/);
  });
  it('asks for a spectrum when nothing numeric is pasted', () => {
    expect(parseSpectrumText('wavelength,reflectance').ok).toBe(false);
  });
});
