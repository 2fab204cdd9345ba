import path from 'node:path';
import type { Photo } from '../models/index.ts';
import { masterPath, tilesDir as tilesDirRelative } from '../media/paths.ts';
import { storage } from '../storage/index.ts';

// Storage keys of the tiling and fixity files, built only from server/media/paths.ts.
/** The prefix of one photo's tiles (ends in '/'). */
export const tilesPrefix = (photoId: number) => `${tilesDirRelative(photoId)}/`;
/** The IIIF level-0 image service (info.json and tiles) of one photo: the prefix its keys start with. */
export const iiifPrefix = (photoId: number) => `${path.posix.join(tilesDirRelative(photoId), 'iiif')}/`;

const EXT: Record<string, string> = {
  jpeg: 'jpg',
  jpg: 'jpg',
  png: 'png',
  tiff: 'tif',
  tif: 'tif',
  webp: 'webp',
  heif: 'heic',
  avif: 'avif',
  gif: 'gif',
};

/**
 * The storage key of a photo's master, or null when it is missing. The row's stored
 * path comes first; the layout's masters/<sha>.<ext> is the fallback for older rows.
 */
export async function findMaster(photo: Pick<Photo, 'sha256' | 'format' | 'derivatives'>): Promise<string | null> {
  const candidates = [
    photo.derivatives?.master?.path,
    EXT[photo.format] ? masterPath(photo.sha256, EXT[photo.format]) : null,
  ].filter(Boolean) as string[];
  for (const key of candidates) if (await storage().exists(key)) return key;
  return null;
}
