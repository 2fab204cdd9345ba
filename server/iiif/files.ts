import { access } from 'node:fs/promises';
import path from 'node:path';
import type { Photo } from '../models/index.ts';
import { masterPath, resolveInsideUploads, tilesDir as tilesDirRelative } from '../media/paths.ts';

// Absolute paths of the tiling and fixity files, built only from server/media/paths.ts.
export const tilesDir = (photoId: number) => resolveInsideUploads(tilesDirRelative(photoId));
/** The IIIF level-0 image service folder (info.json and tiles) of one photo. */
export const iiifDir = (photoId: number) => resolveInsideUploads(path.posix.join(tilesDirRelative(photoId), 'iiif'));

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
 * The master file of a photo, or null when it is missing on disk. The row's stored
 * path comes first; the layout's masters/<sha>.<ext> is the fallback for older rows.
 */
export async function findMaster(photo: Pick<Photo, 'sha256' | 'format' | 'derivatives'>): Promise<string | null> {
  const candidates = [
    photo.derivatives?.master?.path,
    EXT[photo.format] ? masterPath(photo.sha256, EXT[photo.format]) : null,
  ].filter(Boolean) as string[];
  for (const rel of candidates) {
    const abs = resolveInsideUploads(rel);
    if (
      await access(abs).then(
        () => true,
        () => false,
      )
    )
      return abs;
  }
  return null;
}
