import { randomBytes } from 'node:crypto';
import { createReadStream, createWriteStream } from 'node:fs';
import { cp, mkdir, readdir, rename, rm, stat, writeFile } from 'node:fs/promises';
import path from 'node:path';
import { Readable, Writable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import { hashingStream, sha256OfBuffer } from './hash.ts';
import {
  checkKey,
  StorageNotFound,
  type ByteRange,
  type PutSource,
  type StorageDriver,
  type StoredObject,
} from './types.ts';

/** Renames, or copies and removes when the two paths are on different file systems. */
async function moveFile(from: string, to: string) {
  try {
    await rename(from, to);
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code !== 'EXDEV') throw err;
    await cp(from, to, { recursive: true });
    await rm(from, { recursive: true, force: true });
  }
}

/**
 * The local driver: objects are files under one folder (UPLOADS_DIR), the key being the path below it. Every write
 * goes to a temp file under <root>/tmp/ first and is renamed into place, so a reader never sees half a file; the
 * orphan reconciler (server/media/reconcile.ts) sweeps temp files left by a process that died.
 */
export class LocalStorage implements StorageDriver {
  readonly kind = 'local' as const;
  readonly root: string;

  constructor(root: string) {
    this.root = path.resolve(root);
  }

  private abs(key: string, opts?: { prefix?: boolean }) {
    checkKey(key, opts);
    return path.join(this.root, ...key.split('/').filter(Boolean));
  }

  private async tempFile() {
    const dir = path.join(this.root, 'tmp');
    await mkdir(dir, { recursive: true });
    return path.join(dir, `${randomBytes(8).toString('hex')}.part`);
  }

  localPath(key: string) {
    return this.abs(key);
  }

  async put(key: string, source: PutSource) {
    const target = this.abs(key);
    await mkdir(path.dirname(target), { recursive: true });
    if (!Buffer.isBuffer(source) && !(source instanceof Readable) && source.move) {
      // An upload already on this disk: renamed (never copied); hashed by one read unless the caller knows its hash.
      if (source.sha256) {
        const { size } = await stat(source.file);
        await moveFile(source.file, target);
        return { bytes: size, sha256: source.sha256 };
      }
      const { stream, result } = hashingStream();
      await pipeline(createReadStream(source.file), stream, new Writable({ write: (_c, _e, done) => done() }));
      await moveFile(source.file, target);
      return result();
    }
    const tmp = await this.tempFile();
    try {
      let out;
      if (Buffer.isBuffer(source)) {
        await writeFile(tmp, source);
        out = { bytes: source.length, sha256: sha256OfBuffer(source) };
      } else {
        const { stream, result } = hashingStream();
        const input = source instanceof Readable ? source : createReadStream(source.file);
        await pipeline(input, stream, createWriteStream(tmp));
        out = result();
      }
      await rename(tmp, target);
      return out;
    } catch (err) {
      await rm(tmp, { force: true });
      throw err;
    }
  }

  async get(key: string, range?: ByteRange) {
    const file = this.abs(key);
    const s = await stat(file).catch(() => null);
    if (!s?.isFile()) throw new StorageNotFound(key);
    return createReadStream(file, range ? { start: range.start, end: range.end } : {});
  }

  async stat(key: string): Promise<StoredObject | null> {
    const s = await stat(this.abs(key)).catch(() => null);
    return s?.isFile() ? { key, bytes: s.size, modifiedAt: s.mtime } : null;
  }

  async exists(key: string) {
    return (await this.stat(key)) !== null;
  }

  async delete(key: string) {
    await rm(this.abs(key), { force: true });
  }

  async deletePrefix(prefix: string) {
    if (prefix.endsWith('/')) {
      await rm(this.abs(prefix, { prefix: true }), { recursive: true, force: true });
      return;
    }
    for await (const o of this.list(prefix)) await this.delete(o.key);
  }

  async *list(prefix: string): AsyncIterable<StoredObject> {
    if (prefix) checkKey(prefix, { prefix: true });
    const dirKey = prefix.includes('/') ? prefix.slice(0, prefix.lastIndexOf('/')) : '';
    const dir = dirKey ? this.abs(dirKey) : this.root;
    const entries = await readdir(dir, { recursive: true, withFileTypes: true }).catch(() => []);
    for (const e of entries) {
      if (!e.isFile()) continue;
      const key = path.relative(this.root, path.join(e.parentPath, e.name)).split(path.sep).join('/');
      if (!key.startsWith(prefix)) continue;
      const s = await stat(path.join(e.parentPath, e.name)).catch(() => null);
      if (s) yield { key, bytes: s.size, modifiedAt: s.mtime };
    }
  }

  async move(from: string, to: string) {
    const target = this.abs(to);
    await mkdir(path.dirname(target), { recursive: true });
    await moveFile(this.abs(from), target);
  }

  async putTree(localDir: string, prefix: string) {
    if (!prefix.endsWith('/')) throw new Error(`A tree's prefix ends with '/': ${prefix}`);
    const target = this.abs(prefix, { prefix: true });
    await mkdir(path.dirname(target), { recursive: true });
    await rm(target, { recursive: true, force: true });
    await moveFile(localDir, target);
  }

  async signedUrl() {
    return null;
  }
}
