import { readdir } from 'node:fs/promises';
import path from 'node:path';
import { crc32 } from 'node:zlib';
import sharp from 'sharp';
import { paintCloth } from '../../server/seed/cloth-image.ts';
import { uploadsDir } from '../../server/media/paths.ts';

/** A small printed-cloth JPEG with known colour areas and, optionally, GPS and exposure tags. */
export async function clothJpeg(opts: { gps?: boolean; seed?: number; exposure?: boolean } = {}) {
  const cloth = paintCloth({
    width: 480,
    height: 320,
    ground: '#e9dfc8',
    shapes: [
      { kind: 'rect', x: 60, y: 60, w: 160, h: 200, colour: '#9b2d2a' },
      { kind: 'ellipse', cx: 340, cy: 160, rx: 80, ry: 100, colour: '#2f4f7a' },
    ],
    noise: 1.5,
    seed: opts.seed ?? 7,
  });
  let img = sharp(Buffer.from(cloth.data), { raw: { width: cloth.width, height: cloth.height, channels: 3 } }).jpeg({
    quality: 92,
  });
  img = img.withExif({
    IFD0: { Make: 'Weldfold', Model: 'Copy Stand 2' },
    // sharp's withExif takes strings only; rationals as "n/d".
    ...(opts.exposure
      ? {
          IFD2: {
            DateTimeOriginal: '2025:03:14 10:22:05',
            ExposureTime: '1/60',
            FNumber: '8/1',
            ISOSpeedRatings: '200',
            FocalLength: '50/1',
          },
        }
      : {}),
    ...(opts.gps
      ? {
          IFD3: {
            GPSLatitudeRef: 'N',
            GPSLatitude: '54/1 30/1 0/1',
            GPSLongitudeRef: 'W',
            GPSLongitude: '2/1 15/1 0/1',
          },
        }
      : {}),
  });
  return img.toBuffer();
}

/** A PNG header that claims width × height pixels with almost no data: a decompression ("pixel") bomb. */
export async function pngClaiming(width: number, height: number) {
  const png = await sharp({ create: { width: 1, height: 1, channels: 3, background: '#808080' } })
    .png()
    .toBuffer();
  // IHDR data starts at byte 16 (8 signature + 4 length + 4 type); its CRC follows the 13 data bytes.
  png.writeUInt32BE(width, 16);
  png.writeUInt32BE(height, 20);
  png.writeUInt32BE(crc32(png.subarray(12, 29)), 29);
  return png;
}

/** Every file under uploads/ (masters, derivatives, tiles), to check that a refusal leaves nothing behind. */
export async function uploadedFiles(): Promise<string[]> {
  const root = uploadsDir();
  try {
    const entries = await readdir(root, { recursive: true, withFileTypes: true });
    return entries
      .filter((e) => e.isFile())
      .map((e) => path.relative(root, path.join(e.parentPath, e.name)))
      .sort();
  } catch {
    return [];
  }
}
