import { Router, type RequestHandler } from 'express';
import multer from 'multer';
import { idParams } from '../../../shared/schemas/common.ts';
import { MAX_UPLOAD_BYTES, UPLOAD_FIELD } from '../../../shared/schemas/photo.ts';
import { actorOf, currentUser } from '../../http/auth.ts';
import { HttpError, badRequest } from '../../http/errors.ts';
import { parseParams } from '../../http/validate.ts';
import { ingestPhoto, removePhotoFiles } from '../../media/pipeline.ts';
import { sequelize, type PaletteColour, type Photo } from '../../models/index.ts';
import { enqueueTiles } from '../../iiif/enqueue.ts';
import { loadWritableTrial } from './load.ts';

/** POST /api/trials/:id/photos: one swatch photo through the media pipeline (palette and all). */
export const trialPhotosRouter = Router({ mergeParams: true });

const upload = multer({ storage: multer.memoryStorage(), limits: { fileSize: MAX_UPLOAD_BYTES, files: 1, fields: 5 } });
const receiveOne: RequestHandler = (req, res, next) =>
  upload.single(UPLOAD_FIELD)(req, res, (err: unknown) => {
    if (!err) return next();
    if (err instanceof multer.MulterError) {
      if (err.code === 'LIMIT_FILE_SIZE') return next(new HttpError(413, 'too_large', 'The photo is larger than 60 MB.'));
      return next(badRequest(`Send one swatch photo in the form field "${UPLOAD_FIELD}".`, { fields: { [UPLOAD_FIELD]: [err.message] } }));
    }
    next(err);
  });

trialPhotosRouter.post('/', async (req, res, next) => {
  const actor = actorOf(req);
  const { id } = parseParams(idParams, req);
  const trial = await loadWritableTrial(actor, id);
  receiveOne(req, res, async (err?: unknown) => {
    if (err) return next(err);
    let stored: Photo | null = null;
    try {
      const file = req.file;
      if (!file) throw badRequest(`Attach the swatch photo in the form field "${UPLOAD_FIELD}".`, { fields: { [UPLOAD_FIELD]: ['Attach a photo'] } });
      const { photo, palette } = await sequelize.transaction(async (transaction) => {
        const result = await ingestPhoto({ actor: currentUser(req), transaction, input: { buffer: file.buffer, originalName: file.originalname, trialId: trial.id, view: 'swatch' } });
        stored = result.photo;
        await enqueueTiles(result.photo.id, transaction, currentUser(req)?.id ?? null);
        return result;
      });
      res.status(201).json({
        photo: { id: photo.id, width: photo.width, height: photo.height, view: photo.view, originalName: photo.originalName },
        palette: palette.map((c: PaletteColour) => ({ rank: c.rank, L: c.L, a: c.a, b: c.b, hex: c.hex, share: c.share, name: c.name, variant: c.variant, background: c.background })),
      });
    } catch (e) {
      if (stored) await removePhotoFiles(stored).catch(() => undefined);
      next(e);
    }
  });
});
