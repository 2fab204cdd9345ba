import { labToLch, type Lab } from './convert.ts';
import { deltaE00 } from './difference.ts';

/** Hue families by CIELAB hue angle h_ab (degrees, upper bound exclusive). Common practice, rounded. */
const HUES: Array<[upTo: number, name: string]> = [
  [45, 'red'], [70, 'orange'], [105, 'yellow'], [200, 'green'], [290, 'blue'], [350, 'purple'], [361, 'red'],
];

/** Below this chroma C*ab a colour is named as a grey. */
const NEUTRAL_CHROMA = 6;

/** A plain-words shade name from lightness, chroma and hue angle, e.g. "pale greyish red". */
export function shadeName(lab: Lab): string {
  const { L, C, h } = labToLch(lab);
  if (C < NEUTRAL_CHROMA) {
    if (L >= 90) return 'white';
    if (L >= 70) return 'pale grey';
    if (L >= 40) return 'grey';
    if (L >= 20) return 'dark grey';
    return 'black';
  }
  const hue = HUES.find(([upTo]) => h < upTo)![1];
  const light = L >= 70 ? 'pale' : L < 40 ? 'dark' : null;
  const chroma = C < 20 ? 'greyish' : C >= 50 ? 'vivid' : null;
  return [light, chroma, hue].filter(Boolean).join(' ');
}

/**
 * Trade shade names of dyed and printed cloth with typical CIELAB D65 values.
 * The values are our own approximations of how each shade usually reads on cotton or
 * wool (common practice, not a published standard); they only place a name.
 */
export const TRADE_SHADES: ReadonlyArray<{ name: string; lab: Lab }> = [
  { name: 'Turkey red', lab: { L: 40, a: 57, b: 36 } },
  { name: 'madder red', lab: { L: 44, a: 48, b: 26 } },
  { name: 'madder pink', lab: { L: 68, a: 28, b: 10 } },
  { name: 'madder purple', lab: { L: 34, a: 16, b: -8 } },
  { name: 'madder brown', lab: { L: 36, a: 22, b: 20 } },
  { name: 'puce', lab: { L: 40, a: 20, b: 6 } },
  { name: 'lilac', lab: { L: 66, a: 15, b: -14 } },
  { name: 'chocolate', lab: { L: 28, a: 12, b: 14 } },
  { name: 'drab', lab: { L: 58, a: 3, b: 16 } },
  { name: 'olive', lab: { L: 45, a: -6, b: 30 } },
  { name: 'buff', lab: { L: 78, a: 6, b: 24 } },
  { name: 'nankeen', lab: { L: 72, a: 11, b: 34 } },
  { name: 'weld yellow', lab: { L: 82, a: -4, b: 62 } },
  { name: 'weld green', lab: { L: 52, a: -24, b: 26 } },
  { name: 'bottle green', lab: { L: 30, a: -20, b: 8 } },
  { name: 'indigo blue', lab: { L: 30, a: 2, b: -30 } },
  { name: 'pale indigo', lab: { L: 62, a: -6, b: -22 } },
  { name: 'iron black', lab: { L: 20, a: 1, b: 2 } },
  { name: 'unbleached', lab: { L: 86, a: 2, b: 12 } },
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
