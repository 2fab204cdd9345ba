import { Router } from 'express';
import type { Transaction } from 'sequelize';
import {
  colourParams,
  paletteColourUpdateSchema,
  photoParams,
  photoUpdateSchema,
  rectIssues,
  rectSchema,
  regionCreateSchema,
  regionParams,
  regionUpdateSchema,
} from '../../../shared/schemas/photo.ts';
import { actorOf, requireUser } from '../../http/auth.ts';
import { badRequest, forbidden, notFound } from '../../http/errors.ts';
import { parseBody, parseParams } from '../../http/validate.ts';
import { removePhotoFiles, repalette } from '../../media/pipeline.ts';
import { EXCLUDING_PURPOSES, type RepaletteScope } from '../../media/repalette.ts';
import { Job, PaletteColour, Region, sequelize, type Photo } from '../../models/index.ts';
import { TILE_JOB } from '../../jobs/handlers/tile-photo.ts';
import { can, type Actor } from '../../policies/index.ts';
import type { Action } from '../../../shared/abilities.ts';
import { presentPalettes, presentPhoto, presentRegion } from '../../presenters/photo.ts';
import { audit, type Changes } from '../../services/audit.ts';
import { reshare } from '../../services/palette-shares.ts';
import { loadReadablePhoto, loadWritablePhoto } from './load.ts';

export const photosRouter = Router();
photosRouter.use(requireUser);

async function writable(actor: Actor, id: number, action: Action) {
  const loaded = await loadWritablePhoto(actor, id);
  if (!can(actor, action)) throw forbidden();
  return loaded;
}

// Photo changes show in the piece's history when the photo belongs to a piece.
const auditPhoto = (ctx: { actor: Actor; transaction: Transaction }, photo: Photo, action: string, changes: Changes) =>
  audit(ctx, photo.pieceId != null ? 'piece' : 'photo', photo.pieceId ?? photo.id, action, { ...changes, photoId: { from: null, to: photo.id } });

function checkRect(r: Partial<{ x: number; y: number; w: number; h: number }>, photo: Photo) {
  const fields = rectIssues(r, photo);
  if (Object.keys(fields).length) throw badRequest('The rectangle does not fit on the photo.', { fields });
}

photosRouter.get('/:id', async (req, res) => {
  const actor = actorOf(req);
  const { photo } = await loadReadablePhoto(actor, parseParams(photoParams, req).id);
  const [palette, regions] = await Promise.all([PaletteColour.findAll({ where: { photoId: photo.id } }), Region.findAll({ where: { photoId: photo.id } })]);
  res.json({ photo: presentPhoto(photo, actor, { palette, regions }) });
});

photosRouter.patch('/:id', async (req, res) => {
  const actor = actorOf(req);
  const input = parseBody(photoUpdateSchema, req);
  const { photo } = await writable(actor, parseParams(photoParams, req).id, 'photo:update');
  await sequelize.transaction(async (transaction) => {
    const before = { caption: photo.caption, view: photo.view };
    await photo.update(input, { transaction });
    const changes = Object.fromEntries(Object.entries(input).map(([k, to]) => [k, { from: before[k as keyof typeof before], to }]));
    await auditPhoto({ actor, transaction }, photo, 'photo-updated', changes);
  });
  const [palette, regions] = await Promise.all([PaletteColour.findAll({ where: { photoId: photo.id } }), Region.findAll({ where: { photoId: photo.id } })]);
  res.json({ photo: presentPhoto(photo, actor, { palette, regions }) });
});

photosRouter.delete('/:id', async (req, res) => {
  const actor = actorOf(req);
  const { photo } = await writable(actor, parseParams(photoParams, req).id, 'photo:delete');
  await sequelize.transaction(async (transaction) => {
    await PaletteColour.destroy({ where: { photoId: photo.id }, transaction });
    await Region.destroy({ where: { photoId: photo.id }, transaction });
    // Tiling not yet started has nothing left to tile.
    await Job.destroy({ where: { type: TILE_JOB, subjectType: 'photo', subjectId: photo.id, state: 'queued' }, transaction });
    await photo.destroy({ transaction });
    await auditPhoto({ actor, transaction }, photo, 'photo-removed', { sha256: { from: photo.sha256, to: null } });
  });
  // Files go only after the rows are gone for good.
  await removePhotoFiles(photo);
  res.status(204).end();
});

/**
 * Run a change and the palette re-extraction it calls for in one transaction; answer the palettes.
 * A colour area or motif changes only its own palettes; an exclusion or a reference patch every
 * palette (see DEVELOPERS.md, Media and colour). `scope` is decided after the change.
 */
async function withRepalette<T>(photo: Photo, change: (t: Transaction) => Promise<T>, scope: (result: T) => RepaletteScope | null) {
  return sequelize.transaction(async (transaction) => {
    const result = await change(transaction);
    const chosen = scope(result);
    const palette = chosen ? await repalette({ transaction, photo, scope: chosen }) : await PaletteColour.findAll({ where: { photoId: photo.id }, transaction });
    return { result, palettes: presentPalettes(palette) };
  });
}

const scopeOf = (purposes: string[], regionId: number): RepaletteScope => (purposes.some((p) => EXCLUDING_PURPOSES.has(p)) ? 'all' : { regionId });

photosRouter.get('/:id/regions', async (req, res) => {
  const actor = actorOf(req);
  const { photo } = await loadReadablePhoto(actor, parseParams(photoParams, req).id);
  const regions = await Region.findAll({ where: { photoId: photo.id }, order: [['id', 'ASC']] });
  res.json({ items: regions.map(presentRegion) });
});

photosRouter.post('/:id/regions', async (req, res) => {
  const actor = actorOf(req);
  const input = parseBody(regionCreateSchema, req);
  const { photo } = await writable(actor, parseParams(photoParams, req).id, 'region:create');
  checkRect(input, photo);
  const { result: region, palettes } = await withRepalette(photo, async (transaction) => {
    const r = await Region.create({ ...input, label: input.label ?? null, photoId: photo.id, createdById: actor?.id ?? null }, { transaction });
    await auditPhoto({ actor, transaction }, photo, 'region-added', { region: { from: null, to: { ...input, id: r.id } } });
    return r;
  }, (r) => scopeOf([r.purpose], r.id));
  res.status(201).json({ region: presentRegion(region), palettes });
});

async function loadRegion(photo: Photo, regionId: number) {
  const region = await Region.findOne({ where: { id: regionId, photoId: photo.id } });
  if (!region) throw notFound('Region');
  return region;
}

photosRouter.patch('/:id/regions/:regionId', async (req, res) => {
  const actor = actorOf(req);
  const { id, regionId } = parseParams(regionParams, req);
  const input = parseBody(regionUpdateSchema, req);
  const { photo } = await writable(actor, id, 'region:update');
  const region = await loadRegion(photo, regionId);
  checkRect({ x: input.x ?? region.x, y: input.y ?? region.y, w: input.w ?? region.w, h: input.h ?? region.h }, photo);
  const before = presentRegion(region);
  const { palettes } = await withRepalette(photo, async (transaction) => {
    await region.update(input, { transaction });
    await auditPhoto({ actor, transaction }, photo, 'region-changed', { region: { from: before, to: presentRegion(region) } });
  }, () => scopeOf([before.purpose, region.purpose], region.id));
  res.json({ region: presentRegion(region), palettes });
});

photosRouter.delete('/:id/regions/:regionId', async (req, res) => {
  const actor = actorOf(req);
  const { id, regionId } = parseParams(regionParams, req);
  const { photo } = await writable(actor, id, 'region:delete');
  const region = await loadRegion(photo, regionId);
  const { palettes } = await withRepalette(photo, async (transaction) => {
    await PaletteColour.destroy({ where: { regionId: region.id }, transaction });
    await region.destroy({ transaction });
    await auditPhoto({ actor, transaction }, photo, 'region-removed', { region: { from: presentRegion(region), to: null } });
  }, () => (EXCLUDING_PURPOSES.has(region.purpose) ? 'all' : null));
  res.json({ palettes });
});

photosRouter.put('/:id/reference-patch', async (req, res) => {
  const actor = actorOf(req);
  const rect = parseBody(rectSchema, req);
  const { photo } = await writable(actor, parseParams(photoParams, req).id, 'region:update');
  checkRect(rect, photo);
  const before = photo.referencePatch;
  const { palettes } = await withRepalette(photo, async (transaction) => {
    await photo.update({ referencePatch: rect }, { transaction });
    await auditPhoto({ actor, transaction }, photo, 'reference-patch-set', { referencePatch: { from: before, to: rect } });
  }, () => 'all');
  res.json({ referencePatch: photo.referencePatch, palettes });
});

photosRouter.delete('/:id/reference-patch', async (req, res) => {
  const actor = actorOf(req);
  const { photo } = await writable(actor, parseParams(photoParams, req).id, 'region:delete');
  const before = photo.referencePatch;
  const { palettes } = await withRepalette(photo, async (transaction) => {
    await photo.update({ referencePatch: null, correction: null }, { transaction });
    await auditPhoto({ actor, transaction }, photo, 'reference-patch-cleared', { referencePatch: { from: before, to: null } });
  }, () => 'all');
  res.json({ referencePatch: null, palettes });
});

photosRouter.patch('/:id/palette/:colourId', async (req, res) => {
  const actor = actorOf(req);
  const { id, colourId } = parseParams(colourParams, req);
  const { background } = parseBody(paletteColourUpdateSchema, req);
  const { photo } = await writable(actor, id, 'region:update');
  const colour = await PaletteColour.findOne({ where: { id: colourId, photoId: photo.id } });
  if (!colour) throw notFound('Palette colour');
  const palettes = await sequelize.transaction(async (transaction) => {
    const siblings = await PaletteColour.findAll({ where: { photoId: photo.id, regionId: colour.regionId, variant: colour.variant }, transaction });
    for (const next of reshare(siblings, colour.id, background)) {
      // The toggled colour's flag is now the user's: a later recompute of this palette keeps it.
      const manual = next.id === colour.id ? { backgroundManual: true } : {};
      await PaletteColour.update({ share: next.share, background: next.background, ...manual }, { where: { id: next.id }, transaction });
    }
    await auditPhoto({ actor, transaction }, photo, 'palette-background', { [`colour ${colour.hex}`]: { from: colour.background, to: background } });
    return presentPalettes(await PaletteColour.findAll({ where: { photoId: photo.id }, transaction }));
  });
  res.json({ palettes });
});
