import { mayCarryGps } from '../../presenters/photo.ts';
import { Router } from 'express';
import { mediaParams } from '../../../shared/schemas/photo.ts';
import { actorOf } from '../../http/auth.ts';
import { notFound, unauthorized } from '../../http/errors.ts';
import { parseParams } from '../../http/validate.ts';
import { photoKey } from '../../media/pipeline.ts';
import { sendStored } from '../../storage/send.ts';
import { can } from '../../policies/index.ts';
import { loadReadablePhoto } from '../photos/load.ts';

/** Image files behind the same read rule as their piece: visitors only for published pieces. */
export const mediaRouter = Router();

mediaRouter.get('/photos/:id/:kind', async (req, res) => {
  const actor = actorOf(req);
  const { id, kind } = parseParams(mediaParams, req);
  const { photo } = await loadReadablePhoto(actor, id);
  // The master keeps its EXIF and GPS tags untouched: signed-in users only, and with GPS only roles that may see it.
  if (kind === 'master' && !can(actor, 'photo:master', { hasGps: mayCarryGps(photo) })) {
    if (!actor) throw unauthorized('Sign in to download the master file.');
    throw notFound('Photo');
  }
  const key = photoKey(photo, kind);
  res.set('Cache-Control', 'private, max-age=3600');
  if (kind === 'master') res.attachment(photo.originalName ?? `${photo.sha256}.${photo.format}`);
  await sendStored(req, res, key, () => notFound('Photo file'));
});
