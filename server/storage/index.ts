import { randomBytes } from 'node:crypto';
import { createWriteStream } from 'node:fs';
import { mkdir, rm } from 'node:fs/promises';
import path from 'node:path';
import { pipeline } from 'node:stream/promises';
import { env } from '../env.ts';
import { LocalStorage } from './local.ts';
import type { StorageDriver } from './types.ts';

export { StorageNotFound, type StorageDriver, type StoredObject, type PutSource } from './types.ts';
export { LocalStorage } from './local.ts';

/** Where uploads are staged on this machine (UPLOADS_DIR): always a folder on local disk, whatever the driver. */
export const localUploadsRoot = () => path.resolve(env.UPLOADS_DIR);

/** The driver named by a storage URL: unset or file: the local folder (file: with a path names another folder). */
export function createStorage(url: string | undefined): StorageDriver {
  if (!url) return new LocalStorage(localUploadsRoot());
  const u = new URL(url);
  if (u.protocol === 'file:')
    return new LocalStorage(u.pathname && u.pathname !== '/' ? u.pathname : localUploadsRoot());
  throw new Error(`STORAGE_URL: unknown scheme ${u.protocol} (use file: or s3:)`);
}

let current: StorageDriver | null = null;

/** The storage of masters, derivatives, tiles and report PDFs, chosen once from STORAGE_URL. */
export function storage(): StorageDriver {
  return (current ??= createStorage(env.STORAGE_URL));
}

/** Tests only: use another driver for a while (answers a function that puts the previous one back). */
export function useStorage(driver: StorageDriver) {
  const before = current;
  current = driver;
  return () => {
    current = before;
  };
}

/** A fresh temp path on this machine under UPLOADS_DIR/tmp (swept by the orphan reconciler when left behind). */
export async function localTempPath(label: string) {
  const dir = path.join(localUploadsRoot(), 'tmp');
  await mkdir(dir, { recursive: true });
  return path.join(dir, `${label}-${randomBytes(8).toString('hex')}.part`);
}

/**
 * Calls fn with a path on this machine holding the object's bytes: the stored file itself (local driver), or a
 * temp copy downloaded for the call and removed after it (object storage; sharp needs a file for random access).
 */
export async function withLocalFile<T>(key: string, fn: (file: string) => Promise<T>, store = storage()): Promise<T> {
  const own = store.localPath(key);
  if (own) return fn(own);
  const tmp = await localTempPath('download');
  try {
    await pipeline(await store.get(key), createWriteStream(tmp));
    return await fn(tmp);
  } finally {
    await rm(tmp, { force: true });
  }
}

/** The object's bytes as text (small objects: info.json). */
export async function readText(key: string, store = storage()) {
  const chunks: Buffer[] = [];
  for await (const c of await store.get(key)) chunks.push(c as Buffer);
  return Buffer.concat(chunks).toString('utf8');
}
