import { readdir } from 'node:fs/promises';
import path from 'node:path';
import { env } from '../env.ts';

// The agreed uploads layout (masters/<sha[0..2]>/<sha>.<ext>, tiles/<photoId>/iiif/).
// server/media/paths.ts owns it; this module is the one place here that follows it,
// so switching to that module is a one-file change once it is merged.
const uploadsRoot = () => path.resolve(env.UPLOADS_DIR);

export const tilesDir = (photoId: number) => path.join(uploadsRoot(), 'tiles', String(photoId));
/** The IIIF level-0 image service folder (info.json and tiles) of one photo. */
export const iiifDir = (photoId: number) => path.join(tilesDir(photoId), 'iiif');
export const masterPath = (sha256: string, ext: string) => path.join(uploadsRoot(), 'masters', sha256.slice(0, 2), `${sha256}.${ext}`);

/** The master file of a sha256 whatever its extension, or null when it is missing. */
export async function findMaster(sha256: string): Promise<string | null> {
  if (!/^[0-9a-f]{64}$/.test(sha256)) return null;
  const dir = path.dirname(masterPath(sha256, 'x'));
  const names = await readdir(dir).catch(() => [] as string[]);
  const name = names.find((n) => n.startsWith(`${sha256}.`) && !n.endsWith('.tmp'));
  return name ? path.join(dir, name) : null;
}
