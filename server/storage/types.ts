import type { Readable } from 'node:stream';

/** One stored object: its key (relative, '/'-separated, e.g. masters/ab/<sha256>.tif), size and last change. */
export type StoredObject = { key: string; bytes: number; modifiedAt: Date };

/**
 * What put() stores: bytes in memory (derivatives, small), a file on this machine (an upload staged under
 * UPLOADS_DIR/tmp; `move: true` lets the local driver rename it instead of copying, and removes it once stored), or
 * a stream. A file's `sha256`, when the caller has already computed it, spares the local driver a second read.
 */
export type PutSource = Buffer | Readable | { file: string; move?: boolean; sha256?: string };

export type PutResult = { bytes: number; sha256: string };

/** An inclusive byte range, as HTTP Range gives it. */
export type ByteRange = { start: number; end: number };

/**
 * Masters, derivatives, tiles and report PDFs live behind this interface (server/storage/README.md). Keys keep the
 * layout of server/media/paths.ts. Two drivers: the local uploads folder and S3-compatible object storage.
 */
export interface StorageDriver {
  readonly kind: 'local' | 's3';
  /** Stores an object whole (a reader never sees half of it); answers its size and the SHA-256 of what was sent. */
  put(key: string, source: PutSource, opts?: { contentType?: string }): Promise<PutResult>;
  /** The object's bytes (a range of them when asked) as a stream; throws StorageNotFound when it is missing. */
  get(key: string, range?: ByteRange): Promise<Readable>;
  stat(key: string): Promise<StoredObject | null>;
  exists(key: string): Promise<boolean>;
  /** Removes one object (no error when it is already gone). */
  delete(key: string): Promise<void>;
  /** Removes every object whose key starts with the prefix (a "folder" such as tiles/12/). */
  deletePrefix(prefix: string): Promise<void>;
  /** Every object whose key starts with the prefix, in no promised order. */
  list(prefix: string): AsyncIterable<StoredObject>;
  /** Renames an object (temp to final after a commit); an object already at `to` is replaced. */
  move(from: string, to: string): Promise<void>;
  /**
   * Replaces everything under `prefix` (ending in '/') with the files of a folder on this machine (a tile tree
   * libvips wrote), and removes the folder. The local driver renames it into place in one step.
   */
  putTree(localDir: string, prefix: string): Promise<void>;
  /** The absolute path of the object's file when the driver keeps files on this machine (local), else null. */
  localPath(key: string): string | null;
  /** A short-lived URL anyone holding it may read the object from (S3 only; null for the local driver). */
  signedUrl(key: string, seconds: number, opts?: { contentType?: string }): Promise<string | null>;
}

export class StorageNotFound extends Error {
  constructor(public key: string) {
    super(`No stored object ${key}`);
  }
}

/** Keys are relative, '/'-separated, without '.', '..' or empty segments: they can never leave the store's root. */
export function checkKey(key: string, { prefix = false } = {}) {
  const body = prefix && key.endsWith('/') ? key.slice(0, -1) : key;
  if (
    !body ||
    body.includes('\0') ||
    body.includes('\\') ||
    body.startsWith('/') ||
    body.split('/').some((s) => s === '' || s === '.' || s === '..')
  )
    throw new Error(`Bad storage key ${JSON.stringify(key)}`);
  return key;
}
