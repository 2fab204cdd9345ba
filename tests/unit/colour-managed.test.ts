import Color from 'colorjs.io';
import { converter } from 'culori';
import sharp from 'sharp';
import { describe, expect, it } from 'vitest';
import { deltaE00, hexToLab, type Lab } from '../../shared/colour/index.ts';
import { colourSource, workingImage } from '../../server/media/decode.ts';
import { parseIcc, toLinearSrgbMatrix } from '../../server/media/icc.ts';
import { extractPalette, type ExtractedColour } from '../../server/media/palette.ts';
import { paintCloth } from '../../server/seed/cloth-image.ts';
import {
  convertPixels,
  encodeWithProfile,
  profileBytes,
  PROFILE_SOURCES,
  type Format,
  type SpaceId,
} from '../support/icc-images.ts';

// Colour-managed photos (issue point 3): a printed cloth of known sRGB colours is re-encoded in
// Display P3, an Adobe RGB (1998)-compatible space and ROMM RGB (ProPhoto) by colorjs.io, at 8 and
// 16 bits, saved as JPEG, PNG and TIFF with the profile embedded, and read back by the app. The
// palette must find every true colour within ΔE00 1.5 (the app's accuracy target) and agree with
// the palette of the sRGB original within ΔE00 1.5.

const toLab65 = converter('lab65');
const TRUTH = ['#e6d9bf', '#9e2a2b', '#2e3f66', '#6b8a3a', '#d98c95', '#8f8a80'];
const cloth = paintCloth({
  width: 900,
  height: 600,
  ground: TRUTH[0],
  noise: 3,
  weave: 0.04,
  seed: 21,
  shapes: TRUTH.slice(1).map((colour, i) => ({
    kind: 'rect' as const,
    x: 40 + (i % 3) * 290,
    y: 60 + Math.floor(i / 3) * 280,
    w: 230,
    h: 200,
    colour,
  })),
});

const nearest = (lab: Lab, palette: ExtractedColour[]) => Math.min(...palette.map((p) => deltaE00(lab, p.lab)));

let original: Promise<ExtractedColour[]> | null = null;
const originalPalette = () =>
  (original ??= (async () =>
    extractPalette(
      await workingImage(
        await sharp(cloth.data, { raw: { width: 900, height: 600, channels: 3 } })
          .png()
          .toBuffer(),
      ),
    ))());

describe('the truth colours', () => {
  it('colorjs.io and culori agree on the CIELAB D65 of each true colour (within 0.05 ΔE00)', () => {
    for (const hex of TRUTH) {
      const c = toLab65(hex)!;
      expect(deltaE00(hexToLab(hex), { L: c.l, a: c.a, b: c.b }), hex).toBeLessThan(0.05);
    }
  });
});

describe('ICC profiles read by the app', () => {
  // Oracle: colorjs.io's own linear → linear conversions between these spaces (CSS Color 4 definitions).
  const expectMatrix = async (space: SpaceId, tolerance: number) => {
    const m = toLinearSrgbMatrix(parseIcc(await profileBytes(space)));
    for (const unit of [
      [1, 0, 0],
      [0, 1, 0],
      [0, 0, 1],
      [0.2, 0.5, 0.7],
    ]) {
      const want = new Color(`${space === 'a98rgb' ? 'a98rgb' : space}-linear`, unit as [number, number, number]).to(
        'srgb-linear',
      ).coords as number[];
      const got = [0, 1, 2].map((i) => m[i][0] * unit[0] + m[i][1] * unit[1] + m[i][2] * unit[2]);
      for (let i = 0; i < 3; i++)
        expect(Math.abs(got[i] - want[i]), `${space} ${unit} channel ${i}`).toBeLessThan(tolerance);
    }
  };
  // The profiles store colorants as s15Fixed16 numbers adapted to D50 and back, so a few 1e-3 is their resolution.
  it.each([
    ['srgb', 2e-3],
    ['p3', 3e-3],
    ['a98rgb', 2e-3],
    ['prophoto', 3e-3],
  ] as const)('%s: matrix to linear sRGB as colorjs.io defines it', async (space, tol) => {
    await expectMatrix(space, tol);
  });

  it('reads descriptions and tone curves (Adobe RGB (1998) gamma 563/256)', async () => {
    const a98 = parseIcc(await profileBytes('a98rgb'));
    expect(a98.description).toBe('Compatible with Adobe RGB (1998)');
    // Adobe RGB (1998) Color Image Encoding 1.0 (2005), 4.3.1.2: gamma 2 51/256 = 563/256.
    expect(a98.curves![0](0.5)).toBeCloseTo(0.5 ** (563 / 256), 6);
    const romm = parseIcc(await profileBytes('prophoto'));
    // ISO 22028-2: linear below 16/512 with slope 1/16, else gamma 1.8.
    expect(romm.curves![1](0.02)).toBeCloseTo(0.02 / 16, 9);
    expect(romm.curves![1](0.6)).toBeCloseTo(0.6 ** 1.8, 5); // 1.8 stored as s15Fixed16
    expect(parseIcc(await profileBytes('p3')).description).toMatch(/P3/);
  });
});

describe('palettes of colour-managed photos', () => {
  const cases: Array<[SpaceId, 8 | 16]> = [];
  for (const space of ['srgb', 'p3', 'a98rgb', 'prophoto'] as SpaceId[])
    for (const bits of [8, 16] as const) cases.push([space, bits]);

  it.each(cases)(
    '%s, %i bits, as JPEG (8-bit only), PNG and TIFF: every true colour within ΔE00 1.5',
    async (space, bits) => {
      const px = convertPixels(cloth.data, space, bits);
      const icc = await profileBytes(space);
      const formats: Format[] = bits === 8 ? ['jpeg', 'png', 'tiff'] : ['png', 'tiff'];
      const reference = await originalPalette();
      for (const format of formats) {
        const file = await encodeWithProfile(px, cloth.width, cloth.height, icc, format);
        const meta = await sharp(file).metadata();
        expect([meta.format, meta.depth, meta.icc?.length], `${format} file as written`).toEqual([
          format,
          bits === 8 ? 'uchar' : 'ushort',
          icc.length,
        ]);
        const source = colourSource(meta);
        expect(source.facts).toMatchObject({
          profile: parseIcc(icc).description,
          assumedSrgb: false,
          bitDepth: bits,
          colourSpace: 'RGB',
          conversion: 'icc-matrix',
        });
        const palette = extractPalette(await workingImage(file));
        for (const hex of TRUTH) {
          expect(
            nearest(hexToLab(hex), palette),
            `${PROFILE_SOURCES[space]}, ${bits}-bit ${format}: ΔE00 of ${hex} to the truth`,
          ).toBeLessThanOrEqual(1.5);
        }
        for (const c of reference)
          expect(
            nearest(c.lab, palette),
            `${space} ${bits}-bit ${format}: ΔE00 to the sRGB original's palette`,
          ).toBeLessThanOrEqual(1.5);
      }
    },
  );

  it('a 16-bit photo without a profile is taken as sRGB and says so', async () => {
    const px = new Uint16Array(cloth.data.length);
    for (let i = 0; i < px.length; i++) px[i] = cloth.data[i] * 257;
    const file = await encodeWithProfile(px, cloth.width, cloth.height, null, 'tiff');
    const meta = await sharp(file).metadata();
    expect(colourSource(meta).facts).toEqual({
      profile: null,
      assumedSrgb: true,
      bitDepth: 16,
      colourSpace: 'RGB',
      cmykConverted: false,
      conversion: 'none',
    });
    const palette = extractPalette(await workingImage(file));
    for (const hex of TRUTH) expect(nearest(hexToLab(hex), palette), hex).toBeLessThanOrEqual(1.5);
  });

  it('keeps a colour outside sRGB (a saturated green in Adobe RGB and ROMM RGB, 16 bits) instead of clipping it', async () => {
    for (const space of ['a98rgb', 'prophoto'] as const) {
      // A turquoise-green beyond sRGB's green–blue edge: colorjs.io says it is outside sRGB.
      const coords: [number, number, number] = space === 'a98rgb' ? [0.05, 0.6, 0.45] : [0.2, 0.55, 0.4];
      const q = coords.map((v) => Math.round(v * 65535)) as [number, number, number];
      const colour = new Color(space, q.map((v) => v / 65535) as [number, number, number]);
      expect(colour.inGamut('srgb')).toBe(false);
      const [L, a, b] = colour.to('lab-d65').coords as number[];
      // culori as a second opinion on the truth (its a98 / prophoto definitions).
      const c = toLab65({
        mode: space === 'a98rgb' ? 'a98' : 'prophoto',
        r: q[0] / 65535,
        g: q[1] / 65535,
        b: q[2] / 65535,
      })!;
      expect(deltaE00({ L, a, b }, { L: c.l, a: c.a, b: c.b })).toBeLessThan(0.05);
      const px = new Uint16Array(300 * 200 * 3);
      for (let i = 0; i < px.length; i += 3) px.set(q, i);
      const file = await encodeWithProfile(px, 300, 200, await profileBytes(space), 'tiff');
      const palette = extractPalette(await workingImage(file), { detectBackground: false });
      expect(palette).toHaveLength(1);
      expect(deltaE00(palette[0].lab, { L, a, b }), `${space}: ΔE00 of the out-of-sRGB colour`).toBeLessThanOrEqual(
        0.5,
      );
      // What clipping to sRGB would have cost, to show the test can fail.
      const clipped = colour.clone().to('srgb').toGamut({ method: 'clip' }).to('lab-d65').coords as number[];
      expect(deltaE00({ L: clipped[0], a: clipped[1], b: clipped[2] }, { L, a, b })).toBeGreaterThan(2);
    }
  });

  it('refuses CMYK with a message in plain words', async () => {
    const cmyk = await sharp(cloth.data, { raw: { width: 900, height: 600, channels: 3 } })
      .toColourspace('cmyk')
      .withIccProfile('cmyk')
      .jpeg()
      .toBuffer();
    const meta = await sharp(cmyk).metadata();
    expect(meta.space).toBe('cmyk');
    expect(() => colourSource(meta)).toThrow(/CMYK.*Export it as RGB/);
  });
});
