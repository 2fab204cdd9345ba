import { randomBytes } from 'node:crypto';
import { rename, rm, writeFile, access } from 'node:fs/promises';
import path from 'node:path';
import { ensureParent, resolveInsideUploads, tmpDir } from './paths.ts';

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
