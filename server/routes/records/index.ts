import { Router } from 'express';
import multer from 'multer';
import { idParams } from '../../../shared/schemas/common.ts';
import {
  analysisCreateSchema,
  analysisUpdateSchema,
  conditionCreateSchema,
  displayCheckSchema,
  displayCreateSchema,
  MAX_REPORT_BYTES,
  REPORT_FIELD,
} from '../../../shared/schemas/records.ts';
import { actorOf, requireUser } from '../../http/auth.ts';
import { badRequest, forbidden, notFound } from '../../http/errors.ts';
import { parseBody, parseParams } from '../../http/validate.ts';
import { discardUploads, receiveUpload } from '../../http/upload.ts';
import { sendStored } from '../../storage/send.ts';
import { Analysis, ConditionReport, sequelize } from '../../models/index.ts';
import { can, type Actor } from '../../policies/index.ts';
import { pieceRecord } from '../../presenters/piece.ts';
import { presentAnalysis, presentConditionReport, presentDisplay } from '../../presenters/records.ts';
import { attachReport, createAnalysis, deleteAnalysis, updateAnalysis } from '../../services/records/analyses.ts';
import { createConditionReport } from '../../services/records/conditions.ts';
import { asInput, createDisplay, doseOf, excessMessage, periodsOf } from '../../services/records/displays.ts';
import { checkPdf, reportPath, sha256OfFile, storeReport } from '../../services/records/report-file.ts';
import { loadReadablePiece } from '../pieces/load.ts';

/** Mounted on /api/pieces: a piece's analyses, condition reports and display periods. */
export const pieceRecordsRouter = Router();
/** Mounted on /api/analyses: one analysis and its report. */
export const analysesRouter = Router();

async function writablePiece(
  actor: Actor,
  id: number,
  action: 'analysis:create' | 'condition:create' | 'display:create',
) {
  const piece = await loadReadablePiece(actor, id);
  if (piece.deletedAt) throw notFound('Piece');
  if (!can(actor, action, pieceRecord(piece))) throw forbidden();
  return piece;
}

// ---- analyses ----

pieceRecordsRouter.get('/:id/analyses', async (req, res) => {
  const actor = actorOf(req);
  const { id } = parseParams(idParams, req);
  const piece = await loadReadablePiece(actor, id);
  const rows = await Analysis.findAll({
    where: { pieceId: piece.id },
    order: [
      ['analysedOn', 'DESC'],
      ['id', 'DESC'],
    ],
  });
  res.json({
    items: rows.map((a) => presentAnalysis(a, actor)),
    canCreate: !piece.deletedAt && can(actor, 'analysis:create', pieceRecord(piece)),
  });
});

pieceRecordsRouter.post('/:id/analyses', requireUser, async (req, res) => {
  const actor = actorOf(req)!;
  const { id } = parseParams(idParams, req);
  const values = parseBody(analysisCreateSchema, req);
  const piece = await writablePiece(actor, id, 'analysis:create');
  const analysis = await sequelize.transaction((transaction) =>
    createAnalysis({ actor, transaction, input: { piece, values } }),
  );
  res.status(201).json({ analysis: presentAnalysis(analysis, actor) });
});

/** An analysis the actor may read (through its piece), otherwise 404. */
async function loadAnalysis(actor: Actor, id: number) {
  const analysis = await Analysis.findByPk(id);
  if (!analysis) throw notFound('Analysis');
  const piece = await loadReadablePiece(actor, analysis.pieceId).catch(() => {
    throw notFound('Analysis');
  });
  return { analysis, piece };
}

analysesRouter.get('/:id', async (req, res) => {
  const actor = actorOf(req);
  const { id } = parseParams(idParams, req);
  const { analysis } = await loadAnalysis(actor, id);
  res.json({ analysis: presentAnalysis(analysis, actor) });
});

analysesRouter.patch('/:id', requireUser, async (req, res) => {
  const actor = actorOf(req)!;
  const { id } = parseParams(idParams, req);
  const changes = parseBody(analysisUpdateSchema, req);
  const { analysis, piece } = await loadAnalysis(actor, id);
  if (piece.deletedAt) throw notFound('Analysis');
  if (!can(actor, 'analysis:update', pieceRecord(piece))) throw forbidden();
  const updated = await sequelize.transaction((transaction) =>
    updateAnalysis({ actor, transaction, input: { analysis, changes } }),
  );
  res.json({ analysis: presentAnalysis(updated, actor) });
});

analysesRouter.delete('/:id', requireUser, async (req, res) => {
  const actor = actorOf(req)!;
  const { id } = parseParams(idParams, req);
  const { analysis, piece } = await loadAnalysis(actor, id);
  if (piece.deletedAt) throw notFound('Analysis');
  if (!can(actor, 'analysis:update', pieceRecord(piece))) throw forbidden();
  await sequelize.transaction((transaction) => deleteAnalysis({ actor, transaction, input: { analysis, piece } }));
  res.status(204).end();
});

const receiveReport = receiveUpload({
  field: REPORT_FIELD,
  maxFiles: 1,
  maxBytes: MAX_REPORT_BYTES,
  maxFields: 5,
  tooLarge: () => 'The report is larger than 40 MB.',
  refuse: (err) =>
    err instanceof multer.MulterError && err.code === 'LIMIT_UNEXPECTED_FILE'
      ? badRequest(`Send the report in the form field "${REPORT_FIELD}".`, {
          fields: { [err.field ?? REPORT_FIELD]: ['Unexpected file field'] },
        })
      : null,
});

analysesRouter.post('/:id/report', requireUser, async (req, res, next) => {
  const actor = actorOf(req)!;
  const { id } = parseParams(idParams, req);
  const { analysis, piece } = await loadAnalysis(actor, id);
  if (piece.deletedAt) throw notFound('Analysis');
  if (!can(actor, 'analysis:update', pieceRecord(piece))) throw forbidden();
  receiveReport(req, res, async (err?: unknown) => {
    if (err) return next(err);
    try {
      const file = req.file;
      if (!file)
        throw badRequest(`Attach the report PDF in the form field "${REPORT_FIELD}".`, {
          fields: { [REPORT_FIELD]: ['Attach the report as a PDF'] },
        });
      const bytes = await checkPdf(file.path);
      const sha256 = await sha256OfFile(file.path);
      // Content-addressed, like a master: the same report twice is one file.
      await storeReport(file.path, sha256);
      const updated = await sequelize.transaction((transaction) =>
        attachReport({
          actor,
          transaction,
          input: { analysis, sha256, bytes, name: file.originalname?.slice(0, 255) || null },
        }),
      );
      await discardUploads(req);
      res.status(201).json({ analysis: presentAnalysis(updated, actor) });
    } catch (e) {
      await discardUploads(req);
      next(e);
    }
  });
});

analysesRouter.get('/:id/report', requireUser, async (req, res) => {
  const actor = actorOf(req);
  const { id } = parseParams(idParams, req);
  const { analysis } = await loadAnalysis(actor, id);
  if (!can(actor, 'analysis:report')) throw forbidden();
  if (!analysis.reportSha256) throw notFound('Report');
  const name = (analysis.reportName ?? `analysis-${analysis.id}.pdf`).replace(/[^\w.\- ]/g, '_');
  res.set('Content-Type', 'application/pdf');
  res.set('Content-Disposition', `inline; filename="${name}"`);
  res.set('X-Content-Type-Options', 'nosniff');
  res.set('Digest', `sha-256=${Buffer.from(analysis.reportSha256, 'hex').toString('base64')}`);
  res.set('Cache-Control', 'private, max-age=3600');
  await sendStored(req, res, reportPath(analysis.reportSha256), () => notFound('Report file'));
});

// ---- condition reports ----

pieceRecordsRouter.get('/:id/condition-reports', requireUser, async (req, res) => {
  const actor = actorOf(req);
  const { id } = parseParams(idParams, req);
  const piece = await loadReadablePiece(actor, id);
  if (!can(actor, 'condition:read', pieceRecord(piece))) throw forbidden();
  const rows = await ConditionReport.findAll({
    where: { pieceId: piece.id },
    order: [
      ['assessedOn', 'DESC'],
      ['id', 'DESC'],
    ],
  });
  res.json({
    items: rows.map(presentConditionReport),
    canCreate: !piece.deletedAt && can(actor, 'condition:create', pieceRecord(piece)),
  });
});

pieceRecordsRouter.post('/:id/condition-reports', requireUser, async (req, res) => {
  const actor = actorOf(req)!;
  const { id } = parseParams(idParams, req);
  const values = parseBody(conditionCreateSchema, req);
  const piece = await writablePiece(actor, id, 'condition:create');
  const report = await sequelize.transaction((transaction) =>
    createConditionReport({ actor, transaction, input: { piece, values } }),
  );
  res.status(201).json({ report: presentConditionReport(report) });
});

// ---- display periods and the light dose ----

pieceRecordsRouter.get('/:id/displays', requireUser, async (req, res) => {
  const actor = actorOf(req);
  const { id } = parseParams(idParams, req);
  const piece = await loadReadablePiece(actor, id);
  if (!can(actor, 'display:read', pieceRecord(piece))) throw forbidden();
  const rows = await periodsOf(piece.id);
  res.json({
    items: rows.map(presentDisplay),
    lightDose: doseOf(piece, rows.map(asInput)),
    canCreate: !piece.deletedAt && can(actor, 'display:create', pieceRecord(piece)),
  });
});

/** The dry check the form calls before saving: would this period take the piece over its annual allowance? */
pieceRecordsRouter.post('/:id/displays/check', requireUser, async (req, res) => {
  const actor = actorOf(req)!;
  const { id } = parseParams(idParams, req);
  const values = parseBody(displayCheckSchema, req);
  const piece = await writablePiece(actor, id, 'display:create');
  const existing = (await periodsOf(piece.id)).map(asInput);
  const next = { from: values.from, to: values.to, lux: values.lux, hoursPerDay: values.hoursPerDay };
  const { exceeds, message } = excessMessage(piece, existing, next);
  res.json({ exceeds, message, lightDose: doseOf(piece, [...existing, next]) });
});

pieceRecordsRouter.post('/:id/displays', requireUser, async (req, res) => {
  const actor = actorOf(req)!;
  const { id } = parseParams(idParams, req);
  const values = parseBody(displayCreateSchema, req);
  const piece = await writablePiece(actor, id, 'display:create');
  const { display, dose } = await sequelize.transaction((transaction) =>
    createDisplay({ actor, transaction, input: { piece, values } }),
  );
  res.status(201).json({ display: presentDisplay(display), lightDose: dose });
});
