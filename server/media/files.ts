import { randomBytes } from 'node:crypto';
import { rename, rm, writeFile, access, readdir } from 'node:fs/promises';
import path from 'node:path';
import { ensureParent, masterPath, resolveInsideUploads, tmpDir } from './paths.ts';

/** Files written for one photo, so a failure at any step can remove all of them. */
export class WrittenFiles {
  private paths: string[] = [];

  /** Writes under a temporary name, then renames into place (a reader never sees half a file). */
  async write(relative: string, data: Buffer) {
    const tmp = path.posix.join(tmpDir(), `${randomBytes(8).toString('hex')}.part`);
    await ensureParent(tmp);
    await ensureParent(relative);
    this.paths.push(tmp);
    await writeFile(resolveInsideUploads(tmp), data);
    this.paths.push(relative);
    await rename(resolveInsideUploads(tmp), resolveInsideUploads(relative));
  }

  /**
   * Writes a master under a temporary name in tmp/ (master-<sha256>.<ext>.<random>.part) and answers that name;
   * the caller moves it into place with moveIntoPlace once its transaction has committed. Until then no master
   * exists that no row points at: a process killed in between leaves only a temp file, which the reconciler
   * (server/media/reconcile.ts) removes after an hour, or moves into place if its photo row did commit.
   */
  async writeTemp(sha256: string, ext: string, data: Buffer) {
    const tmp = tempMasterPath(sha256, ext);
    await ensureParent(tmp);
    this.paths.push(tmp);
    await writeFile(resolveInsideUploads(tmp), data);
    return tmp;
  }

  /** Like writeTemp, for an upload already on disk (absolute path under tmp/): renamed, not rewritten. */
  async moveTemp(sha256: string, ext: string, from: string) {
    const tmp = tempMasterPath(sha256, ext);
    await ensureParent(tmp);
    await rename(from, resolveInsideUploads(tmp));
    this.paths.push(tmp);
    return tmp;
  }

  async removeAll() {
    for (const p of this.paths.reverse()) await rm(resolveInsideUploads(p), { force: true });
    this.paths = [];
  }
}

export async function exists(relative: string) {
  try {
    await access(resolveInsideUploads(relative));
    return true;
  } catch {
    return false;
  }
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

/** Moves a temp file to its final place (an identical master already there is simply replaced: same bytes). */
export async function moveIntoPlace(tmp: string, relative: string) {
  await ensureParent(relative);
  await rename(resolveInsideUploads(tmp), resolveInsideUploads(relative));
}

/** A master with this sha256 still under tmp/, waiting to be moved into place after its commit (or null). */
export async function pendingMaster(sha256: string) {
  const names = await readdir(resolveInsideUploads(tmpDir())).catch(() => [] as string[]);
  const name = names.find((n) => n.startsWith(`master-${sha256}.`));
  return name ? path.posix.join(tmpDir(), name) : null;
}

export const hasPendingMaster = async (sha256: string) => (await pendingMaster(sha256)) !== null;

/**
 * The absolute path of a master's file, for sharp to read from disk (never whole into memory: masters may be
 * gigabytes); inside the transaction that stored it (before the commit moves it into place) its temp file.
 */
export async function masterFileOnDisk(relative: string, sha256: string) {
  const file = resolveInsideUploads(relative);
  try {
    await access(file);
    return file;
  } catch (err) {
    const pending = await pendingMaster(sha256);
    if (!pending) throw err;
    return resolveInsideUploads(pending);
  }
}
