import { readFileSync } from 'node:fs';
import path from 'node:path';
import { crc32, deflateSync } from 'node:zlib';
import Color from 'colorjs.io';
import sharp from 'sharp';

// Test images in a colour space other than sRGB, with the profile embedded. Pixel values are
// computed with colorjs.io (the app's colour library), never with lcms, so the test does not
// check libvips against itself; the profile is then attached without converting the pixels.

export type SpaceId = 'srgb' | 'p3' | 'a98rgb' | 'prophoto';

/** Where each profile comes from (see tests/fixtures/icc/README.md). */
export const PROFILE_SOURCES: Record<SpaceId, string> = {
  srgb: "libvips' built-in sRGB profile",
  p3: "libvips' built-in Display P3 profile",
  a98rgb: "Debian icc-profiles-free 'Compatible with Adobe RGB (1998)'",
  prophoto: 'ROMM RGB matrix/TRC profile built here from ISO 22028-2:2013',
};

const builtIn = async (name: 'srgb' | 'p3' | 'cmyk') => {
  const out = await sharp({ create: { width: 1, height: 1, channels: 3, background: '#808080' } })
    .withIccProfile(name)
    .png()
    .toBuffer();
  return (await sharp(out).metadata()).icc!;
};

let cache: Partial<Record<SpaceId | 'cmyk', Buffer>> = {};
export async function profileBytes(space: SpaceId | 'cmyk'): Promise<Buffer> {
  cache[space] ??=
    space === 'a98rgb'
      ? readFileSync(path.join(import.meta.dirname, '../fixtures/icc/compatibleWithAdobeRGB1998.icc'))
      : space === 'prophoto'
        ? rommProfile()
        : await builtIn(space);
  return cache[space]!;
}
export const clearProfileCache = () => {
  cache = {};
};

// --- A ROMM RGB profile from its published definition -------------------------------------------
// ISO 22028-2:2013 (ROMM RGB): primaries R (0.7347, 0.2653), G (0.1596, 0.8404), B (0.0366, 0.0001),
// white D50 (0.3457, 0.3585); encoding C' = 16·C below Et = 1/512, else C^(1/1.8). As an ICC
// parametric curve (ICC.1:2010 10.18, function type 3): Y = X^1.8 for X ≥ 16/512, else X/16.

function primariesMatrix(xy: number[][], white: number[]) {
  const XYZ = (x: number, y: number) => [x / y, 1, (1 - x - y) / y];
  const cols = xy.map(([x, y]) => XYZ(x, y));
  const W = XYZ(white[0], white[1]);
  // Solve cols · S = W for the per-primary scales S (Cramer's rule).
  const m = [0, 1, 2].map((i) => cols.map((c) => c[i]));
  const det = (a: number[][]) =>
    a[0][0] * (a[1][1] * a[2][2] - a[1][2] * a[2][1]) -
    a[0][1] * (a[1][0] * a[2][2] - a[1][2] * a[2][0]) +
    a[0][2] * (a[1][0] * a[2][1] - a[1][1] * a[2][0]);
  const d = det(m);
  const S = [0, 1, 2].map((k) => det(m.map((row, i) => row.map((v, j) => (j === k ? W[i] : v)))) / d);
  return cols.map((c, k) => c.map((v) => v * S[k])); // colorant XYZ of each primary
}

function rommProfile(): Buffer {
  const colorants = primariesMatrix(
    [
      [0.7347, 0.2653],
      [0.1596, 0.8404],
      [0.0366, 0.0001],
    ],
    [0.3457, 0.3585],
  );
  const s15 = (v: number) => {
    const b = Buffer.alloc(4);
    b.writeInt32BE(Math.round(v * 65536));
    return b;
  };
  const xyzTag = (v: number[]) => Buffer.concat([Buffer.from('XYZ \0\0\0\0', 'latin1'), ...v.map(s15)]);
  const para = Buffer.concat([
    Buffer.from('para\0\0\0\0', 'latin1'),
    Buffer.from([0, 3, 0, 0]),
    ...[1.8, 1, 0, 1 / 16, 16 / 512].map(s15),
  ]);
  const text = 'ROMM RGB (ISO 22028-2), test profile';
  const utf16 = Buffer.from(text, 'utf16le').swap16();
  const mluc = Buffer.concat([
    Buffer.from('mluc\0\0\0\0', 'latin1'),
    u32(1),
    u32(12),
    Buffer.from('enUS', 'latin1'),
    u32(utf16.length),
    u32(28),
    utf16,
  ]);
  const tags: Array<[string, Buffer]> = [
    ['desc', mluc],
    ['cprt', mluc],
    ['wtpt', xyzTag([0.9642, 1, 0.8249])],
    ['rXYZ', xyzTag(colorants[0])],
    ['gXYZ', xyzTag(colorants[1])],
    ['bXYZ', xyzTag(colorants[2])],
    ['rTRC', para],
  ];
  const all: Array<[string, number]> = [];
  const bodies: Buffer[] = [];
  let offset = 128 + 4 + 12 * (tags.length + 2);
  for (const [sig, body] of tags) {
    all.push([sig, offset]);
    const padded = Buffer.concat([body, Buffer.alloc((4 - (body.length % 4)) % 4)]);
    bodies.push(padded);
    offset += padded.length;
  }
  const sizeOf = (sig: string) => tags.find(([s]) => s === sig)![1].length;
  const trc = all.find(([s]) => s === 'rTRC')![1];
  const table = Buffer.concat([
    u32(tags.length + 2),
    ...all.map(([s, o]) => Buffer.concat([Buffer.from(s, 'latin1'), u32(o), u32(sizeOf(s))])),
    // gTRC and bTRC share the red curve's bytes, as the ICC allows.
    ...['gTRC', 'bTRC'].map((s) => Buffer.concat([Buffer.from(s, 'latin1'), u32(trc), u32(sizeOf('rTRC'))])),
  ]);
  const header = Buffer.alloc(128);
  header.writeUInt32BE(offset, 0);
  header.write('none', 4, 'latin1');
  header.writeUInt32BE(0x04300000, 8); // version 4.3
  header.write('mntrRGB XYZ ', 12, 'latin1');
  header.write('acsp', 36, 'latin1');
  [0.9642, 1, 0.8249].forEach((v, i) => s15(v).copy(header, 68 + 4 * i));
  return Buffer.concat([header, table, ...bodies]);
}

function u32(v: number) {
  const b = Buffer.alloc(4);
  b.writeUInt32BE(v);
  return b;
}

// --- Pixels ---------------------------------------------------------------------------------------

/**
 * Converts interleaved 8-bit sRGB pixels into `space`, encoded at `bits`, through colorjs.io
 * (each distinct colour converted once). Colours outside the target gamut are clipped.
 */
export function convertPixels(srgb: Uint8Array, space: SpaceId, bits: 8 | 16): Uint8Array | Uint16Array {
  const max = bits === 8 ? 255 : 65535;
  const out = bits === 8 ? new Uint8Array(srgb.length) : new Uint16Array(srgb.length);
  const seen = new Map<number, [number, number, number]>();
  for (let i = 0; i < srgb.length; i += 3) {
    const key = (srgb[i] << 16) | (srgb[i + 1] << 8) | srgb[i + 2];
    let v = seen.get(key);
    if (!v) {
      const c = new Color('srgb', [srgb[i] / 255, srgb[i + 1] / 255, srgb[i + 2] / 255]).to(space).coords as number[];
      v = c.map((x) => Math.round(Math.min(1, Math.max(0, x)) * max)) as [number, number, number];
      seen.set(key, v);
    }
    out[i] = v[0];
    out[i + 1] = v[1];
    out[i + 2] = v[2];
  }
  return out;
}

/** A PNG with an iCCP chunk holding `icc`, inserted after IHDR (PNG 1.2, 4.2.2.4). */
export function pngWithIcc(png: Buffer, icc: Buffer): Buffer {
  const ihdrEnd = 8 + 8 + png.readUInt32BE(8) + 4;
  const data = Buffer.concat([Buffer.from('icc\0\0', 'latin1'), deflateSync(icc)]);
  const type = Buffer.from('iCCP', 'latin1');
  const chunk = Buffer.concat([u32(data.length), type, data, u32(crc32(Buffer.concat([type, data])))]);
  return Buffer.concat([png.subarray(0, ihdrEnd), chunk, png.subarray(ihdrEnd)]);
}

export type Format = 'jpeg' | 'png' | 'tiff';

/**
 * An image file of the given pixels (already in the profile's encoding) with the profile embedded
 * and the pixels untouched: a PNG carries it in iCCP; JPEG and TIFF are written from that PNG with
 * sharp's keepIccProfile(), which copies the profile instead of converting to it.
 */
export async function encodeWithProfile(
  px: Uint8Array | Uint16Array,
  width: number,
  height: number,
  icc: Buffer | null,
  format: Format,
): Promise<Buffer> {
  const sixteen = px instanceof Uint16Array;
  let img = sharp(px, { raw: { width, height, channels: 3 } });
  if (sixteen) img = img.toColourspace('rgb16');
  const png = await img.png({ compressionLevel: 1 }).toBuffer();
  const tagged = icc ? pngWithIcc(png, icc) : png;
  if (format === 'png') return tagged;
  let out = sharp(tagged).keepIccProfile();
  if (sixteen) out = out.toColourspace('rgb16');
  return format === 'jpeg' ? out.jpeg({ quality: 95 }).toBuffer() : out.tiff({ compression: 'lzw' }).toBuffer();
}

/** 8-bit sRGB pixels re-encoded in `space` at `bits` and saved as `format` with that space's profile. */
export async function inProfile(
  srgb: { data: Uint8Array; width: number; height: number },
  space: SpaceId,
  bits: 8 | 16,
  format: Format,
) {
  return encodeWithProfile(
    convertPixels(srgb.data, space, bits),
    srgb.width,
    srgb.height,
    await profileBytes(space),
    format,
  );
}
