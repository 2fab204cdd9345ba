import { Router, type Request, type Response } from 'express';
import { actorOf } from '../../http/auth.ts';
import { notFound } from '../../http/errors.ts';
import { parseParams } from '../../http/validate.ts';
import { Photo, Region } from '../../models/index.ts';
import { iiifPrefix } from '../../iiif/files.ts';
import { readText } from '../../storage/index.ts';
import { sendStored } from '../../storage/send.ts';
import { baseUrl, readablePhoto, readablePiece } from '../../iiif/access.ts';
import { buildManifest, regionAnnotationPage } from '../../iiif/manifest.ts';
import { iiifPhotoParams as photoParams, iiifPieceParams as pieceParams } from '../../../shared/schemas/iiif.ts';

// Mounted at /iiif (outside /api): IIIF clients expect plain URLs ending in info.json / manifest.json.
export const iiifRouter = Router();

// Level-0 tile paths as sharp writes them: {region}/{size}/0/default.jpg, or full/{w},{h}/0/default.jpg.
const TILE_PATH = /^(full|\d+,\d+,\d+,\d+)\/\d+,\d+\/0\/default\.jpg$/;

const cors = { 'Access-Control-Allow-Origin': '*', Vary: 'Accept' };

// JSON-LD with its profile, as the IIIF specifications ask; plain JSON for a client that asks only for that.
function sendLd(req: Request, res: Response, profile: string, body: unknown) {
  const type =
    req.accepts(['application/ld+json', 'application/json']) === 'application/json'
      ? 'application/json'
      : `application/ld+json; profile="${profile}"`;
  res.type(type).send(JSON.stringify(body));
}
// What a visitor may see is published and may be cached anywhere; staff views of drafts stay private.
const cacheFor = (req: Request) => (actorOf(req) === null ? 'public, max-age=86400' : 'private, max-age=300');

async function tiledPhoto(req: Request) {
  const { photoId } = parseParams(photoParams, req);
  const photo = await readablePhoto(actorOf(req), photoId);
  if (photo.ingestStage !== 'done') throw notFound('Tiles');
  return photo;
}

iiifRouter.get('/photos/:photoId/info.json', async (req, res) => {
  const photo = await tiledPhoto(req);
  const raw = await readText(`${iiifPrefix(photo.id)}info.json`).catch(() => null);
  if (!raw) throw notFound('Tiles');
  const info = JSON.parse(raw);
  info.id = `${baseUrl(req)}/iiif/photos/${photo.id}`;
  res.set({ ...cors, 'Cache-Control': cacheFor(req) });
  sendLd(req, res, 'http://iiif.io/api/image/3/context.json', info);
});

// The regions of one photo as a stand-alone AnnotationPage (the deep-zoom viewer draws them).
iiifRouter.get('/photos/:photoId/annotations.json', async (req, res) => {
  const { photoId } = parseParams(photoParams, req);
  const photo = await readablePhoto(actorOf(req), photoId);
  const regions = await Region.findAll({ where: { photoId: photo.id }, order: [['id', 'ASC']] });
  const base = baseUrl(req);
  const canvasId =
    photo.pieceId != null ? `${base}/iiif/${photo.pieceId}/canvas/${photo.id}` : `${base}/iiif/photos/${photo.id}`;
  const page = regionAnnotationPage(canvasId, regions, `${base}/iiif/photos/${photo.id}/annotations.json`);
  res.set({ ...cors, 'Cache-Control': cacheFor(req) });
  sendLd(req, res, 'http://www.w3.org/ns/anno.jsonld', { '@context': 'http://www.w3.org/ns/anno.jsonld', ...page });
});

iiifRouter.get('/photos/:photoId', (req, res) => {
  res.redirect(303, `${req.baseUrl}/photos/${encodeURIComponent(req.params.photoId)}/info.json`);
});

iiifRouter.get('/photos/:photoId/{*tile}', async (req, res) => {
  const tile = ([] as string[]).concat((req.params as { tile?: string[] }).tile ?? []).join('/');
  if (!TILE_PATH.test(tile)) throw notFound('Tile');
  const photo = await tiledPhoto(req);
  res.set({ ...cors, 'Cache-Control': cacheFor(req) });
  await sendStored(req, res, `${iiifPrefix(photo.id)}${tile}`, () => notFound('Tile'));
});

iiifRouter.get('/:pieceId/manifest.json', async (req, res) => {
  const { pieceId } = parseParams(pieceParams, req);
  const piece = await readablePiece(actorOf(req), pieceId);
  const photos = await Photo.findAll({
    where: { pieceId: piece.id },
    include: [{ model: Region, as: 'regions' }],
    order: [
      ['id', 'ASC'],
      [{ model: Region, as: 'regions' }, 'id', 'ASC'],
    ],
  });
  // A photo still being processed (or whose processing failed before its previews) has no image to paint yet.
  const shown = photos.filter((p) => p.derivatives.display);
  const manifest = await buildManifest(baseUrl(req), piece, shown);
  res.set({ ...cors, 'Cache-Control': cacheFor(req) });
  sendLd(req, res, 'http://iiif.io/api/presentation/3/context.json', manifest);
});

// Anything else under /iiif answers in the API's error shape rather than the client app.
iiifRouter.use((req, _res, next) => next(notFound(`IIIF resource ${req.path}`)));
