import sharp from 'sharp';
import { describe, expect, it } from 'vitest';
import { deltaE00, hexToLab, srgbToLab } from '../../shared/colour/index.ts';
import { correctImage, patchWhite } from '../../server/media/correction.ts';
import { workingImage } from '../../server/media/decode.ts';
import { decode, encode8, linearToLab, srgbToLabFast } from '../../server/media/fast-lab.ts';
import { extractPalette, type ExtractedColour } from '../../server/media/palette.ts';
import { paintCloth, type ClothSpec, type Shape } from '../../server/seed/cloth-image.ts';

// Accuracy targets of the palette (issue 4): every true colour within ΔE00 ≤ 1.5 and its share
// within 3 percentage points, thin lines (1/300 of the width) included; with a tinted white
// balance and a marked grey patch, the corrected palette within ΔE00 ≤ 2. The photos are
// generated, so the true colours (their sRGB values, converted by colorjs.io) and areas are known.

const W = 3000,
  H = 2000,
  LINE = Math.round(W / 300);
const GROUND = '#e6d9bf',
  RED = '#9e2a2b',
  PINK = '#d98c95',
  PURPLE = '#5b3a55',
  INDIGO = '#2e3f66',
  GREEN = '#6b8a3a',
  PENCIL = '#2a2630';

/** A repeat of outlined motifs in four colours on a cloth ground, with a green band and gaps of ground 1/300 wide. */
function printedCloth(extra: Partial<ClothSpec> = {}): ClothSpec {
  const shapes: Shape[] = [];
  let k = 0;
  for (let ty = 0; ty < 4; ty++) {
    for (let tx = 0; tx < 6; tx++) {
      const cx = ((tx + 0.5) * W) / 6,
        cy = ((ty + 0.5) * H) / 4;
      shapes.push({
        kind: 'ellipse',
        cx,
        cy,
        rx: W / 16,
        ry: H / 10,
        colour: [RED, PINK, PURPLE, INDIGO][k++ % 4],
        outline: { colour: PENCIL, width: LINE },
      });
    }
  }
  // Two green bars with a strip of ground one line wide between them.
  shapes.push(
    { kind: 'rect', x: 0, y: H / 2 - 60, w: W, h: 55, colour: GREEN },
    { kind: 'rect', x: 0, y: H / 2 - 5 + LINE, w: W, h: 55, colour: GREEN },
  );
  return {
    width: W,
    height: H,
    ground: GROUND,
    shapes,
    noise: 4,
    weave: 0.05,
    weavePeriod: 6,
    gradient: 0.03,
    seed: 11,
    ...extra,
  };
}

async function asJpeg(img: { data: Uint8Array; width: number; height: number }) {
  return sharp(img.data, { raw: { width: img.width, height: img.height, channels: 3 } })
    .jpeg({ quality: 92 })
    .toBuffer();
}

// Painting 6 megapixels takes a while; the plain printed cloth is shared by several tests.
let shared: Promise<{ cloth: ReturnType<typeof paintCloth>; jpeg: Buffer }> | null = null;
function sharedCloth() {
  shared ??= (async () => {
    const cloth = paintCloth(printedCloth());
    return { cloth, jpeg: await asJpeg(cloth) };
  })();
  return shared;
}

function match(truth: Array<{ hex: string; share: number }>, palette: ExtractedColour[]) {
  return truth.map((t) => {
    const lab = hexToLab(t.hex);
    const best = palette.reduce((m, p) => (deltaE00(lab, p.lab) < deltaE00(lab, m.lab) ? p : m));
    return { hex: t.hex, deltaE: deltaE00(lab, best.lab), shareError: Math.abs(best.share - t.share), found: best };
  });
}

describe('palette extraction accuracy', () => {
  it('finds every true colour, thin lines included, from a JPEG photo', async () => {
    const { cloth, jpeg } = await sharedCloth();
    const palette = extractPalette(await workingImage(jpeg));
    expect(palette.length).toBeLessThanOrEqual(8);
    const m = match(cloth.truth, palette);
    for (const r of m) {
      expect(r.deltaE, `ΔE00 of ${r.hex}`).toBeLessThanOrEqual(1.5);
      expect(r.shareError, `share of ${r.hex}`).toBeLessThanOrEqual(0.03);
    }
    // Each true colour is its own palette entry.
    expect(new Set(m.map((r) => r.found.hex)).size).toBe(cloth.truth.length);
    expect(palette.reduce((s, c) => s + c.share, 0)).toBeCloseTo(1, 9);
    expect(palette.map((c) => c.share)).toEqual(palette.map((c) => c.share).sort((a, b) => b - a));
    expect(palette.every((c) => c.name && c.spread > 0 && /^#[0-9a-f]{6}$/.test(c.hex))).toBe(true);
  });

  it('at a 256 px working size the thin pencil line is lost (why the working size is ~1024 px)', async () => {
    const { cloth, jpeg } = await sharedCloth();
    const palette = extractPalette(await workingImage(jpeg, undefined, 256));
    const pencil = match(cloth.truth, palette).find((r) => r.hex === PENCIL)!;
    expect(pencil.deltaE).toBeGreaterThan(1.5);
  });

  it('is deterministic', async () => {
    const img = await workingImage((await sharedCloth()).jpeg);
    expect(extractPalette(img)).toEqual(extractPalette(img));
  });

  it('marks a neutral mount around the cloth as background and leaves it out of the shares', async () => {
    const shapes: Shape[] = [
      { kind: 'rect', x: 300, y: 300, w: 2400, h: 1400, colour: GROUND },
      { kind: 'rect', x: 700, y: 600, w: 800, h: 600, colour: RED },
      { kind: 'rect', x: 1700, y: 600, w: 600, h: 600, colour: INDIGO },
    ];
    const cloth = paintCloth({ width: W, height: H, ground: '#7f7f7f', shapes, noise: 4, weave: 0.05, seed: 3 });
    const palette = extractPalette(await workingImage(await asJpeg(cloth)));
    const bg = palette.filter((c) => c.background);
    expect(bg).toHaveLength(1);
    expect(deltaE00(bg[0].lab, hexToLab('#7f7f7f'))).toBeLessThan(1.5);
    const fg = palette.filter((c) => !c.background);
    expect(fg.reduce((s, c) => s + c.share, 0)).toBeCloseTo(1, 9);
    const cloth3 = 2400 * 1400;
    const red = fg.find((c) => deltaE00(c.lab, hexToLab(RED)) < 1.5)!;
    expect(Math.abs(red.share - (800 * 600) / cloth3)).toBeLessThan(0.03);
    expect(Math.abs(bg[0].areaShare - (1 - cloth3 / (W * H)))).toBeLessThan(0.03);
  });

  describe('a ground that fills the frame is cloth (close-ups)', () => {
    // Close-ups of printed cloth: small red and blue motifs scattered over a drab, a grey and an
    // iron-black ground that reaches every edge. Nothing is background; every share within
    // 3 percentage points of the painted area (the palette's accuracy target).
    const closeUp = (ground: string, seed: number): ClothSpec => {
      const shapes: Shape[] = [];
      for (let ty = 0; ty < 5; ty++)
        for (let tx = 0; tx < 8; tx++) {
          const cx = ((tx + 0.5) * W) / 8 + (ty % 2 ? 60 : -60),
            cy = ((ty + 0.5) * H) / 5;
          shapes.push({ kind: 'ellipse', cx, cy, rx: 70, ry: 55, colour: (tx + ty) % 2 ? RED : INDIGO });
        }
      return { width: W, height: H, ground, shapes, noise: 4, weave: 0.05, weavePeriod: 6, gradient: 0.03, seed };
    };
    it.each([
      ['drab', '#8f8a80', 31],
      ['grey', '#808080', 32],
      ['iron black', '#2b2927', 33],
    ])('%s ground (%s)', async (_, ground, seed) => {
      const cloth = paintCloth(closeUp(ground, seed));
      const palette = extractPalette(await workingImage(await asJpeg(cloth)));
      expect(palette.filter((c) => c.background)).toEqual([]);
      for (const r of match(cloth.truth, palette)) {
        expect(r.deltaE, `ΔE00 of ${r.hex}`).toBeLessThanOrEqual(1.5);
        expect(
          r.shareError,
          `share of ${r.hex} (true ${cloth.truth.find((t) => t.hex === r.hex)!.share.toFixed(3)})`,
        ).toBeLessThanOrEqual(0.03);
      }
    });

    it('a drab cloth with the same motifs on a grey mount: the mount is background, the drab ground is not', async () => {
      const spec = closeUp('#7f7f7f', 34);
      const inner = { x: 450, y: 300, w: 2100, h: 1400 };
      spec.shapes = [
        { kind: 'rect', ...inner, colour: '#8f8a80' },
        ...spec.shapes.filter(
          (m) =>
            m.kind === 'ellipse' &&
            m.cx > inner.x + 80 &&
            m.cx < inner.x + inner.w - 80 &&
            m.cy > inner.y + 70 &&
            m.cy < inner.y + inner.h - 70,
        ),
      ];
      const cloth = paintCloth({ ...spec, ground: '#7f7f7f' });
      const palette = extractPalette(await workingImage(await asJpeg(cloth)));
      const bg = palette.filter((c) => c.background);
      expect(bg).toHaveLength(1);
      expect(deltaE00(bg[0].lab, hexToLab('#7f7f7f'))).toBeLessThan(1.5);
      const clothArea = inner.w * inner.h;
      const drab = palette.find((c) => !c.background && deltaE00(c.lab, hexToLab('#8f8a80')) < 1.5)!;
      const drabTruth = (cloth.truth.find((t) => t.hex === '#8f8a80')!.share * W * H) / clothArea;
      expect(Math.abs(drab.share - drabTruth)).toBeLessThanOrEqual(0.03);
    });
  });

  it('leaves excluded rectangles out', async () => {
    const shapes: Shape[] = [{ kind: 'rect', x: 0, y: 0, w: 1000, h: 2000, colour: RED }];
    const cloth = paintCloth({ width: W, height: H, ground: GROUND, shapes, noise: 3, seed: 5 });
    const img = await workingImage(await asJpeg(cloth));
    const palette = extractPalette(img, {
      exclude: [{ x: 0, y: 0, w: img.width / 3 + 4, h: img.height }],
      detectBackground: false,
    });
    expect(palette).toHaveLength(1);
    expect(deltaE00(palette[0].lab, hexToLab(GROUND))).toBeLessThan(1);
  });

  it('corrects a tinted white balance from a marked grey patch to within ΔE00 2', async () => {
    const spec = printedCloth({ tint: [1.12, 1, 0.78] });
    const patch = { x: 2550, y: 1650, w: 300, h: 200 };
    spec.shapes.push({ kind: 'rect', ...patch, colour: '#9a9a9a' });
    const cloth = paintCloth(spec);
    const img = await workingImage(await asJpeg(cloth));
    const s = img.scale;
    const rect = { x: patch.x * s, y: patch.y * s, w: patch.w * s, h: patch.h * s };
    const options = { exclude: [rect], detectBackground: false };
    const truth = cloth.truth.filter((t) => t.hex !== '#9a9a9a');
    const raw = match(truth, extractPalette(img, options));
    expect(Math.max(...raw.map((r) => r.deltaE))).toBeGreaterThan(4); // the tint is real
    const corrected = match(truth, extractPalette(correctImage(img, patchWhite(img, rect)).image, options));
    for (const r of corrected) expect(r.deltaE, `corrected ΔE00 of ${r.hex}`).toBeLessThanOrEqual(2);
  });
});

describe('working image', () => {
  it('reads a rectangle in upright pixels, also from an orientation-6 photo', async () => {
    // Stored left half red, right half blue; upright (rotated 90° clockwise) the top is red.
    const raw = Buffer.alloc(400 * 300 * 3);
    for (let y = 0; y < 300; y++)
      for (let x = 0; x < 400; x++) raw.set(x < 200 ? [200, 20, 20] : [20, 20, 200], (y * 400 + x) * 3);
    const plain = await sharp(raw, { raw: { width: 400, height: 300, channels: 3 } })
      .png()
      .toBuffer();
    const rotated = await sharp(raw, { raw: { width: 400, height: 300, channels: 3 } })
      .jpeg({ quality: 95 })
      .withMetadata({ orientation: 6 })
      .toBuffer();
    const top = await workingImage(rotated, { x: 20, y: 20, w: 260, h: 160 });
    expect([top.width, top.height]).toEqual([260, 160]);
    expect(
      deltaE00(extractPalette(top, { detectBackground: false })[0].lab, srgbToLab({ r: 200, g: 20, b: 20 })),
    ).toBeLessThan(2);
    const right = await workingImage(plain, { x: 250, y: 10, w: 500, h: 100 }); // clipped at the edge
    expect(right.width).toBe(150);
    expect(right.scale).toBe(1);
    expect(
      deltaE00(extractPalette(right, { detectBackground: false })[0].lab, srgbToLab({ r: 20, g: 20, b: 200 })),
    ).toBeLessThan(1);
  });
});

describe('fast CIELAB path used inside the palette', () => {
  // Oracle: colorjs.io through shared/colour (srgbToLab); the fast path takes its matrix and
  // transfer curve from the library, so the two must agree closely.
  it('agrees with colorjs.io across the sRGB cube', () => {
    for (let r = 0; r <= 255; r += 15)
      for (let g = 0; g <= 255; g += 17)
        for (let b = 0; b <= 255; b += 51) {
          const fast = srgbToLabFast(r, g, b),
            lib = srgbToLab({ r, g, b });
          expect(Math.abs(fast[0] - lib.L) + Math.abs(fast[1] - lib.a) + Math.abs(fast[2] - lib.b)).toBeLessThan(2e-3);
        }
  });

  it('encodes linear light back to the same 8-bit value', () => {
    for (let v = 0; v < 256; v++) expect(encode8(decode(v))).toBe(v);
    const out = [0, 0, 0];
    linearToLab(1, 1, 1, out);
    expect(out[0]).toBeCloseTo(100, 6);
  });
});
