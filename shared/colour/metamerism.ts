// Metamerism of a reproduction against an original, both measured as reflectance spectra.
//
// The special metamerism index for a change in illuminant (CIE 015:2018, the clause on
// metamerism indices; section number and wording recalled from memory, not checked): the colour
// difference of the pair under a test illuminant, with the pair's difference under the reference
// illuminant taken out. We use the multiplicative correction in XYZ, which we recall CIE 015
// recommends when the pair does not match exactly under the reference illuminant: the sample's
// tristimulus values under the test illuminant are multiplied, one by one, by the ratio
// original/sample of the same tristimulus value under the reference illuminant
// (X′₂ₜ = X₂ₜ·X₁ᵣ/X₂ᵣ, and likewise Y, Z). Reference illuminant D65. The colour difference is
// ΔE00 throughout, as on the rest of the trial page (CIE 015 leaves the formula to be named
// beside the index).
import { differenceReport, DEFAULT_BANDS, verdictFor, type Bands } from './difference.ts';
import {
  spectrumToXyz,
  xyzToLabWith,
  SPECTRAL_ILLUMINANTS,
  type SpectralIlluminant,
  type SpectralObserver,
  type Spectrum,
} from './spectral.ts';

export const REFERENCE_ILLUMINANT: SpectralIlluminant = 'D65';

/** "under …" in people's words: what each illuminant stands for on a gallery wall or at a window. */
export const UNDER_WORDS: Record<SpectralIlluminant, string> = {
  D65: 'in daylight',
  D50: 'in viewing-booth daylight (D50)',
  A: 'under warm tungsten museum lighting (A)',
  F2: 'under cool white fluorescent light (F2)',
  F11: 'under three-band fluorescent light (F11)',
  'LED-B3': 'under neutral white LED lighting (LED-B3)',
};

export type MetamerismRow = {
  illuminant: SpectralIlluminant;
  /** ΔE00 of the pair as they are under this illuminant. */
  deltaE00: number;
  /** The same with the reference-illuminant difference taken out (0 under the reference; null when it cannot be). */
  corrected: number | null;
  /** How the sample differs under this illuminant ("darker", "redder"). */
  words: string[];
};

export function metamerism(
  reference: Spectrum,
  sample: Spectrum,
  observer: SpectralObserver,
  bands: Bands = DEFAULT_BANDS,
) {
  const ref = SPECTRAL_ILLUMINANTS.map((i) => spectrumToXyz(reference, i, observer));
  const smp = SPECTRAL_ILLUMINANTS.map((i) => spectrumToXyz(sample, i, observer));
  const r0 = SPECTRAL_ILLUMINANTS.indexOf(REFERENCE_ILLUMINANT);
  // A sample with a zero tristimulus value under the reference (a perfect black) cannot be corrected: no index then.
  const s0 = smp[r0].XYZ;
  const correctable = s0.X > 0 && s0.Y > 0 && s0.Z > 0;
  const factor = { X: ref[r0].XYZ.X / s0.X, Y: ref[r0].XYZ.Y / s0.Y, Z: ref[r0].XYZ.Z / s0.Z };
  const rows: MetamerismRow[] = SPECTRAL_ILLUMINANTS.map((illuminant, i) => {
    const white = ref[i].white;
    const a = xyzToLabWith(ref[i].XYZ, white);
    const b = xyzToLabWith(smp[i].XYZ, white);
    const s = smp[i].XYZ;
    const corrected = xyzToLabWith({ X: s.X * factor.X, Y: s.Y * factor.Y, Z: s.Z * factor.Z }, white);
    const report = differenceReport(a, b, bands);
    return {
      illuminant,
      deltaE00: report.deltaE00,
      corrected: i === r0 ? 0 : correctable ? differenceReport(a, corrected, bands).deltaE00 : null,
      words: report.words,
    };
  });
  const worst = rows.reduce((w, r) => (r.deltaE00 > w.deltaE00 ? r : w));
  const tests = rows.filter((r) => r.illuminant !== REFERENCE_ILLUMINANT);
  const indexRow = correctable ? tests.reduce((w, r) => (r.corrected! > w.corrected! ? r : w)) : null;
  return {
    observer,
    referenceIlluminant: REFERENCE_ILLUMINANT,
    byIlluminant: rows,
    worst: { illuminant: worst.illuminant, deltaE00: worst.deltaE00 },
    /** The largest corrected difference over the test illuminants, and where. */
    index: indexRow ? indexRow.corrected! : null,
    indexIlluminant: indexRow ? indexRow.illuminant : null,
    summary: metamerismWords(rows, bands),
  };
}

/**
 * One sentence: how the pair looks in daylight, then where it fails worst and which way
 * ("matches in daylight, redder under warm tungsten museum lighting (A)"). A pair within the
 * match band everywhere "holds under every light checked".
 */
export function metamerismWords(rows: MetamerismRow[], bands: Bands = DEFAULT_BANDS): string {
  const day = rows.find((r) => r.illuminant === REFERENCE_ILLUMINANT)!;
  const verdict = verdictFor(day.deltaE00, bands);
  const first =
    verdict === 'match'
      ? 'matches in daylight'
      : verdict === 'close'
        ? 'close in daylight'
        : `differs in daylight${day.words.length ? ` (${day.words.join(', ')})` : ''}`;
  const worst = rows
    .filter((r) => r.illuminant !== REFERENCE_ILLUMINANT)
    .reduce((w, r) => (r.deltaE00 > w.deltaE00 ? r : w));
  if (verdictFor(worst.deltaE00, bands) === 'match') return `${first}, and holds under every light checked`;
  if (worst.deltaE00 <= day.deltaE00) return `${first}, and no worse under the other lights checked`;
  if (verdict !== 'match' && verdict !== 'close') return `${first}, most of all ${UNDER_WORDS[worst.illuminant]}`;
  const how = worst.words.length ? worst.words.join(' and ') : 'different';
  return `${first}, ${how} ${UNDER_WORDS[worst.illuminant]}`;
}
