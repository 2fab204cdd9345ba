import type { RequestHandler } from 'express';
import multer from 'multer';
import { HttpError, badRequest } from './errors.ts';

/**
 * The one upload helper: multer kept in memory (the media pipeline and the CSV import hash and read
 * the bytes themselves), with multer's errors answered in the API's error shape. A file over the
 * limit is 413 `too_large` in `tooLarge`'s words; any other refusal goes through `refuse`
 * (default: 400 "The upload could not be read: …"); an error `refuse` answers null for goes on as it is.
 */
export type UploadOptions = {
  field: string;
  maxFiles: number;
  maxBytes: number;
  maxFields: number;
  tooLarge: (err: multer.MulterError) => string;
  refuse?: (err: unknown) => HttpError | null;
};

const couldNotRead = (err: unknown) =>
  err instanceof multer.MulterError ? badRequest(`The upload could not be read: ${err.message}.`) : null;

export function receiveUpload({
  field,
  maxFiles,
  maxBytes,
  maxFields,
  tooLarge,
  refuse = couldNotRead,
}: UploadOptions): RequestHandler {
  const upload = multer({
    storage: multer.memoryStorage(),
    limits: { fileSize: maxBytes, files: maxFiles, fields: maxFields },
  });
  const receive = maxFiles === 1 ? upload.single(field) : upload.array(field, maxFiles);
  return (req, res, next) =>
    receive(req, res, (err: unknown) => {
      if (!err) return next();
      if (err instanceof multer.MulterError && err.code === 'LIMIT_FILE_SIZE')
        return next(new HttpError(413, 'too_large', tooLarge(err)));
      next(refuse(err) ?? err);
    });
}
