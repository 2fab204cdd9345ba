import { Router, type RequestHandler } from 'express';
import { actorOf, requireUser } from '../../http/auth.ts';
import { badRequest, forbidden } from '../../http/errors.ts';
import { receiveUpload } from '../../http/upload.ts';
import { parseQuery } from '../../http/validate.ts';
import { can } from '../../policies/index.ts';
import { checkCsv, importPieces, preview } from '../../import/pieces.ts';
import { columnMapping, importQuery, type ColumnMapping } from '../../../shared/schemas/piece-import.ts';

export const importRouter = Router();

const MAX_BYTES = 50 * 1024 * 1024;
// multer's own errors (too large, unexpected field) in the API's error shape.
const receiveFile = receiveUpload({
  field: 'file',
  maxFiles: 1,
  maxBytes: MAX_BYTES,
  maxFields: 5,
  tooLarge: () => `The file is larger than ${MAX_BYTES / 1024 / 1024} MB.`,
  refuse: (err) =>
    badRequest(`The upload could not be read: ${(err as { message?: string }).message ?? 'unknown error'}.`),
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
  if (!req.file)
    throw badRequest('Choose a CSV file to upload (form field "file").', {
      fields: { file: ['A CSV file is required.'] },
    });
  const mapping = mappingOf((req.body as Record<string, unknown> | undefined)?.mapping);
  if (dryRun) {
    const { checked, fileErrors } = await checkCsv(req.file.buffer, mapping);
    res.json(preview(checked, fileErrors));
    return;
  }
  const result = await importPieces({ actor: actorOf(req)!, input: { buffer: req.file.buffer, mapping } });
  res.status(201).json(result);
});
