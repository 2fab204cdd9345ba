import { Router, type RequestHandler } from 'express';
import multer from 'multer';
import { idParams } from '../../../shared/schemas/common.ts';
import { MAX_UPLOAD_BYTES, UPLOAD_FIELD } from '../../../shared/schemas/photo.ts';
import { actorOf, currentUser, requireUser } from '../../http/auth.ts';
import { HttpError, badRequest, forbidden, notFound } from '../../http/errors.ts';
import { parseParams } from '../../http/validate.ts';
import { ingestPhoto, removePhotoFiles } from '../../media/pipeline.ts';
import { sequelize, type Photo, type User } from '../../models/index.ts';
import { can, type Actor } from '../../policies/index.ts';
import { pieceRecord } from '../../presenters/piece.ts';
import { presentPhoto } from '../../presenters/photo.ts';
import { audit } from '../../services/audit.ts';
import { enqueueTiles } from '../../iiif/enqueue.ts';
import { loadReadablePiece } from '../pieces/load.ts';

export const photoUploadRouter = Router({ mergeParams: true });

const MAX_FILES = 20;
// Kept in memory: the pipeline hashes and decodes the bytes, and writes the master itself.
const upload = multer({ storage: multer.memoryStorage(), limits: { fileSize: MAX_UPLOAD_BYTES, files: MAX_FILES, fields: 10 } });

/** multer's errors in the API's own words. */
const receiveFiles: RequestHandler = (req, res, next) =>
  upload.array(UPLOAD_FIELD, MAX_FILES)(req, res, (err: unknown) => {
    if (!err) return next();
    if (err instanceof multer.MulterError) {
      if (err.code === 'LIMIT_FILE_SIZE') return next(new HttpError(413, 'too_large', `${err.field ? 'A file' : 'The upload'} is larger than 60 MB.`));
      if (err.code === 'LIMIT_UNEXPECTED_FILE')
        return next(badRequest(`Send photos in the form field "${UPLOAD_FIELD}"; "${err.field}" is not expected.`, { fields: { [err.field ?? '_']: ['Unexpected file field'] } }));
      if (err.code === 'LIMIT_FILE_COUNT') return next(badRequest(`Send at most ${MAX_FILES} photos at once.`));
      return next(badRequest(`The upload could not be read: ${err.message}.`));
    }
    next(err);
  });

/** One photo, all rows in one transaction; any failure removes every file it wrote. */
async function ingestOne(user: User | null, actor: Actor, pieceId: number, file: Express.Multer.File) {
  let stored: Photo | null = null;
  try {
    return await sequelize.transaction(async (transaction) => {
      const result = await ingestPhoto({ actor: user, transaction, input: { buffer: file.buffer, originalName: file.originalname, pieceId } });
      stored = result.photo;
      // Queued with the rows, so a photo never exists without its deep-zoom job.
      await enqueueTiles(result.photo.id, transaction, user?.id ?? null);
      await audit({ actor, transaction }, 'piece', pieceId, 'photo-added', { photo: { from: null, to: result.photo.id } });
      return result;
    });
  } catch (e) {
    if (stored) await removePhotoFiles(stored);
    throw e;
  }
}

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
      if (!files.length) throw badRequest(`Attach one or more photos in the form field "${UPLOAD_FIELD}".`, { fields: { [UPLOAD_FIELD]: ['Attach a photo'] } });
      const photos = [];
      for (const [index, file] of files.entries()) {
        try {
          const { photo, palette } = await ingestOne(currentUser(req), actor, piece.id, file);
          photos.push(presentPhoto(photo, actor, { palette }));
        } catch (e) {
          // Earlier files of the same request stay stored; the answer names the one refused.
          if (e instanceof HttpError) {
            e.message = `${file.originalname || `File ${index + 1}`}: ${e.message}`;
            e.details = { ...(e.details as object | undefined), file: file.originalname, index, stored: photos.map((p) => p.id) };
          }
          throw e;
        }
      }
      res.status(201).json({ photos });
    } catch (e) {
      next(e);
    }
  });
});
