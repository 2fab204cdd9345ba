import { randomBytes } from 'node:crypto';
import { createWriteStream } from 'node:fs';
import { rename, utimes } from 'node:fs/promises';
import path from 'node:path';
import { pipeline } from 'node:stream/promises';
import { localTempPath, localUploadsRoot, storage } from '../storage/index.ts';
import { masterPath, tmpDir } from './paths.ts';

/** Files written for one photo, so a failure at any step can remove all of them. Every write goes through storage. */
export class WrittenFiles {
  private keys: string[] = [];

  /** Stores the bytes whole (the storage driver writes under a temporary name, so a reader never sees half a file). */
  async write(relative: string, data: Buffer) {
    this.keys.push(relative);
    await storage().put(relative, data);
  }

  /**
   * Stores a master under a temporary key in tmp/ (master-<sha256>.<ext>.<random>.part) and answers that key;
   * the caller moves it into place with moveIntoPlace once its transaction has committed. Until then no master
   * exists that no row points at: a process killed in between leaves only a temp object, which the reconciler
   * (server/media/reconcile.ts) removes after an hour, or moves into place if its photo row did commit.
   */
  async writeTemp(sha256: string, ext: string, data: Buffer) {
    const tmp = tempMasterPath(sha256, ext);
    this.keys.push(tmp);
    await storage().put(tmp, data);
    return tmp;
  }

  /** Like writeTemp, for an upload staged on this machine (absolute path): renamed by the local driver, not copied. */
  async moveTemp(sha256: string, ext: string, from: string) {
    const tmp = tempMasterPath(sha256, ext);
    this.keys.push(tmp);
    await storage().put(tmp, { file: from, move: true, sha256 });
    return tmp;
  }

  /** Takes charge of a temp master already stored (checkUpload sent it with object storage): removed on failure. */
  adopt(key: string) {
    this.keys.push(key);
    return key;
  }

  async removeAll() {
    for (const k of this.keys.reverse()) await storage().delete(k);
    this.keys = [];
  }
}

export async function exists(relative: string) {
  return storage().exists(relative);
}

/** The temporary name of a master being stored; the sha256 and extension in it let the reconciler finish a move. */
export function tempMasterPath(sha256: string, ext: string) {
  masterPath(sha256, ext); // checks both parts
  return path.posix.join(tmpDir(), `master-${sha256}.${ext}.${randomBytes(8).toString('hex')}.part`);
}

/** Parses a temp master name back into its sha256 and extension, or null for other temp files. */
export function parseTempMaster(name: string): { sha256: string; ext: string } | null {
  const m = /^master-([0-9a-f]{64})\.([a-z0-9]{1,5})\.[0-9a-f]{16}\.part$/.exec(name);
  return m ? { sha256: m[1], ext: m[2] } : null;
}

/** Moves a temp object to its final place (an identical master already there is simply replaced: same bytes). */
export async function moveIntoPlace(tmp: string, relative: string) {
  await storage().move(tmp, relative);
}

/** A master with this sha256 still under tmp/, waiting to be moved into place after its commit (or null). */
export async function pendingMaster(sha256: string) {
  for await (const o of storage().list(path.posix.join(tmpDir(), `master-${sha256}.`))) return o.key;
  return null;
}

export const hasPendingMaster = async (sha256: string) => (await pendingMaster(sha256)) !== null;

/**
 * The path on this machine of a master's file, for sharp to read from disk (never whole into memory: masters may be
 * gigabytes); inside the transaction that stored it (before the commit moves it into place) its temp object. With
 * object storage the master is downloaded once to UPLOADS_DIR/tmp/cache-<sha256>.<ext> (masters never change: a
 * copy is always right) and reused by the next region edit; the reconciler removes it an hour after its last use.
 */
export async function masterFileOnDisk(relative: string, sha256: string) {
  const store = storage();
  let key = relative;
  if (!(await store.exists(key))) {
    const pending = await pendingMaster(sha256);
    if (!pending) throw new Error(`The master ${relative} is missing`);
    key = pending;
  }
  const own = store.localPath(key);
  if (own) return own;
  const cached = path.join(localUploadsRoot(), tmpDir(), `cache-${path.posix.basename(relative)}`);
  const now = new Date();
  if (
    await utimes(cached, now, now).then(
      () => true,
      () => false,
    )
  )
    return cached;
  const part = await localTempPath('download');
  await pipeline(await store.get(key), createWriteStream(part));
  await rename(part, cached);
  return cached;
}
