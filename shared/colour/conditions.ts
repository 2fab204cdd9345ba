// Viewing conditions of a colour figure: the CIE illuminant and standard observer the
// L*a*b* values were computed for, and whether they come from an instrument or an image.
// One set of words for every screen, export and printed card.
/** The CIE illuminants and standard observers a reading may name (defined here, not in a schema, so schemas can import these words without a cycle). */
export const ILLUMINANTS = ['D65', 'D50', 'A', 'F2', 'F11', 'LED-B3'] as const;
export const OBSERVERS = ['2', '10'] as const;

export type Illuminant = (typeof ILLUMINANTS)[number];
export type Observer = (typeof OBSERVERS)[number];
export type ColourSource = 'instrument' | 'image-estimate';
export type ViewingConditions = { illuminant: Illuminant; observer: Observer };

/**
 * Photo palettes are computed from the photo's RGB colour space (sRGB, whose white is D65 and
 * whose primaries are defined on the CIE 1931 2° observer), so every image estimate is D65/2°.
 */
export const IMAGE_ESTIMATE_CONDITIONS = { illuminant: 'D65', observer: '2' } as const satisfies ViewingConditions;

export const SOURCE_WORDS: Record<ColourSource, string> = {
  instrument: 'instrument reading',
  'image-estimate': 'image estimate',
};

/** "D65/10°". */
export const conditionsText = (c: { illuminant: string; observer: string }) => `${c.illuminant}/${c.observer}°`;

/** "image estimate · D65/2°", "instrument reading · A/10°". */
export const viewingLabel = (c: { illuminant: string; observer: string; source: ColourSource }) =>
  `${SOURCE_WORDS[c.source]} · ${conditionsText(c)}`;

/** Same viewing conditions: only such readings may be averaged together. */
export const sameConditions = (
  x: { illuminant: string; observer: string },
  y: { illuminant: string; observer: string },
) => x.illuminant === y.illuminant && x.observer === y.observer;

/** A signed difference figure, "+1.20" or "−0.35" (a true minus sign), so its direction reads at a glance. */
export const signed = (x: number, decimals = 2) => {
  const s = Math.abs(x).toFixed(decimals);
  return Number(s) === 0 ? s : `${x < 0 ? '−' : '+'}${s}`;
};
