import { Router } from 'express';
import type { Transaction } from 'sequelize';
import {
  colourParams,
  paletteColourUpdateSchema,
  photoParams,
  photoUpdateSchema,
  rectSchema,
  regionCreateSchema,
  regionParams,
  regionUpdateSchema,
} from '../../../shared/schemas/photo.ts';
import { actorOf, requireUser } from '../../http/auth.ts';
import { forbidden, notFound } from '../../http/errors.ts';
import { parseBody, parseParams } from '../../http/validate.ts';
import { PaletteColour, Region, sequelize, type Photo } from '../../models/index.ts';
import { can, type Actor } from '../../policies/index.ts';
import type { Action } from '../../../shared/abilities.ts';
import { presentIngest, presentPalettes, presentPhoto, presentRegion } from '../../presenters/photo.ts';
import {
  addRegion,
  clearReferencePatch,
  deletePhoto,
  removeRegion,
  retryIngest,
  setPaletteBackground,
  setReferencePatch,
  updatePhoto,
  updateRegion,
} from '../../services/photos.ts';
import { loadReadablePhoto, loadWritablePhoto } from './load.ts';
import { chartInputSchema, toleranceLevelsInput } from '../../../shared/schemas/chart.ts';
import { chartTolerances, clearChart, setChart, setChartTolerances } from '../../services/photo-chart.ts';

export const photosRouter = Router();
photosRouter.use(requireUser);

async function writable(actor: Actor, id: number, action: Action) {
  const loaded = await loadWritablePhoto(actor, id);
  if (!can(actor, action)) throw forbidden();
  return loaded;
}

/** The imaging tolerance levels a chart's capture is graded against (admins change them, naming their source). */
photosRouter.get('/chart-tolerances', async (_req, res) => {
  res.json(await chartTolerances());
});

photosRouter.put('/chart-tolerances', async (req, res) => {
  const actor = actorOf(req);
  const input = parseBody(toleranceLevelsInput, req);
  if (!can(actor, 'reference:manage')) throw forbidden('Only admins change the imaging tolerance levels.');
  res.json(await sequelize.transaction((transaction) => setChartTolerances({ actor, transaction, input })));
});

photosRouter.get('/:id', async (req, res) => {
  const actor = actorOf(req);
  const { photo } = await loadReadablePhoto(actor, parseParams(photoParams, req).id);
  const [palette, regions] = await Promise.all([
    PaletteColour.findAll({ where: { photoId: photo.id } }),
    Region.findAll({ where: { photoId: photo.id } }),
  ]);
  res.json({ photo: presentPhoto(photo, actor, { palette, regions }) });
});

/** A failed ingest starts again (who may edit the photo); 409 when it has not failed. */
photosRouter.post('/:id/ingest/retry', async (req, res) => {
  const actor = actorOf(req);
  const { photo } = await writable(actor, parseParams(photoParams, req).id, 'photo:update');
  await sequelize.transaction((transaction) => retryIngest({ actor, transaction, input: { photo } }));
  res.json({ ingest: presentIngest(photo) });
});

photosRouter.patch('/:id', async (req, res) => {
  const actor = actorOf(req);
  const input = parseBody(photoUpdateSchema, req);
  const { photo } = await writable(actor, parseParams(photoParams, req).id, 'photo:update');
  await sequelize.transaction((transaction) => updatePhoto({ actor, transaction, input: { photo, changes: input } }));
  const [palette, regions] = await Promise.all([
    PaletteColour.findAll({ where: { photoId: photo.id } }),
    Region.findAll({ where: { photoId: photo.id } }),
  ]);
  res.json({ photo: presentPhoto(photo, actor, { palette, regions }) });
});

photosRouter.delete('/:id', async (req, res) => {
  const actor = actorOf(req);
  const { photo } = await writable(actor, parseParams(photoParams, req).id, 'photo:delete');
  // The files go once the rows are gone for good (after the commit).
  await sequelize.transaction((transaction) => deletePhoto({ actor, transaction, input: { photo } }));
  res.status(204).end();
});

/** Run a photo service in one transaction (palette re-extraction included) and present the palettes it answers. */
async function inTransaction<T extends { palette: PaletteColour[] }>(work: (transaction: Transaction) => Promise<T>) {
  const result = await sequelize.transaction(work);
  return { ...result, palettes: presentPalettes(result.palette) };
}

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
  const { region, palettes } = await inTransaction((transaction) =>
    addRegion({ actor, transaction, input: { photo, region: input } }),
  );
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
  const { palettes } = await inTransaction((transaction) =>
    updateRegion({ actor, transaction, input: { photo, region, changes: input } }),
  );
  res.json({ region: presentRegion(region), palettes });
});

photosRouter.delete('/:id/regions/:regionId', async (req, res) => {
  const actor = actorOf(req);
  const { id, regionId } = parseParams(regionParams, req);
  const { photo } = await writable(actor, id, 'region:delete');
  const region = await loadRegion(photo, regionId);
  const { palettes } = await inTransaction((transaction) =>
    removeRegion({ actor, transaction, input: { photo, region } }),
  );
  res.json({ palettes });
});

photosRouter.put('/:id/reference-patch', async (req, res) => {
  const actor = actorOf(req);
  const rect = parseBody(rectSchema, req);
  const { photo } = await writable(actor, parseParams(photoParams, req).id, 'region:update');
  const { palettes } = await inTransaction((transaction) =>
    setReferencePatch({ actor, transaction, input: { photo, rect } }),
  );
  res.json({ referencePatch: photo.referencePatch, palettes });
});

photosRouter.delete('/:id/reference-patch', async (req, res) => {
  const actor = actorOf(req);
  const { photo } = await writable(actor, parseParams(photoParams, req).id, 'region:delete');
  const { palettes } = await inTransaction((transaction) =>
    clearReferencePatch({ actor, transaction, input: { photo } }),
  );
  res.json({ referencePatch: null, palettes });
});

photosRouter.patch('/:id/palette/:colourId', async (req, res) => {
  const actor = actorOf(req);
  const { id, colourId } = parseParams(colourParams, req);
  const { background } = parseBody(paletteColourUpdateSchema, req);
  const { photo } = await writable(actor, id, 'region:update');
  const colour = await PaletteColour.findOne({ where: { id: colourId, photoId: photo.id } });
  if (!colour) throw notFound('Palette colour');
  const { palettes } = await inTransaction((transaction) =>
    setPaletteBackground({ actor, transaction, input: { photo, colour, background } }),
  );
  res.json({ palettes });
});

/** Mark the photo's colour chart by its four corner patches: fit, grade and a calibrated palette. */
photosRouter.put('/:id/chart', async (req, res) => {
  const actor = actorOf(req);
  const chart = parseBody(chartInputSchema, req);
  const { photo } = await writable(actor, parseParams(photoParams, req).id, 'region:update');
  const result = await inTransaction((transaction) => setChart({ actor, transaction, input: { photo, chart } }));
  res.json({ chart: result.chart, palettes: result.palettes });
});

photosRouter.delete('/:id/chart', async (req, res) => {
  const actor = actorOf(req);
  const { photo } = await writable(actor, parseParams(photoParams, req).id, 'region:delete');
  const { palettes } = await inTransaction((transaction) => clearChart({ actor, transaction, input: { photo } }));
  res.json({ chart: null, palettes });
});
