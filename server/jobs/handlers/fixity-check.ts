import { createHash } from 'node:crypto';
import { pipeline } from 'node:stream/promises';
import { Photo } from '../../models/index.ts';
import { findMaster } from '../../iiif/files.ts';
import { registerHandler } from '../registry.ts';
import { reconcileOrphans } from '../../media/reconcile.ts';
import { storage } from '../../storage/index.ts';
import { sweepExpiredUploads } from '../../routes/uploads/index.ts';
import type { FixityReport } from '../../../shared/schemas/fixity.ts';

export const FIXITY_JOB = 'fixity-check';

/** SHA-256 of a stored object, streamed from storage (never whole in memory). */
export async function sha256Stored(key: string) {
  const hash = createHash('sha256');
  await pipeline(await storage().get(key), hash);
  return hash.digest('hex');
}

/**
 * Re-hash every master (streamed from storage, either driver) and compare with the sha256 recorded at upload (the file's name and the photo rows); then
 * remove orphan files (no photo points at them, older than an hour) and list them in the report.
 */
registerHandler(FIXITY_JOB, {
  async run(_job, ctx) {
    const rows = await Photo.findAll({ attributes: ['id', 'sha256', 'format', 'derivatives'], order: [['id', 'ASC']] });
    // Photos sharing a sha256 share one stored master: check each master once.
    const bySha = new Map<string, Photo[]>();
    for (const r of rows) (bySha.get(r.sha256) ?? bySha.set(r.sha256, []).get(r.sha256)!).push(r);
    const report: FixityReport = {
      checkedAt: '',
      masters: bySha.size,
      ok: 0,
      mismatches: [],
      missing: [],
      orphans: [],
    };
    let done = 0;
    for (const [sha256, photos] of bySha) {
      const photoIds = photos.map((p) => p.id);
      // A row whose recorded name cannot be a stored master counts as missing; one bad row must not stop the check.
      const file = await findMaster(photos[0]).catch(() => null);
      if (!file) report.missing.push({ sha256, photoIds, file: null });
      else {
        const actual = await sha256Stored(file).catch(() => null);
        if (actual === null) report.missing.push({ sha256, photoIds, file });
        else if (actual !== sha256) report.mismatches.push({ sha256, photoIds, file, actual });
        else report.ok += 1;
      }
      done += 1;
      if (done % 10 === 0 || done === bySha.size) await ctx.progress(done / bySha.size);
    }
    report.orphans = await reconcileOrphans();
    // Resumable uploads abandoned for longer than their expiry go with the orphans.
    await sweepExpiredUploads();
    report.checkedAt = new Date().toISOString();
    return report;
  },
});
