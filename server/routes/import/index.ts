import { Router, type RequestHandler } from 'express';
import { actorOf, requireUser } from '../../http/auth.ts';
import { badRequest, forbidden } from '../../http/errors.ts';
import { discardUploads, receiveUpload } from '../../http/upload.ts';
import { parseParams, parseQuery } from '../../http/validate.ts';
import { can } from '../../policies/index.ts';
import { importPieces } from '../../import/pieces.ts';
import { dryRunImport, loadPreview, previewErrors, previewRows } from '../../import/preview-store.ts';
import {
  columnMapping,
  importPreviewErrorsQuery,
  importPreviewParams,
  importPreviewRowsQuery,
  importQuery,
  type ColumnMapping,
} from '../../../shared/schemas/piece-import.ts';

export const importRouter = Router();

const MAX_BYTES = 50 * 1024 * 1024;
// The file streams to a temp file (server/http/upload.ts); multer's own errors (too large, unexpected field) in
// the API's error shape.
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

// The CSV is read from its temp file as a stream, checked row by row, and the temp file removed before answering.
importRouter.post('/pieces', requireUser, mayImport, receiveFile, async (req, res) => {
  let answer: { status: number; body: unknown };
  try {
    const { dryRun } = parseQuery(importQuery, req);
    if (!req.file)
      throw badRequest('Choose a CSV file to upload (form field "file").', {
        fields: { file: ['A CSV file is required.'] },
      });
    const mapping = mappingOf((req.body as Record<string, unknown> | undefined)?.mapping);
    const input = { file: req.file.path, mapping };
    answer = dryRun
      ? { status: 200, body: await dryRunImport({ actor: actorOf(req)!, input }) }
      : { status: 201, body: await importPieces({ actor: actorOf(req)!, input }) };
  } finally {
    await discardUploads(req);
  }
  res.status(answer.status).json(answer.body);
});

// Further pages of a dry run's rows and errors, from any app server (the preview is in MariaDB).
importRouter.get('/previews/:id/rows', requireUser, mayImport, async (req, res) => {
  const { id } = parseParams(importPreviewParams, req);
  const { page, pageSize, only } = parseQuery(importPreviewRowsQuery, req);
  res.json(await previewRows(await loadPreview(id, actorOf(req)!.id), page, pageSize, only));
});

importRouter.get('/previews/:id/errors', requireUser, mayImport, async (req, res) => {
  const { id } = parseParams(importPreviewParams, req);
  const { page, pageSize } = parseQuery(importPreviewErrorsQuery, req);
  res.json(await previewErrors(await loadPreview(id, actorOf(req)!.id), page, pageSize));
});
