import { Router } from 'express';
import multer from 'multer';
import { idParams } from '../../../shared/schemas/common.ts';
import { UPLOAD_FIELD } from '../../../shared/schemas/photo.ts';
import { actorOf, requireUser } from '../../http/auth.ts';
import { HttpError, badRequest, forbidden, notFound } from '../../http/errors.ts';
import { parseParams } from '../../http/validate.ts';
import { discardUploads, receiveUpload } from '../../http/upload.ts';
import { maxBytesInWords, mediaLimits } from '../../media/limits.ts';
import { checkUpload } from '../../media/pipeline.ts';
import { sequelize } from '../../models/index.ts';
import { can } from '../../policies/index.ts';
import { pieceRecord } from '../../presenters/piece.ts';
import { presentPhoto } from '../../presenters/photo.ts';
import { addPhoto } from '../../services/photos.ts';
import { loadReadablePiece } from '../pieces/load.ts';

export const photoUploadRouter = Router({ mergeParams: true });

const MAX_FILES = 20;

/** multer's errors in the API's own words. */
const receiveFiles = receiveUpload({
  field: UPLOAD_FIELD,
  maxFiles: MAX_FILES,
  maxBytes: () => mediaLimits.maxBytes,
  maxFields: 10,
  tooLarge: (err) => `${err.field ? 'A file' : 'The upload'} is larger than ${maxBytesInWords()}.`,
  refuse: (err) => {
    if (!(err instanceof multer.MulterError)) return null;
    if (err.code === 'LIMIT_UNEXPECTED_FILE')
      return badRequest(`Send photos in the form field "${UPLOAD_FIELD}"; "${err.field}" is not expected.`, {
        fields: { [err.field ?? '_']: ['Unexpected file field'] },
      });
    if (err.code === 'LIMIT_FILE_COUNT') return badRequest(`Send at most ${MAX_FILES} photos at once.`);
    return badRequest(`The upload could not be read: ${err.message}.`);
  },
});

photoUploadRouter.post('/', requireUser, async (req, res, next) => {
  const actor = actorOf(req);
  const { id } = parseParams(idParams, req);
  const piece = await loadReadablePiece(actor, id);
  if (piece.deletedAt) throw notFound('Piece');
  if (!can(actor, 'photo:create', pieceRecord(piece))) throw forbidden();
  receiveFiles(req, res, async (err?: unknown) => {
    if (err) return next(err);
    try {
      const files = (req.files as Express.Multer.File[] | undefined) ?? [];
      if (!files.length)
        throw badRequest(`Attach one or more photos in the form field "${UPLOAD_FIELD}".`, {
          fields: { [UPLOAD_FIELD]: ['Attach a photo'] },
        });
      const photos = [];
      for (const [index, file] of files.entries()) {
        try {
          // The file is checked by content and hashed first, outside any transaction (a large master takes
          // seconds); then one photo, all rows in one transaction; any failure removes every file it wrote.
          const checked = await checkUpload({ path: file.path });
          const { photo } = await sequelize.transaction((transaction) =>
            addPhoto({
              actor,
              transaction,
              input: { path: file.path, originalName: file.originalname, pieceId: piece.id, checked },
            }),
          );
          // At stage queued: the ingest job reads EXIF, previews, palette and tiles (GET /api/photos/:id follows it).
          photos.push(presentPhoto(photo, actor, { palette: [] }));
        } catch (e) {
          // Earlier files of the same request stay stored; the answer names the one refused.
          if (e instanceof HttpError) {
            e.message = `${file.originalname || `File ${index + 1}`}: ${e.message}`;
            e.details = {
              ...(e.details as object | undefined),
              file: file.originalname,
              index,
              stored: photos.map((p) => p.id),
            };
          }
          throw e;
        }
      }
      await discardUploads(req);
      res.status(201).json({ photos });
    } catch (e) {
      await discardUploads(req);
      next(e);
    }
  });
});
