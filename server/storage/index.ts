import { randomBytes } from 'node:crypto';
import { createWriteStream } from 'node:fs';
import { mkdir, rm } from 'node:fs/promises';
import path from 'node:path';
import { pipeline } from 'node:stream/promises';
import { env } from '../env.ts';
import { LocalStorage } from './local.ts';
import { parseS3Url, S3Storage } from './s3.ts';
import { FAKE_CREDENTIALS } from './fake.ts';
import type { StorageDriver } from './types.ts';

export { StorageNotFound, type StorageDriver, type StoredObject, type PutSource } from './types.ts';
export { LocalStorage } from './local.ts';
export { S3Storage } from './s3.ts';

/** Where uploads are staged on this machine (UPLOADS_DIR): always a folder on local disk, whatever the driver. */
export const localUploadsRoot = () => path.resolve(env.UPLOADS_DIR);

/**
 * The driver named by a storage URL: unset or file: the local folder (file: with a path names another folder);
 * s3://bucket[/prefix]?endpoint=…&region=…&forcePathStyle=true S3-compatible object storage, with the credentials of
 * AWS_ACCESS_KEY_ID / AWS_SECRET_ACCESS_KEY (unset: the SDK's own chain; with `fake=1`, the local fake's key).
 */
export function createStorage(url: string | undefined): StorageDriver {
  if (!url) return new LocalStorage(localUploadsRoot());
  const u = new URL(url);
  if (u.protocol === 'file:')
    return new LocalStorage(u.pathname && u.pathname !== '/' ? u.pathname : localUploadsRoot());
  if (u.protocol === 's3:') {
    const config = parseS3Url(url);
    const credentials =
      env.AWS_ACCESS_KEY_ID && env.AWS_SECRET_ACCESS_KEY
        ? { accessKeyId: env.AWS_ACCESS_KEY_ID, secretAccessKey: env.AWS_SECRET_ACCESS_KEY }
        : config.fake
          ? FAKE_CREDENTIALS
          : undefined;
    return new S3Storage({ ...config, credentials });
  }
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

/**
 * Development only: with STORAGE_URL s3://…?endpoint=http://127.0.0.1:<port>&fake=1, start the local S3 fake
 * (s3rver) on that port with its objects under DATA_DIR/s3 and the bucket made. Answers its close(), or null.
 */
export async function startConfiguredFake() {
  const store = storage();
  if (!(store instanceof S3Storage) || !store.config.fake) return null;
  const endpoint = store.config.endpoint ? new URL(store.config.endpoint) : null;
  if (!endpoint || !['127.0.0.1', 'localhost'].includes(endpoint.hostname) || !endpoint.port)
    throw new Error('STORAGE_URL: fake=1 needs endpoint=http://127.0.0.1:<port>');
  const { startS3Fake } = await import('./fake.ts');
  const fake = await startS3Fake({
    port: Number(endpoint.port),
    directory: path.join(env.DATA_DIR, 's3'),
    bucket: store.config.bucket,
  });
  return fake;
}
