import path from 'node:path';
import { Op } from 'sequelize';
import { Photo } from '../models/index.ts';
import { exists, moveIntoPlace, parseTempMaster } from './files.ts';
import { masterPath, tmpDir } from './paths.ts';
import { LocalStorage, localUploadsRoot, storage, type StorageDriver } from '../storage/index.ts';
import type { FixityOrphan } from '../../shared/schemas/fixity.ts';

/**
 * How old an unreferenced file must be before it is removed. An upload writes its master under tmp/ and moves it
 * into place right after its transaction commits, so a file that old belongs to no upload still running.
 * One hour: common practice for sweeping temporary files, with wide room for a slow upload.
 */
export const ORPHAN_AGE_MS = 60 * 60_000;

const MASTER_KEY = /^masters\/[0-9a-f]{2}\/([0-9a-f]{64})\.([a-z0-9]{1,5})$/;

/**
 * Where temp files live: tmp/ in storage (masters waiting for their commit) and, when storage is not this machine's
 * uploads folder, UPLOADS_DIR/tmp too (uploads staged on disk, masters downloaded for sharp, tile trees being built).
 */
function tempStores(): StorageDriver[] {
  const store = storage();
  return store.kind === 'local' ? [store] : [store, new LocalStorage(localUploadsRoot())];
}

/**
 * Remove stored objects (server/storage) that no photo row points at and that are older than ORPHAN_AGE_MS: masters
 * (masters/<xx>/<sha256>.<ext> with no photo of that sha256), temp files (tmp/: masters waiting for their commit, and
 * uploads streamed to disk, tmp/upload-<random>.part, left by a process that died mid-request), and the derivatives
 * and tiles folders of photos that do not exist (reconcileOrphanFolders). A temp master whose photo row
 * did commit but whose move was cut short is moved into place instead of removed. Run at start
 * (server/index.ts) and by the fixity check, which reports what was removed. Safe on several servers at once: a
 * file another server removed first is simply gone. With object storage each server also sweeps its own
 * UPLOADS_DIR/tmp. Works from listings (server/storage list()), so the same code serves both drivers.
 */
export async function reconcileOrphans(opts: { olderThanMs?: number; now?: Date } = {}): Promise<FixityOrphan[]> {
  return [...(await reconcileOrphanFiles(opts)), ...(await reconcileOrphanFolders(opts))];
}

async function reconcileOrphanFiles(opts: { olderThanMs?: number; now?: Date }): Promise<FixityOrphan[]> {
  const cutoff = (opts.now ?? new Date()).getTime() - (opts.olderThanMs ?? ORPHAN_AGE_MS);
  type Candidate = {
    file: string;
    kind: 'master' | 'temp';
    sha256: string | null;
    ext: string | null;
    bytes: number;
    modifiedAt: Date;
    store: StorageDriver;
  };
  const old: Candidate[] = [];
  const store = storage();
  for await (const o of store.list('masters/')) {
    const m = MASTER_KEY.exec(o.key);
    if (m && o.modifiedAt.getTime() < cutoff)
      old.push({
        file: o.key,
        kind: 'master',
        sha256: m[1],
        ext: m[2],
        bytes: o.bytes,
        modifiedAt: o.modifiedAt,
        store,
      });
  }
  for (const s of tempStores())
    for await (const o of s.list(`${tmpDir()}/`)) {
      if (o.modifiedAt.getTime() >= cutoff) continue;
      // Only temp masters in storage can be finished; anything staged on this machine is a plain temp file.
      const parsed = s === store ? parseTempMaster(path.posix.basename(o.key)) : null;
      old.push({
        file: o.key,
        kind: 'temp',
        ...(parsed ?? { sha256: null, ext: null }),
        bytes: o.bytes,
        modifiedAt: o.modifiedAt,
        store: s,
      });
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
    await c.store.delete(c.file);
    removed.push({ file: c.file, kind: c.kind, bytes: c.bytes, modifiedAt: c.modifiedAt.toISOString() });
  }
  return removed;
}

/**
 * Derivatives and tiles folders (derivatives/<photoId>/, tiles/<photoId>/) of photos that do not exist: written by
 * an upload whose transaction never committed (the process died, or the write failed after the pipeline ran), or
 * left behind by a delete cut short. Removed once nothing in them changed for ORPHAN_AGE_MS, so an upload still
 * running (its row not yet committed) keeps its folder.
 */
export async function reconcileOrphanFolders(opts: { olderThanMs?: number; now?: Date } = {}): Promise<FixityOrphan[]> {
  const cutoff = (opts.now ?? new Date()).getTime() - (opts.olderThanMs ?? ORPHAN_AGE_MS);
  const store = storage();
  const found = new Map<string, { kind: 'derivatives' | 'tiles'; id: number; bytes: number; newest: number }>();
  for (const kind of ['derivatives', 'tiles'] as const)
    for await (const o of store.list(`${kind}/`)) {
      const m = /^[^/]+\/([1-9][0-9]{0,9})\//.exec(o.key);
      if (!m) continue;
      const folder = `${kind}/${m[1]}`;
      const f = found.get(folder) ?? found.set(folder, { kind, id: Number(m[1]), bytes: 0, newest: 0 }).get(folder)!;
      f.bytes += o.bytes;
      f.newest = Math.max(f.newest, o.modifiedAt.getTime());
    }
  if (!found.size) return [];
  const ids = [...new Set([...found.values()].map((f) => f.id))];
  const existing = new Set(
    (await Photo.findAll({ attributes: ['id'], where: { id: { [Op.in]: ids } }, raw: true })).map((p) => p.id),
  );
  const removed: FixityOrphan[] = [];
  for (const [folder, f] of found) {
    if (existing.has(f.id) || f.newest >= cutoff) continue;
    await store.deletePrefix(`${folder}/`);
    removed.push({ file: folder, kind: f.kind, bytes: f.bytes, modifiedAt: new Date(f.newest).toISOString() });
  }
  return removed;
}
