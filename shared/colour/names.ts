import { labToLch, type Lab } from './convert.ts';
import { deltaE00 } from './difference.ts';
import { hueFamily, type HueFamily } from './hues.ts';

/*
 * Plain-words shade names. The categories follow the hue names of the ISCC–NBS method of
 * designating colours (Kelly & Judd, NBS Special Publication 440, 1976): pink, red, orange,
 * brown, yellow, olive, green, blue, purple, with white, grey and black for neutrals, and
 * pale/dark, greyish/vivid as modifiers. That method draws its boundaries in Munsell
 * notation; the CIELAB (D65) boundaries below are our own approximation of where dyers and
 * conservators put them (common practice, not a published table), tuned on the cases in
 * tests/unit/shade-names.test.ts.
 */

/** Below this chroma C*ab a colour is named as a grey; below TINTED_CHROMA as a tinted grey (common practice). */
export const NEUTRAL_CHROMA = 5;
export const TINTED_CHROMA = 10;

/** The ISCC–NBS adjectives for a tinted neutral ("yellowish grey", "bluish black"). */
const TINT: Record<HueFamily | 'brown' | 'pink', string> = {
  red: 'reddish',
  orange: 'brownish',
  brown: 'brownish',
  yellow: 'yellowish',
  green: 'greenish',
  blue: 'bluish',
  purple: 'purplish',
  pink: 'pinkish',
};

function neutral(L: number) {
  if (L >= 90) return 'white';
  if (L >= 70) return 'pale grey';
  if (L >= 40) return 'grey';
  if (L >= 25) return 'dark grey';
  return 'black';
}

/**
 * Dark reds, oranges and yellows read as browns: an orange or yellowish hue below L* 50 at any
 * chroma (chocolate, sienna, umber), a red hue only when it is also dull (madder brown); a
 * deep, vivid red such as Turkey red stays red. Common practice.
 */
function isBrown(L: number, C: number, h: number) {
  if (L >= 50) return false;
  if (h >= 45 && h < 85) return true;
  return h >= 20 && h < 45 && C < 28;
}

/** Dark yellows read as olive (below L* 55 at h_ab 85–115°, below 45 on to 125°). Common practice. */
const isOlive = (L: number, h: number) => (L < 55 && h >= 85 && h < 115) || (L < 45 && h >= 115 && h < 125);

/** Light reds and purplish reds read as pinks (L* 62 and above). Common practice. */
const isPink = (L: number, h: number) => L >= 62 && (h < 45 || h >= 330);

/** A plain-words shade name from lightness, chroma and hue angle, e.g. "pale greyish red", "dark brown". */
export function shadeName(lab: Lab): string {
  const { L, C, h } = labToLch(lab);
  if (C < NEUTRAL_CHROMA) return neutral(L);
  if (C < TINTED_CHROMA) {
    const tint = TINT[isBrown(L, C, h) ? 'brown' : isPink(L, h) ? 'pink' : hueFamily(h)];
    const words = neutral(L).split(' ');
    return [...words.slice(0, -1), tint, words.at(-1)].join(' ');
  }
  if (isBrown(L, C, h)) return [L < 30 ? 'dark' : null, C < 15 ? 'greyish' : null, 'brown'].filter(Boolean).join(' ');
  if (isOlive(L, h)) return [L < 35 ? 'dark' : null, C < 15 ? 'greyish' : null, 'olive'].filter(Boolean).join(' ');
  if (isPink(L, h))
    return [L >= 85 ? 'pale' : null, C < 12 ? 'greyish' : C >= 50 ? 'vivid' : null, 'pink'].filter(Boolean).join(' ');
  const hue = hueFamily(h);
  const light = L >= 70 ? 'pale' : L < 40 ? 'dark' : null;
  const chroma = C < 20 ? 'greyish' : C >= 50 ? 'vivid' : null;
  return [light, chroma, hue].filter(Boolean).join(' ');
}

export type TradeShade = { name: string; lab: Lab; source: string };

const CP =
  'common practice: a typical reading of this shade on cotton or wool, our approximation (not a published value)';

/**
 * Trade shade names of dyed and printed cloth with typical CIELAB D65 values. No published
 * table gives these names measured values, so each is marked as what it is; they only place
 * a name (within TRADE_RADIUS), never a judgement of a match.
 */
export const TRADE_SHADES: ReadonlyArray<TradeShade> = [
  { name: 'Turkey red', lab: { L: 40, a: 57, b: 36 }, source: CP },
  { name: 'madder red', lab: { L: 44, a: 48, b: 26 }, source: CP },
  { name: 'madder pink', lab: { L: 68, a: 28, b: 10 }, source: CP },
  { name: 'madder purple', lab: { L: 34, a: 16, b: -8 }, source: CP },
  // sRGB #6a3b35: an iron-and-alum madder brown as it reads on cotton.
  { name: 'madder brown', lab: { L: 30.5, a: 20.0, b: 12.7 }, source: `${CP}; sRGB #6a3b35` },
  { name: 'puce', lab: { L: 40, a: 20, b: 6 }, source: CP },
  { name: 'lilac', lab: { L: 66, a: 15, b: -14 }, source: CP },
  { name: 'chocolate', lab: { L: 28, a: 12, b: 14 }, source: CP },
  { name: 'drab', lab: { L: 58, a: 3, b: 16 }, source: CP },
  { name: 'olive', lab: { L: 45, a: -6, b: 30 }, source: CP },
  { name: 'buff', lab: { L: 78, a: 6, b: 24 }, source: CP },
  { name: 'nankeen', lab: { L: 72, a: 11, b: 34 }, source: CP },
  { name: 'weld yellow', lab: { L: 82, a: -4, b: 62 }, source: CP },
  { name: 'weld green', lab: { L: 52, a: -24, b: 26 }, source: CP },
  { name: 'bottle green', lab: { L: 30, a: -20, b: 8 }, source: CP },
  { name: 'indigo blue', lab: { L: 30, a: 2, b: -30 }, source: CP },
  // A deep indigo dyed many times over; sRGB ≈ #1f2a44.
  { name: 'navy', lab: { L: 17, a: 4, b: -18 }, source: `${CP}; sRGB ≈ #1f2a44` },
  { name: 'pale indigo', lab: { L: 62, a: -6, b: -22 }, source: CP },
  { name: 'iron black', lab: { L: 20, a: 1, b: 2 }, source: CP },
  { name: 'unbleached', lab: { L: 86, a: 2, b: 12 }, source: CP },
];

/** Default search radius for a trade name, ΔE00 (common practice: beyond this the name misleads). */
export const TRADE_RADIUS = 8;

/** The nearest trade shade within `radius` (ΔE00), or null. */
export function tradeShade(lab: Lab, radius = TRADE_RADIUS): { name: string; deltaE00: number } | null {
  let best: { name: string; deltaE00: number } | null = null;
  for (const s of TRADE_SHADES) {
    const d = deltaE00(s.lab, lab);
    if (d <= radius && (!best || d < best.deltaE00)) best = { name: s.name, deltaE00: d };
  }
  return best;
}
