import { mkdir, rm } from 'node:fs/promises';
import path from 'node:path';
import sharp from 'sharp';
import { mediaLimits } from '../media/limits.ts';
import { iiifPrefix } from './files.ts';
import { localUploadsRoot, storage } from '../storage/index.ts';
import { tmpDir } from '../media/paths.ts';

export const TILE_SIZE = 512;

/**
 * Build the IIIF Image API 3 level-0 tiles of a master (a file on this machine) and store them under
 * iiifPrefix(photoId). libvips writes the tree to a folder on local disk (UPLOADS_DIR/tmp/tiles-<id>-<tag>/: libvips
 * names the output folder after the file name and writes vips-properties.xml beside it), which storage then takes as
 * a whole: the local driver renames it into place, object storage uploads it (an interrupted build leaves no half
 * set in the local folder; the reconciler sweeps a build folder left behind).
 */
export async function buildTiles(photoId: number, masterFile: string, jobTag: string) {
  const parent = path.join(localUploadsRoot(), tmpDir(), `tiles-${photoId}-${jobTag}`);
  await rm(parent, { recursive: true, force: true });
  await mkdir(parent, { recursive: true });
  const tmp = path.join(parent, 'iiif');
  try {
    // The id is rewritten when info.json is served; this one only has to be a valid URL.
    // Read in sequence (strips, never the whole image) when upright as stored; an image to be turned needs random
    // access, which libvips gives a large file through a temporary file on disk rather than memory.
    const { orientation = 1 } = await sharp(masterFile, { limitInputPixels: false }).metadata();
    await sharp(masterFile, { sequentialRead: orientation === 1, limitInputPixels: mediaLimits.maxPixels })
      .rotate()
      .jpeg({ quality: 85 })
      .tile({ layout: 'iiif3', size: TILE_SIZE, id: `http://localhost/iiif/photos/${photoId}` })
      .toFile(tmp);
    const final = iiifPrefix(photoId);
    await storage().putTree(tmp, final);
    return final;
  } finally {
    await rm(parent, { recursive: true, force: true });
  }
}
