import { readdir, rm, stat } from 'node:fs/promises';
import path from 'node:path';
import { Op } from 'sequelize';
import { Photo } from '../models/index.ts';
import { exists, moveIntoPlace, parseTempMaster } from './files.ts';
import { masterPath, resolveInsideUploads, tmpDir } from './paths.ts';
import type { FixityOrphan } from '../../shared/schemas/fixity.ts';

/**
 * How old an unreferenced file must be before it is removed. An upload writes its master under tmp/ and moves it
 * into place right after its transaction commits, so a file that old belongs to no upload still running.
 * One hour: common practice for sweeping temporary files, with wide room for a slow upload.
 */
export const ORPHAN_AGE_MS = 60 * 60_000;

const MASTER_NAME = /^([0-9a-f]{64})\.([a-z0-9]{1,5})$/;

async function list(relative: string) {
  try {
    return await readdir(resolveInsideUploads(relative), { withFileTypes: true });
  } catch {
    return [];
  }
}

/**
 * Remove files under uploads/ that no photo row points at and that are older than ORPHAN_AGE_MS: masters
 * (masters/<xx>/<sha256>.<ext> with no photo of that sha256), temp files (tmp/: masters waiting for their commit, and
 * uploads streamed to disk, tmp/upload-<random>.part, left by a process that died mid-request), and the derivatives
 * and tiles folders of photos that do not exist (reconcileOrphanFolders). A temp master whose photo row
 * did commit but whose move was cut short is moved into place instead of removed. Run at start
 * (server/index.ts) and by the fixity check, which reports what was removed. Safe on several servers at once: a
 * file another server removed first is simply gone.
 */
export async function reconcileOrphans(opts: { olderThanMs?: number; now?: Date } = {}): Promise<FixityOrphan[]> {
  return [...(await reconcileOrphanFiles(opts)), ...(await reconcileOrphanFolders(opts))];
}

async function reconcileOrphanFiles(opts: { olderThanMs?: number; now?: Date }): Promise<FixityOrphan[]> {
  const cutoff = (opts.now ?? new Date()).getTime() - (opts.olderThanMs ?? ORPHAN_AGE_MS);
  const candidates: Array<{ file: string; kind: 'master' | 'temp'; sha256: string | null; ext: string | null }> = [];
  for (const dir of await list('masters')) {
    if (!dir.isDirectory()) continue;
    for (const f of await list(path.posix.join('masters', dir.name))) {
      const m = MASTER_NAME.exec(f.name);
      if (f.isFile() && m)
        candidates.push({
          file: path.posix.join('masters', dir.name, f.name),
          kind: 'master',
          sha256: m[1],
          ext: m[2],
        });
    }
  }
  for (const f of await list(tmpDir())) {
    if (!f.isFile()) continue;
    const parsed = parseTempMaster(f.name);
    candidates.push({
      file: path.posix.join(tmpDir(), f.name),
      kind: 'temp',
      ...(parsed ?? { sha256: null, ext: null }),
    });
  }
  const old: Array<(typeof candidates)[number] & { bytes: number; modifiedAt: Date }> = [];
  for (const c of candidates) {
    const s = await stat(resolveInsideUploads(c.file)).catch(() => null);
    if (s && s.mtimeMs < cutoff) old.push({ ...c, bytes: s.size, modifiedAt: s.mtime });
  }
  if (!old.length) return [];
  const shas = [...new Set(old.map((c) => c.sha256).filter((s): s is string => s !== null))];
  const referenced = new Set(
    shas.length
      ? (await Photo.findAll({ attributes: ['sha256'], where: { sha256: { [Op.in]: shas } } })).map((p) => p.sha256)
      : [],
  );
  const removed: FixityOrphan[] = [];
  for (const c of old) {
    if (c.sha256 && referenced.has(c.sha256)) {
      if (c.kind === 'master') continue;
      // The row committed but the process died before the move: finish it, unless the master is already there.
      const target = masterPath(c.sha256, c.ext!);
      if (!(await exists(target))) {
        await moveIntoPlace(c.file, target).catch(() => undefined);
        continue;
      }
    }
    await rm(resolveInsideUploads(c.file), { force: true });
    removed.push({ file: c.file, kind: c.kind, bytes: c.bytes, modifiedAt: c.modifiedAt.toISOString() });
  }
  return removed;
}

/** Bytes and newest change time of everything under a folder. */
async function folderStat(relative: string): Promise<{ bytes: number; newest: number }> {
  let bytes = 0;
  let newest = 0;
  const s = await stat(resolveInsideUploads(relative)).catch(() => null);
  if (s) newest = s.mtimeMs;
  for (const e of await list(relative)) {
    const child = path.posix.join(relative, e.name);
    if (e.isDirectory()) {
      const sub = await folderStat(child);
      bytes += sub.bytes;
      newest = Math.max(newest, sub.newest);
    } else {
      const f = await stat(resolveInsideUploads(child)).catch(() => null);
      if (f) {
        bytes += f.size;
        newest = Math.max(newest, f.mtimeMs);
      }
    }
  }
  return { bytes, newest };
}

/**
 * Derivatives and tiles folders (derivatives/<photoId>, tiles/<photoId>) of photos that do not exist: written by an
 * upload whose transaction never committed (the process died, or the write failed after the pipeline ran), or left
 * behind by a delete cut short. Removed once nothing in them changed for ORPHAN_AGE_MS, so an upload still running
 * (its row not yet committed) keeps its folder.
 */
export async function reconcileOrphanFolders(opts: { olderThanMs?: number; now?: Date } = {}): Promise<FixityOrphan[]> {
  const cutoff = (opts.now ?? new Date()).getTime() - (opts.olderThanMs ?? ORPHAN_AGE_MS);
  const found: Array<{ kind: 'derivatives' | 'tiles'; id: number; file: string }> = [];
  for (const kind of ['derivatives', 'tiles'] as const)
    for (const e of await list(kind))
      if (e.isDirectory() && /^[1-9][0-9]{0,9}$/.test(e.name))
        found.push({ kind, id: Number(e.name), file: path.posix.join(kind, e.name) });
  if (!found.length) return [];
  const ids = [...new Set(found.map((f) => f.id))];
  const existing = new Set(
    (await Photo.findAll({ attributes: ['id'], where: { id: { [Op.in]: ids } }, raw: true })).map((p) => p.id),
  );
  const removed: FixityOrphan[] = [];
  for (const f of found) {
    if (existing.has(f.id)) continue;
    const { bytes, newest } = await folderStat(f.file);
    if (newest >= cutoff) continue;
    await rm(resolveInsideUploads(f.file), { recursive: true, force: true });
    removed.push({ file: f.file, kind: f.kind, bytes, modifiedAt: new Date(newest).toISOString() });
  }
  return removed;
}
