import { mkdir } from 'node:fs/promises';
import path from 'node:path';
import { env } from '../env.ts';
import { HttpError } from '../http/errors.ts';

// The only module that builds storage keys (server/storage): the paths below the uploads directory with the local
// driver, object keys in a bucket with S3. Photo rows store them. resolveInsideUploads turns a relative path into an
// absolute one under UPLOADS_DIR, for what stays on this server's disk (uploads staged under tmp/).

export const uploadsDir = () => path.resolve(env.UPLOADS_DIR);

export type DerivativeKind = 'thumb' | 'display';

const SHA = /^[0-9a-f]{64}$/;
const EXT = /^[a-z0-9]{1,5}$/;

/** Relative path of a master: masters/<first two hex digits>/<sha256>.<ext>. */
export function masterPath(sha256: string, ext: string): string {
  if (!SHA.test(sha256) || !EXT.test(ext)) throw new Error(`Bad master name ${sha256}.${ext}`);
  return path.posix.join('masters', sha256.slice(0, 2), `${sha256}.${ext}`);
}

/** Folder of one photo's derivatives. */
export function derivativesDir(photoId: number): string {
  if (!Number.isInteger(photoId) || photoId <= 0) throw new Error(`Bad photo id ${photoId}`);
  return path.posix.join('derivatives', String(photoId));
}

export function derivativePath(photoId: number, kind: DerivativeKind): string {
  return path.posix.join(derivativesDir(photoId), `${kind}.webp`);
}

/** Folder of a photo's IIIF tiles (the tiles themselves go under <dir>/iiif/ with info.json). */
export function tilesDir(photoId: number): string {
  if (!Number.isInteger(photoId) || photoId <= 0) throw new Error(`Bad photo id ${photoId}`);
  return path.posix.join('tiles', String(photoId));
}

/** Folder for files being written, renamed into place once complete. */
export const tmpDir = () => 'tmp';

/** Absolute path of a path relative to uploads/; throws if it would leave uploads/. */
export function resolveInsideUploads(relative: string): string {
  const root = uploadsDir();
  if (path.isAbsolute(relative) || relative.includes('\0'))
    throw new HttpError(400, 'bad_path', 'Path is not inside the uploads folder.');
  const abs = path.resolve(root, relative);
  if (abs === root || !abs.startsWith(root + path.sep))
    throw new HttpError(400, 'bad_path', 'Path is not inside the uploads folder.');
  return abs;
}

export async function ensureParent(relative: string) {
  await mkdir(path.dirname(resolveInsideUploads(relative)), { recursive: true });
}
