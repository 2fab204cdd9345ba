import { describe, expect, it } from 'vitest';
import { reshare } from '../../server/services/palette-shares.ts';

// Hand-worked example: whole-area fractions red 0.3, pink 0.3, background grey 0.4.
// Counted shares: red 0.3/0.6 = 0.5, pink 0.5; grey keeps 0.4 of the whole.
const palette = [
  { id: 1, share: 0.5, background: false },
  { id: 2, share: 0.5, background: false },
  { id: 3, share: 0.4, background: true },
];

describe('background toggle re-normalises shares', () => {
  it('counting the background colour gives the whole-area fractions', () => {
    const next = reshare(palette, 3, false);
    expect(next.map((c) => c.share)).toEqual([0.3, 0.3, 0.4].map((x) => expect.closeTo(x, 12)));
    expect(next.filter((c) => !c.background).reduce((s, c) => s + c.share, 0)).toBeCloseTo(1, 12);
  });

  it('marking a counted colour as background removes it from the sum, and toggling back restores the start', () => {
    const next = reshare(palette, 1, true);
    // red is now background with 0.3 of the whole; pink is the only counted colour.
    expect(next.map((c) => [c.share, c.background])).toEqual([
      [expect.closeTo(0.3, 12), true],
      [expect.closeTo(1, 12), false],
      [expect.closeTo(0.4, 12), true],
    ]);
    const back = reshare(next, 1, false);
    expect(back.map((c) => c.share)).toEqual(palette.map((c) => expect.closeTo(c.share, 12)));
  });
});
