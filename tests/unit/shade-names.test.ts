import { converter } from 'culori';
import { describe, expect, it } from 'vitest';
import { hexToLab, shadeName, TRADE_SHADES, tradeShade } from '../../shared/colour/index.ts';

// Plain shade names and trade shade names as a dyer or conservator would say them. The expected
// names are common practice (the ISCC–NBS hue categories — Kelly & Judd, NBS SP 440, 1976 — with
// the boundaries where practitioners put them), not values from a published table. Familiar colours
// are given by their sRGB hex; several are the sRGB values of CSS Color 4 named colours (W3C), used
// only as well-known colours: where CSS's own name misleads (CSS "chocolate" is an orange, CSS
// "brown" a dark red) the expected name is the one a dyer would use.

const PLAIN: Array<[hex: string, what: string, name: string]> = [
  // Browns: dark, dull reds and dark oranges or yellows.
  ['#6a3b35', 'madder brown (iron and alum on cotton)', 'brown'],
  ['#5c3317', 'dark chocolate', 'dark brown'],
  ['#7b3f00', 'chocolate', 'brown'],
  ['#a0522d', 'sienna (CSS)', 'brown'],
  ['#8b4513', 'saddle brown (CSS)', 'brown'],
  ['#704214', 'sepia', 'brown'],
  ['#6f4e37', 'coffee', 'brown'],
  ['#635147', 'umber', 'greyish brown'],
  ['#b7410e', 'rust', 'brown'],
  // Reds stay red when deep and vivid.
  ['#9e2a2b', 'madder red', 'dark vivid red'],
  ['#b0302a', 'Turkey red', 'vivid red'],
  ['#800000', 'maroon (CSS)', 'dark vivid red'],
  ['#a52a2a', 'CSS "brown" (a dark red)', 'dark vivid red'],
  ['#800020', 'burgundy', 'dark vivid red'],
  ['#722f37', 'wine', 'dark red'],
  ['#ff2400', 'scarlet', 'vivid red'],
  ['#dc143c', 'crimson (CSS)', 'vivid red'],
  // Pinks: light reds.
  ['#d98c95', 'madder pink', 'pink'],
  ['#ffc0cb', 'pink (CSS)', 'pink'],
  // Oranges and yellows.
  ['#d2691e', 'CSS "chocolate" (an orange)', 'vivid orange'],
  ['#cc7722', 'ochre', 'vivid orange'],
  ['#ff8c00', 'dark orange (CSS)', 'vivid orange'],
  ['#e1ad01', 'mustard', 'pale vivid yellow'],
  ['#fff44f', 'lemon', 'pale vivid yellow'],
  ['#fffdd0', 'cream', 'pale yellow'],
  ['#f5f5dc', 'beige (CSS)', 'pale greyish yellow'],
  ['#e6d9bf', 'unbleached cotton ground', 'pale greyish yellow'],
  // Olives: dark yellows.
  ['#808000', 'olive (CSS)', 'olive'],
  ['#556b2f', 'dark olive green (CSS)', 'olive'],
  // Greens.
  ['#6b8a3a', 'weld over indigo', 'green'],
  ['#6b8e23', 'olive drab (CSS), a yellow-green', 'vivid green'],
  ['#006a4e', 'bottle green', 'dark green'],
  ['#228b22', 'forest green (CSS)', 'vivid green'],
  // Blues, navy included: CIELAB puts the sRGB blue primary and navy near h_ab 306°.
  ['#000080', 'navy (CSS)', 'dark vivid blue'],
  ['#1f2a44', 'indigo-dyed navy', 'dark greyish blue'],
  ['#0000ff', 'the sRGB blue primary', 'dark vivid blue'],
  ['#2e3f66', 'indigo', 'dark blue'],
  ['#003153', 'Prussian blue', 'dark blue'],
  ['#4682b4', 'steel blue (CSS)', 'blue'],
  ['#87ceeb', 'sky blue (CSS)', 'pale blue'],
  ['#708090', 'slate grey (CSS), a greyish blue', 'greyish blue'],
  // Purples begin past the blue primary.
  ['#7f00ff', 'violet', 'vivid purple'],
  ['#800080', 'purple (CSS)', 'dark vivid purple'],
  ['#5b3a55', 'madder purple', 'dark purple'],
  ['#c8a2c8', 'lilac', 'pale purple'],
  ['#8e4585', 'plum', 'purple'],
  // Neutrals and tinted neutrals.
  ['#8f8a80', 'drab', 'yellowish grey'],
  ['#2a2630', 'pencil line', 'bluish black'],
  ['#2b2a28', 'iron black', 'black'],
  ['#808080', 'mid grey', 'grey'],
  ['#f4f1ea', 'bleached cotton', 'white'],
];

describe('plain shade names', () => {
  it.each(PLAIN)('%s (%s) is called %s', (hex, _what, name) => {
    expect(shadeName(hexToLab(hex))).toBe(name);
  });

  it('the test colours lie where their names say on the hue circle (culori, an independent library)', () => {
    // h_ab from culori's lch65 for a few decisive cases: navy below the blue/purple boundary (310°),
    // violet above it, scarlet below the red/orange boundary (45°), cream in the yellow range (75–115°).
    const lch = converter('lch65');
    expect(lch('#000080')!.h!).toBeLessThan(310);
    expect(lch('#7f00ff')!.h!).toBeGreaterThan(310);
    expect(lch('#ff2400')!.h!).toBeLessThan(45);
    expect(lch('#fffdd0')!.h!).toBeGreaterThan(75);
    expect(lch('#fffdd0')!.h!).toBeLessThan(115);
  });
});

describe('trade shade names', () => {
  it('every trade shade names its source or is marked common practice', () => {
    for (const s of TRADE_SHADES) expect(s.source, s.name).toMatch(/common practice|source:/i);
  });

  it('each trade shade is found again from its own values', () => {
    for (const s of TRADE_SHADES) expect(tradeShade(s.lab)).toEqual({ name: s.name, deltaE00: 0 });
  });

  it('trade shades get the plain name a dyer would give them', () => {
    const plain = Object.fromEntries(TRADE_SHADES.map((s) => [s.name, shadeName(s.lab)]));
    expect(plain).toMatchObject({
      'madder brown': 'brown',
      chocolate: 'dark brown',
      olive: 'olive',
      navy: 'dark greyish blue',
      'indigo blue': 'dark blue',
      'madder red': 'vivid red',
      'Turkey red': 'vivid red',
      'madder pink': 'pink',
      'madder purple': 'dark greyish purple',
      lilac: 'purple',
      'weld yellow': 'pale vivid yellow',
      'weld green': 'green',
      'bottle green': 'dark green',
      'iron black': 'black',
    });
  });

  it('names the issue cases: madder brown, chocolate, navy, olive', () => {
    expect(tradeShade(hexToLab('#6a3b35'))?.name).toBe('madder brown');
    expect(tradeShade(hexToLab('#5c3317'))?.name).toBe('chocolate');
    expect(tradeShade(hexToLab('#1f2a44'))?.name).toBe('navy');
    expect(tradeShade({ L: 46, a: -5, b: 31 })?.name).toBe('olive');
    expect(tradeShade(hexToLab('#9e2a2b'))?.name).toBe('Turkey red');
  });
});
