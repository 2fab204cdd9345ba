import { Router, type RequestHandler } from 'express';
import multer from 'multer';
import { actorOf, requireUser } from '../../http/auth.ts';
import { badRequest, forbidden, HttpError } from '../../http/errors.ts';
import { parseQuery } from '../../http/validate.ts';
import { can } from '../../policies/index.ts';
import { checkCsv, importPieces, preview } from '../../import/pieces.ts';
import { columnMapping, importQuery, type ColumnMapping } from '../../../shared/schemas/piece-import.ts';

export const importRouter = Router();

const MAX_BYTES = 50 * 1024 * 1024;
const upload = multer({ storage: multer.memoryStorage(), limits: { fileSize: MAX_BYTES, files: 1, fields: 5 } });
// multer's own errors (too large, unexpected field) in the API's error shape.
const receiveFile: RequestHandler = (req, res, next) =>
  upload.single('file')(req, res, (err: unknown) => {
    if (!err) return next();
    const e = err as { code?: string; message?: string };
    if (e.code === 'LIMIT_FILE_SIZE') return next(new HttpError(413, 'too_large', `The file is larger than ${MAX_BYTES / 1024 / 1024} MB.`));
    next(badRequest(`The upload could not be read: ${e.message ?? 'unknown error'}.`));
  });

const mayImport: RequestHandler = (req, _res, next) => (can(actorOf(req), 'import:run') ? next() : next(forbidden()));

function mappingOf(raw: unknown): ColumnMapping {
  if (raw === undefined || raw === '') return {};
  let json: unknown;
  try {
    json = JSON.parse(String(raw));
  } catch {
    throw badRequest('The column mapping is not valid JSON.', { fields: { mapping: ['Not valid JSON.'] } });
  }
  return columnMapping.parse(json);
}

importRouter.post('/pieces', requireUser, mayImport, receiveFile, async (req, res) => {
  const { dryRun } = parseQuery(importQuery, req);
  if (!req.file) throw badRequest('Choose a CSV file to upload (form field "file").', { fields: { file: ['A CSV file is required.'] } });
  const mapping = mappingOf((req.body as Record<string, unknown> | undefined)?.mapping);
  if (dryRun) {
    const { checked, fileErrors } = await checkCsv(req.file.buffer, mapping);
    res.json(preview(checked, fileErrors));
    return;
  }
  const result = await importPieces({ actor: actorOf(req)!, input: { buffer: req.file.buffer, mapping } });
  res.status(201).json(result);
});
