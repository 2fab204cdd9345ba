import { Router } from 'express';
import multer from 'multer';
import { idParams } from '../../../shared/schemas/common.ts';
import { UPLOAD_FIELD } from '../../../shared/schemas/photo.ts';
import { actorOf } from '../../http/auth.ts';
import { badRequest } from '../../http/errors.ts';
import { discardUploads, receiveUpload } from '../../http/upload.ts';
import { maxBytesInWords, mediaLimits } from '../../media/limits.ts';
import { checkUpload } from '../../media/pipeline.ts';
import { parseParams } from '../../http/validate.ts';
import { sequelize } from '../../models/index.ts';
import { presentIngest } from '../../presenters/photo.ts';
import { addPhoto } from '../../services/photos.ts';
import { loadWritableTrial } from './load.ts';

/** POST /api/trials/:id/photos: one swatch photo stored; its ingest job reads it (palette and all). */
export const trialPhotosRouter = Router({ mergeParams: true });

const receiveOne = receiveUpload({
  field: UPLOAD_FIELD,
  maxFiles: 1,
  maxBytes: () => mediaLimits.maxBytes,
  maxFields: 5,
  tooLarge: () => `The photo is larger than ${maxBytesInWords()}.`,
  refuse: (err) =>
    err instanceof multer.MulterError
      ? badRequest(`Send one swatch photo in the form field "${UPLOAD_FIELD}".`, {
          fields: { [UPLOAD_FIELD]: [err.message] },
        })
      : null,
});

trialPhotosRouter.post('/', async (req, res, next) => {
  const actor = actorOf(req);
  const { id } = parseParams(idParams, req);
  const trial = await loadWritableTrial(actor, id);
  receiveOne(req, res, async (err?: unknown) => {
    if (err) return next(err);
    try {
      const file = req.file;
      if (!file)
        throw badRequest(`Attach the swatch photo in the form field "${UPLOAD_FIELD}".`, {
          fields: { [UPLOAD_FIELD]: ['Attach a photo'] },
        });
      // Read and analysed before the transaction opens, so it lasts only as long as the writes.
      const checked = await checkUpload({ path: file.path });
      const { photo } = await sequelize.transaction((transaction) =>
        addPhoto({
          actor,
          transaction,
          input: { path: file.path, originalName: file.originalname, trialId: trial.id, view: 'swatch', checked },
        }),
      );
      await discardUploads(req);
      res.status(201).json({
        photo: {
          id: photo.id,
          width: photo.width,
          height: photo.height,
          view: photo.view,
          originalName: photo.originalName,
          ingest: presentIngest(photo),
        },
        // Read by the photo's ingest job; the trial shows it once the job has run.
        palette: [],
      });
    } catch (e) {
      await discardUploads(req);
      next(e);
    }
  });
});
