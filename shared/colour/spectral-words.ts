// The illuminants, observers and steps a spectrum is computed for, and their words (no tables
// here, so the client's forms and labels can import them without the CIE data).
export const SPECTRAL_ILLUMINANTS = ['D65', 'D50', 'A', 'F2', 'F11', 'LED-B3'] as const;
export type SpectralIlluminant = (typeof SPECTRAL_ILLUMINANTS)[number];
export const SPECTRAL_OBSERVERS = ['2', '10'] as const;
export type SpectralObserver = (typeof SPECTRAL_OBSERVERS)[number];
export const SPECTRAL_INTERVALS = [1, 5, 10, 20] as const;

/** Words for each illuminant, for tables and sentences. */
export const ILLUMINANT_WORDS: Record<SpectralIlluminant, string> = {
  D65: 'daylight (D65)',
  D50: 'print-viewing daylight (D50)',
  A: 'warm tungsten lamp (A)',
  F2: 'cool white fluorescent (F2)',
  F11: 'three-band fluorescent (F11)',
  'LED-B3': 'neutral white LED, about 4100 K (LED-B3)',
};
