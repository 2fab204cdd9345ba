import { mkdir, rename, rm } from 'node:fs/promises';
import path from 'node:path';
import sharp from 'sharp';
import { mediaLimits } from '../media/limits.ts';
import { iiifDir, tilesDir } from './files.ts';

export const TILE_SIZE = 512;

/**
 * Build the IIIF Image API 3 level-0 tiles of a master into tilesDir(photoId)/iiif.
 * libvips names the output folder after the file name and writes vips-properties.xml
 * beside it, so each photo gets its own parent folder and a temporary name that is
 * renamed into place only when complete (an interrupted build leaves no half set).
 */
export async function buildTiles(photoId: number, masterFile: string, jobTag: string) {
  const parent = tilesDir(photoId);
  await mkdir(parent, { recursive: true });
  const tmpName = `iiif-building-${jobTag}`;
  const tmp = path.join(parent, tmpName);
  await rm(tmp, { recursive: true, force: true });
  // The id is rewritten when info.json is served; this one only has to be a valid URL.
  // Read in sequence (strips, never the whole image) when upright as stored; an image to be turned needs random
  // access, which libvips gives a large file through a temporary file on disk rather than memory.
  const { orientation = 1 } = await sharp(masterFile, { limitInputPixels: false }).metadata();
  await sharp(masterFile, { sequentialRead: orientation === 1, limitInputPixels: mediaLimits.maxPixels })
    .rotate()
    .jpeg({ quality: 85 })
    .tile({ layout: 'iiif3', size: TILE_SIZE, id: `http://localhost/iiif/photos/${photoId}` })
    .toFile(tmp);
  const final = iiifDir(photoId);
  await rm(final, { recursive: true, force: true });
  await rename(tmp, final);
  await rm(path.join(parent, 'vips-properties.xml'), { force: true });
  return final;
}
