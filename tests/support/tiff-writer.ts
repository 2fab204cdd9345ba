import { closeSync, openSync, writeSync } from 'node:fs';
import { deflateSync } from 'node:zlib';

/**
 * A small streaming TIFF writer for tests and benchmarks: RGB, 8 or 16 bits per sample, in strips, uncompressed or
 * Deflate (compression 8, "Adobe Deflate"), classic TIFF or BigTIFF. It writes one strip at a time, so a file of
 * hundreds of megabytes is made without holding its pixels in memory (sharp builds its output whole from a raw
 * buffer). Layout after TIFF 6.0 (Adobe, 1992: header §2, IFD entries §2, baseline RGB fields §8, strips §3) and the
 * BigTIFF extension (8-byte offsets: version 43, IFD entries of 20 bytes, type 16 LONG8); little-endian.
 */
export type TiffOptions = {
  width: number;
  height: number;
  bits: 8 | 16;
  compression: 'none' | 'deflate';
  bigTiff?: boolean;
  rowsPerStrip?: number;
  /** Fills one row of `width * 3` samples (R, G, B per pixel) for row `y`. */
  row: (y: number, out: Uint8Array | Uint16Array) => void;
};

const SHORT = 3,
  LONG = 4,
  LONG8 = 16;

export function writeTiff(file: string, o: TiffOptions) {
  const big = o.bigTiff ?? false;
  const rowsPerStrip = o.rowsPerStrip ?? Math.max(1, Math.floor((256 * 1024) / (o.width * 3 * (o.bits / 8))));
  const strips = Math.ceil(o.height / rowsPerStrip);
  const fd = openSync(file, 'w');
  let pos = 0;
  const put = (b: Buffer) => {
    writeSync(fd, b, 0, b.length, pos);
    pos += b.length;
  };
  try {
    // Header; the first IFD's offset is filled in at the end.
    const header = Buffer.alloc(big ? 16 : 8);
    header.write('II', 0, 'latin1');
    if (big) {
      header.writeUInt16LE(43, 2);
      header.writeUInt16LE(8, 4);
      header.writeUInt16LE(0, 6);
    } else header.writeUInt16LE(42, 2);
    put(header);

    const offsets: number[] = [];
    const counts: number[] = [];
    const row = o.bits === 16 ? new Uint16Array(o.width * 3) : new Uint8Array(o.width * 3);
    const rowBytes = row.byteLength;
    for (let s = 0; s < strips; s++) {
      const rows = Math.min(rowsPerStrip, o.height - s * rowsPerStrip);
      const raw = Buffer.alloc(rows * rowBytes);
      for (let r = 0; r < rows; r++) {
        o.row(s * rowsPerStrip + r, row);
        Buffer.from(row.buffer, row.byteOffset, rowBytes).copy(raw, r * rowBytes);
      }
      const data = o.compression === 'deflate' ? deflateSync(raw, { level: 1 }) : raw;
      if (pos % 2) put(Buffer.alloc(1)); // word alignment (TIFF 6.0 §2)
      offsets.push(pos);
      counts.push(data.length);
      put(data);
    }

    // Arrays too long to sit in their IFD entries.
    const array = (values: number[], type: number) => {
      const size = type === SHORT ? 2 : type === LONG ? 4 : 8;
      const b = Buffer.alloc(values.length * size);
      values.forEach((v, i) => {
        if (size === 2) b.writeUInt16LE(v, i * 2);
        else if (size === 4) b.writeUInt32LE(v, i * 4);
        else b.writeBigUInt64LE(BigInt(v), i * 8);
      });
      return b;
    };
    const offType = big ? LONG8 : LONG;
    type Entry = { tag: number; type: number; values: number[] };
    const entries: Entry[] = [
      { tag: 256, type: LONG, values: [o.width] },
      { tag: 257, type: LONG, values: [o.height] },
      { tag: 258, type: SHORT, values: [o.bits, o.bits, o.bits] },
      { tag: 259, type: SHORT, values: [o.compression === 'deflate' ? 8 : 1] },
      { tag: 262, type: SHORT, values: [2] }, // RGB
      { tag: 273, type: offType, values: offsets },
      { tag: 277, type: SHORT, values: [3] },
      { tag: 278, type: LONG, values: [rowsPerStrip] },
      { tag: 279, type: offType, values: counts },
      { tag: 284, type: SHORT, values: [1] }, // chunky
    ];
    const inline = big ? 8 : 4;
    const placed = entries.map((e) => {
      const data = array(e.values, e.type);
      if (data.length <= inline) return { e, data, at: -1 };
      if (pos % 2) put(Buffer.alloc(1));
      const at = pos;
      put(data);
      return { e, data, at };
    });

    if (pos % 2) put(Buffer.alloc(1));
    const ifdAt = pos;
    const entrySize = big ? 20 : 12;
    const ifd = Buffer.alloc((big ? 8 : 2) + entries.length * entrySize + (big ? 8 : 4));
    let p = 0;
    if (big) ifd.writeBigUInt64LE(BigInt(entries.length), 0);
    else ifd.writeUInt16LE(entries.length, 0);
    p += big ? 8 : 2;
    for (const { e, data, at } of placed) {
      ifd.writeUInt16LE(e.tag, p);
      ifd.writeUInt16LE(e.type, p + 2);
      if (big) ifd.writeBigUInt64LE(BigInt(e.values.length), p + 4);
      else ifd.writeUInt32LE(e.values.length, p + 4);
      const valueAt = p + (big ? 12 : 8);
      if (at < 0) data.copy(ifd, valueAt);
      else if (big) ifd.writeBigUInt64LE(BigInt(at), valueAt);
      else ifd.writeUInt32LE(at, valueAt);
      p += entrySize;
    }
    put(ifd); // next IFD offset: 0
    const first = Buffer.alloc(big ? 8 : 4);
    if (big) first.writeBigUInt64LE(BigInt(ifdAt));
    else first.writeUInt32LE(ifdAt);
    writeSync(fd, first, 0, first.length, big ? 8 : 4);
    return { bytes: pos };
  } finally {
    closeSync(fd);
  }
}
