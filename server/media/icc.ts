import { bradfordMatrix, type M3, type Xyz } from '../../shared/colour/index.ts';
import { xyzToRgbMatrix } from './fast-lab.ts';

// Reads the parts of an ICC profile (ICC.1:2010 / ICC.1:2001-04) that a matrix/TRC colour
// space consists of: the colorants (rXYZ, gXYZ, bXYZ, relative to the D50 connection space),
// the tone curves (rTRC, gTRC, bTRC or kTRC, as 'curv' or 'para') and the description.
// Every RGB working space a camera or scanner writes (sRGB, Display P3, Adobe RGB (1998)
// compatible, ROMM/ProPhoto, eciRGB) is of this kind; anything else (CMYK, LUT profiles) is
// left to lcms through sharp. Doing it here keeps 16-bit precision and colours outside sRGB.

export type Curve = (x: number) => number;

export type IccProfile = {
  colourSpace: string; // 'RGB ', 'GRAY', 'CMYK', …
  pcs: string;
  version: string;
  description: string | null;
  /** RGB → linear device values → XYZ (D50 connection space); null when the profile is not matrix/TRC. */
  matrix: M3 | null;
  curves: Curve[] | null;
};

/** The connection-space white of ICC profiles: D50 as the ICC defines it (ICC.1, 7.2.16). */
export const ICC_D50: Xyz = [0.9642, 1.0, 0.8249];

const sig = (b: Buffer, o: number) => b.toString('latin1', o, o + 4);
const s15 = (b: Buffer, o: number) => b.readInt32BE(o) / 65536;

function readText(b: Buffer, o: number, size: number): string | null {
  const type = sig(b, o);
  if (type === 'desc') {
    const n = b.readUInt32BE(o + 8);
    return (
      b
        .toString('latin1', o + 12, o + 12 + Math.max(0, n - 1))
        .replace(/\0+$/, '')
        .trim() || null
    );
  }
  if (type === 'mluc') {
    const records = b.readUInt32BE(o + 8),
      recordSize = b.readUInt32BE(o + 12);
    if (!records) return null;
    // The first record is enough: descriptions name the space, not a language.
    const len = b.readUInt32BE(o + 16 + 4),
      off = b.readUInt32BE(o + 16 + 8);
    if (recordSize < 12 || off + len > size) return null;
    const utf16be = b.subarray(o + off, o + off + len);
    const le = Buffer.alloc(utf16be.length);
    for (let i = 0; i + 1 < utf16be.length; i += 2) {
      le[i] = utf16be[i + 1];
      le[i + 1] = utf16be[i];
    }
    return le.toString('utf16le').replace(/\0+$/, '').trim() || null;
  }
  if (type === 'text')
    return (
      b
        .toString('latin1', o + 8, o + size)
        .replace(/\0+$/, '')
        .trim() || null
    );
  return null;
}

/** A tone curve: 'curv' (identity, a gamma, or a sampled table) or 'para' (ICC function types 0–4). */
function readCurve(b: Buffer, o: number): Curve | null {
  const type = sig(b, o);
  if (type === 'curv') {
    const n = b.readUInt32BE(o + 8);
    if (n === 0) return (x) => x;
    if (n === 1) {
      const g = b.readUInt16BE(o + 12) / 256;
      return (x) => (x <= 0 ? 0 : x ** g);
    }
    const table = new Float64Array(n);
    for (let i = 0; i < n; i++) table[i] = b.readUInt16BE(o + 12 + 2 * i) / 65535;
    return (x) => {
      const t = Math.min(1, Math.max(0, x)) * (n - 1);
      const i = Math.min(n - 2, Math.floor(t));
      return table[i] + (table[i + 1] - table[i]) * (t - i);
    };
  }
  if (type === 'para') {
    const fn = b.readUInt16BE(o + 8);
    const count = [1, 3, 4, 5, 7][fn];
    if (count === undefined) return null;
    const [g, a = 1, bb = 0, c = 0, d = 0, e = 0, f = 0] = Array.from({ length: count }, (_, i) =>
      s15(b, o + 12 + 4 * i),
    );
    const pow = (v: number) => (v <= 0 ? 0 : v ** g);
    switch (fn) {
      case 0:
        return (x) => pow(x);
      case 1:
        return (x) => (x >= -bb / a ? pow(a * x + bb) : 0);
      case 2:
        return (x) => (x >= -bb / a ? pow(a * x + bb) + c : c);
      case 3:
        return (x) => (x >= d ? pow(a * x + bb) : c * x);
      default:
        return (x) => (x >= d ? pow(a * x + bb) + e : c * x + f);
    }
  }
  return null;
}

/** Parses an ICC profile; throws when the bytes are not one. */
export function parseIcc(bytes: Buffer | Uint8Array): IccProfile {
  const b = Buffer.isBuffer(bytes) ? bytes : Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  if (b.length < 132 || sig(b, 36) !== 'acsp') throw new Error('Not an ICC profile');
  const count = b.readUInt32BE(128);
  const tags = new Map<string, { o: number; size: number }>();
  for (let i = 0; i < count && 132 + 12 * i + 12 <= b.length; i++) {
    const e = 132 + 12 * i;
    const o = b.readUInt32BE(e + 4),
      size = b.readUInt32BE(e + 8);
    if (o + size <= b.length) tags.set(sig(b, e), { o, size });
  }
  const colourSpace = sig(b, 16),
    pcs = sig(b, 20);
  const version = `${b[8]}.${b[9] >> 4}`;
  const desc = tags.get('desc');
  const description = desc ? readText(b, desc.o, desc.size) : null;
  const xyz = (t: string): Xyz | null => {
    const at = tags.get(t);
    if (!at || sig(b, at.o) !== 'XYZ ') return null;
    return [s15(b, at.o + 8), s15(b, at.o + 12), s15(b, at.o + 16)];
  };
  const curve = (t: string) => {
    const at = tags.get(t);
    return at ? readCurve(b, at.o) : null;
  };
  let matrix: M3 | null = null,
    curves: Curve[] | null = null;
  if (colourSpace === 'RGB ' && pcs === 'XYZ ') {
    const cols = [xyz('rXYZ'), xyz('gXYZ'), xyz('bXYZ')];
    const trcs = [curve('rTRC'), curve('gTRC'), curve('bTRC')];
    if (cols.every(Boolean) && trcs.every(Boolean)) {
      matrix = [0, 1, 2].map((i) => cols.map((c) => c![i])) as M3;
      curves = trcs as Curve[];
    }
  } else if (colourSpace === 'GRAY') {
    const k = curve('kTRC');
    // A grey profile maps to the connection-space white scaled by the curve.
    if (k) {
      matrix = [
        [ICC_D50[0], 0, 0],
        [0, ICC_D50[1], 0],
        [0, 0, ICC_D50[2]],
      ];
      curves = [k, k, k];
    }
  }
  return { colourSpace, pcs, version, description, matrix, curves };
}

const mul = (x: number[][], y: number[][]) =>
  [0, 1, 2].map((i) => [0, 1, 2].map((j) => x[i][0] * y[0][j] + x[i][1] * y[1][j] + x[i][2] * y[2][j])) as M3;

/**
 * Linear device RGB → linear sRGB (D65), unbounded: the profile's colorants to XYZ D50, Bradford
 * to D65 (as the ICC sRGB profile's colorants were adapted, so an sRGB profile gives the identity),
 * then colorjs.io's XYZ → linear sRGB.
 */
export function toLinearSrgbMatrix(profile: IccProfile): M3 {
  if (!profile.matrix) throw new Error('Not a matrix/TRC profile');
  return mul(xyzToRgbMatrix(), mul(bradfordMatrix(ICC_D50), profile.matrix));
}
