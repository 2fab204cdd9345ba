import { Op, type Transaction } from 'sequelize';
import {
  rectIssues,
  type PhotoUpdateInput,
  type Rect,
  type RegionCreateInput,
  type RegionUpdateInput,
} from '../../shared/schemas/photo.ts';
import { badRequest, conflict } from '../http/errors.ts';
import { enqueueIngest, INGEST_JOB } from '../jobs/handlers/ingest-photo.ts';
import { retry as retryJob } from '../jobs/queue.ts';
import { removePhotoFiles, repalette, storePhoto, type CheckedUpload, type IngestInput } from '../media/pipeline.ts';
import { EXCLUDING_PURPOSES, type RepaletteScope } from '../media/repalette.ts';
import { Job, PaletteColour, Region, type Photo } from '../models/index.ts';
import { presentRegion } from '../presenters/photo.ts';
import { audit, type Changes } from './audit.ts';
import type { ServiceCtx, TxCtx } from './context.ts';
import { reshare } from './palette-shares.ts';

/**
 * Photo writes: every change to a photo, its colour areas and its palette runs here in the caller's
 * transaction and writes its audit row there too. Files go only after the commit (removePhotoFiles).
 */

// Photo changes show in the piece's history when the photo belongs to a piece.
const auditPhoto = (ctx: TxCtx, photo: Photo, action: string, changes: Changes) =>
  audit(ctx, photo.pieceId != null ? 'piece' : 'photo', photo.pieceId ?? photo.id, action, {
    ...changes,
    photoId: { from: null, to: photo.id },
  });

function checkRect(r: Partial<Rect>, photo: Photo) {
  const fields = rectIssues(r, photo);
  if (Object.keys(fields).length) throw badRequest('The rectangle does not fit on the photo.', { fields });
}

/**
 * One uploaded photo: its master stored and its row written at stage `queued` (storePhoto), its ingest job queued
 * with them (a photo never exists without it; EXIF, derivatives, palette and tiles run there) and, for a piece, a
 * line in the piece's history. The master's temp file is removed if the transaction does not commit. Routes pass
 * the file already `checked` (checkUpload(), before they open the transaction), so it lasts only as long as the writes.
 */
export async function addPhoto({ actor, transaction, input }: ServiceCtx<IngestInput & { checked?: CheckedUpload }>) {
  let stored: Awaited<ReturnType<typeof storePhoto>> | null = null;
  try {
    stored = await storePhoto({ actor, transaction, input });
    const result = { photo: stored.photo };
    await enqueueIngest(result.photo.id, transaction, actor?.id ?? null);
    // In the history of what it belongs to: the piece, or the trial it is a swatch of.
    const owner =
      input.pieceId != null
        ? { entity: 'piece', id: input.pieceId }
        : input.trialId != null
          ? { entity: 'trial', id: input.trialId }
          : null;
    if (owner)
      await audit({ actor, transaction }, owner.entity, owner.id, 'photo-added', {
        photo: { from: null, to: result.photo.id },
      });
    return result;
  } catch (e) {
    if (stored) await stored.files.removeAll().catch(() => undefined);
    throw e;
  }
}

/**
 * Starts a failed ingest again (POST /api/photos/:id/ingest/retry): its job queued with fresh attempts and the photo
 * back to `queued`, one transaction with the audit row; 409 when the ingest has not failed. The steps skip what the
 * photo already has, so it resumes after the last step that finished.
 */
export async function retryIngest({ actor, transaction, input }: ServiceCtx<{ photo: Photo }>) {
  const { photo } = input;
  await photo.reload({ transaction, lock: transaction.LOCK.UPDATE });
  if (photo.ingestStage !== 'failed')
    throw conflict(
      `This photo's processing has not failed (it is ${photo.ingestStage}), so there is nothing to retry.`,
    );
  const job = await Job.findOne({
    where: { type: INGEST_JOB, subjectType: 'photo', subjectId: photo.id },
    order: [['id', 'DESC']],
    transaction,
    lock: transaction.LOCK.UPDATE,
  });
  if (job && job.state === 'failed') await retryJob(job, transaction);
  else if (!job || job.state === 'done') await enqueueIngest(photo.id, transaction, actor?.id ?? null);
  const before = photo.ingestError;
  await photo.update({ ingestStage: 'queued', ingestError: null }, { transaction });
  // A piece's history names the retry; a trial swatch's goes under the photo.
  await auditPhoto({ actor, transaction }, photo, 'photo-ingest-retried', { ingestError: { from: before, to: null } });
  return photo;
}

export async function updatePhoto({
  actor,
  transaction,
  input,
}: ServiceCtx<{ photo: Photo; changes: PhotoUpdateInput }>) {
  const { photo, changes: patch } = input;
  const before = { caption: photo.caption, view: photo.view };
  await photo.update(patch, { transaction });
  const changes = Object.fromEntries(
    Object.entries(patch).map(([k, to]) => [k, { from: before[k as keyof typeof before], to }]),
  );
  await auditPhoto({ actor, transaction }, photo, 'photo-updated', changes);
  return photo;
}

/** The rows of some photos and everything hanging off them; their files are removed once the transaction commits. */
export async function removePhotoRows(photos: Photo[], transaction: Transaction) {
  if (!photos.length) return;
  const ids = photos.map((p) => p.id);
  await PaletteColour.destroy({ where: { photoId: { [Op.in]: ids } }, transaction });
  await Region.destroy({ where: { photoId: { [Op.in]: ids } }, transaction });
  // Processing not yet started has nothing left to process.
  await Job.destroy({
    where: { type: INGEST_JOB, subjectType: 'photo', subjectId: { [Op.in]: ids }, state: 'queued' },
    transaction,
  });
  for (const photo of photos) await photo.destroy({ transaction });
  // Files go only after the rows are gone for good.
  transaction.afterCommit(async () => {
    for (const photo of photos) await removePhotoFiles(photo);
  });
}

export async function deletePhoto({ actor, transaction, input }: ServiceCtx<{ photo: Photo }>) {
  const { photo } = input;
  await removePhotoRows([photo], transaction);
  await auditPhoto({ actor, transaction }, photo, 'photo-removed', { sha256: { from: photo.sha256, to: null } });
}

/**
 * After a change, the palette re-extraction it calls for, in the same transaction. A colour area or motif
 * changes only its own palettes; an exclusion or a reference patch every palette (see DEVELOPERS.md,
 * Media and colour). Answers every palette of the photo.
 */
async function palettesAfter(photo: Photo, scope: RepaletteScope | null, transaction: Transaction) {
  return scope
    ? repalette({ transaction, photo, scope })
    : PaletteColour.findAll({ where: { photoId: photo.id }, transaction });
}

const scopeOf = (purposes: string[], regionId: number): RepaletteScope =>
  purposes.some((p) => EXCLUDING_PURPOSES.has(p)) ? 'all' : { regionId };

export async function addRegion({
  actor,
  transaction,
  input,
}: ServiceCtx<{ photo: Photo; region: RegionCreateInput }>) {
  const { photo, region: fields } = input;
  checkRect(fields, photo);
  const region = await Region.create(
    { ...fields, label: fields.label ?? null, photoId: photo.id, createdById: actor?.id ?? null },
    { transaction },
  );
  await auditPhoto({ actor, transaction }, photo, 'region-added', {
    region: { from: null, to: { ...fields, id: region.id } },
  });
  return { region, palette: await palettesAfter(photo, scopeOf([region.purpose], region.id), transaction) };
}

export async function updateRegion({
  actor,
  transaction,
  input,
}: ServiceCtx<{ photo: Photo; region: Region; changes: RegionUpdateInput }>) {
  const { photo, region, changes } = input;
  checkRect(
    { x: changes.x ?? region.x, y: changes.y ?? region.y, w: changes.w ?? region.w, h: changes.h ?? region.h },
    photo,
  );
  const before = presentRegion(region);
  await region.update(changes, { transaction });
  await auditPhoto({ actor, transaction }, photo, 'region-changed', {
    region: { from: before, to: presentRegion(region) },
  });
  return {
    region,
    palette: await palettesAfter(photo, scopeOf([before.purpose, region.purpose], region.id), transaction),
  };
}

export async function removeRegion({ actor, transaction, input }: ServiceCtx<{ photo: Photo; region: Region }>) {
  const { photo, region } = input;
  await PaletteColour.destroy({ where: { regionId: region.id }, transaction });
  await region.destroy({ transaction });
  await auditPhoto({ actor, transaction }, photo, 'region-removed', {
    region: { from: presentRegion(region), to: null },
  });
  return { palette: await palettesAfter(photo, EXCLUDING_PURPOSES.has(region.purpose) ? 'all' : null, transaction) };
}

export async function setReferencePatch({ actor, transaction, input }: ServiceCtx<{ photo: Photo; rect: Rect }>) {
  const { photo, rect } = input;
  checkRect(rect, photo);
  const before = photo.referencePatch;
  await photo.update({ referencePatch: rect }, { transaction });
  await auditPhoto({ actor, transaction }, photo, 'reference-patch-set', {
    referencePatch: { from: before, to: rect },
  });
  return { palette: await palettesAfter(photo, 'all', transaction) };
}

export async function clearReferencePatch({ actor, transaction, input }: ServiceCtx<{ photo: Photo }>) {
  const { photo } = input;
  const before = photo.referencePatch;
  await photo.update({ referencePatch: null, correction: null }, { transaction });
  await auditPhoto({ actor, transaction }, photo, 'reference-patch-cleared', {
    referencePatch: { from: before, to: null },
  });
  return { palette: await palettesAfter(photo, 'all', transaction) };
}

/** Mark a palette colour as background (or not); the other colours of its palette share again without it. */
export async function setPaletteBackground({
  actor,
  transaction,
  input,
}: ServiceCtx<{ photo: Photo; colour: PaletteColour; background: boolean }>) {
  const { photo, colour, background } = input;
  const siblings = await PaletteColour.findAll({
    where: { photoId: photo.id, regionId: colour.regionId, variant: colour.variant },
    transaction,
  });
  for (const next of reshare(siblings, colour.id, background)) {
    // The toggled colour's flag is now the user's: a later recompute of this palette keeps it.
    const manual = next.id === colour.id ? { backgroundManual: true } : {};
    await PaletteColour.update(
      { share: next.share, background: next.background, ...manual },
      { where: { id: next.id }, transaction },
    );
  }
  await auditPhoto({ actor, transaction }, photo, 'palette-background', {
    [`colour ${colour.hex}`]: { from: colour.background, to: background },
  });
  return { palette: await PaletteColour.findAll({ where: { photoId: photo.id }, transaction }) };
}
