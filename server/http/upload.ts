import type { RequestHandler } from 'express';
import multer from 'multer';
import { HttpError, badRequest } from './errors.ts';

/**
 * The one upload helper: multer kept in memory (the media pipeline and the CSV import hash and read
 * the bytes themselves), with multer's errors answered in the API's error shape. A file over the
 * limit is 413 `too_large` in `tooLarge`'s words; any other refusal goes through `refuse`
 * (default: 400 "The upload could not be read: …"). Anything else multer passes on is the form parser
 * (busboy) refusing a malformed body — no boundary, a truncated body, a bad part header — and is the
 * sender's fault: 400 with busboy's reason, never a 500.
 * File names are read as UTF-8 (`defParamCharset`): busboy's default is Latin-1, which turned
 * "Zürich" into "ZÃ¼rich" (RFC 7578 §4.2: names are sent as UTF-8 by browsers).
 */
export type UploadOptions = {
  field: string;
  maxFiles: number;
  maxBytes: number;
  maxFields: number;
  tooLarge: (err: multer.MulterError) => string;
  refuse?: (err: unknown) => HttpError | null;
};

const reasonOf = (err: unknown) => (err instanceof Error ? err.message.replace(/\.$/, '') : 'malformed body');
const couldNotRead = (err: unknown) => badRequest(`The upload could not be read: ${reasonOf(err)}.`);

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
    defParamCharset: 'utf8',
    limits: { fileSize: maxBytes, files: maxFiles, fields: maxFields },
  });
  const receive = maxFiles === 1 ? upload.single(field) : upload.array(field, maxFiles);
  return (req, res, next) =>
    receive(req, res, (err: unknown) => {
      if (!err) return next();
      if (err instanceof multer.MulterError && err.code === 'LIMIT_FILE_SIZE')
        return next(new HttpError(413, 'too_large', tooLarge(err)));
      if (err instanceof HttpError) return next(err);
      next(refuse(err) ?? couldNotRead(err));
    });
}
