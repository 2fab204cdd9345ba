import type { Transaction } from 'sequelize';
import type { AnalysisCreateInput, AnalysisUpdateInput } from '../../../shared/schemas/records.ts';
import { badRequest, conflict } from '../../http/errors.ts';
import { Analysis, Photo, Piece, Region } from '../../models/index.ts';
import { audit, diff } from '../audit.ts';
import type { SignedInCtx } from '../context.ts';

/** The sampling region must be a region of a photo of this piece. */
async function checkRegion(pieceId: number, regionId: number | null | undefined, transaction: Transaction) {
  if (regionId == null) return;
  const region = await Region.findByPk(regionId, {
    include: [{ model: Photo, as: 'photo', attributes: ['pieceId'] }],
    transaction,
  });
  const photo = (region as (Region & { photo?: Photo }) | null)?.photo;
  if (!region || photo?.pieceId !== pieceId)
    throw badRequest('Some fields are not valid.', {
      fields: { regionId: ['Choose a region of a photo of this piece'] },
    });
}

const summary = (a: Analysis) => ({ method: a.method, analysedOn: a.analysedOn, laboratory: a.laboratory });

export async function createAnalysis({
  actor,
  transaction,
  input,
}: SignedInCtx<{ piece: Piece; values: AnalysisCreateInput }>) {
  const { piece, values } = input;
  await checkRegion(piece.id, values.regionId, transaction);
  const analysis = await Analysis.create(
    {
      pieceId: piece.id,
      method: values.method,
      regionId: values.regionId ?? null,
      site: values.site ?? null,
      laboratory: values.laboratory ?? null,
      analyst: values.analyst ?? null,
      analysedOn: values.analysedOn,
      notes: values.notes ?? null,
      findings: values.findings,
      reportSha256: null,
      reportBytes: null,
      reportName: null,
      createdById: actor.id,
    },
    { transaction },
  );
  await audit({ actor, transaction }, 'piece', piece.id, 'analysis-added', {
    analysis: { from: null, to: { id: analysis.id, ...summary(analysis) } },
  });
  if (values.identifies.length)
    await markIdentified({ actor, transaction, input: { piece, analysis, names: values.identifies } });
  return analysis;
}

export async function updateAnalysis({
  actor,
  transaction,
  input,
}: SignedInCtx<{ analysis: Analysis; changes: AnalysisUpdateInput }>) {
  const { analysis, changes } = input;
  await checkRegion(analysis.pieceId, changes.regionId, transaction);
  const before = analysis.get({ plain: true }) as unknown as Record<string, unknown>;
  const changed = diff(before, changes);
  if (!Object.keys(changed).length) return analysis;
  if (
    (changes.site === null || changes.regionId === null) &&
    !(changes.site ?? analysis.site) &&
    !(changes.regionId ?? analysis.regionId)
  )
    throw badRequest('Some fields are not valid.', {
      fields: { site: ['Describe the sample or site, or choose a region of a photo'] },
    });
  await analysis.update(changes, { transaction });
  await audit({ actor, transaction }, 'piece', analysis.pieceId, 'analysis-changed', {
    analysis: { from: null, to: { id: analysis.id, ...summary(analysis), fields: Object.keys(changed) } },
  });
  return analysis;
}

export async function attachReport({
  actor,
  transaction,
  input,
}: SignedInCtx<{ analysis: Analysis; sha256: string; bytes: number; name: string | null }>) {
  const { analysis } = input;
  await analysis.update(
    { reportSha256: input.sha256, reportBytes: input.bytes, reportName: input.name },
    { transaction },
  );
  await audit({ actor, transaction }, 'piece', analysis.pieceId, 'analysis-report', {
    analysis: { from: null, to: { id: analysis.id, ...summary(analysis), sha256: input.sha256 } },
  });
  return analysis;
}

/** An analysis that an identified dyestuff or mordant points at cannot go: the claim would lose its record. */
export async function deleteAnalysis({ actor, transaction, input }: SignedInCtx<{ analysis: Analysis; piece: Piece }>) {
  const { analysis, piece } = input;
  const citing = [...piece.dyestuffs, ...piece.historicalMordants].filter(
    (t) => (t as { analysisId?: number | null }).analysisId === analysis.id,
  );
  if (citing.length)
    throw conflict(
      `This analysis is the record behind ${citing.map((t) => `${t.name} (identified)`).join(', ')}; point those at another analysis or mark them attributed first.`,
    );
  await analysis.destroy({ transaction });
  await audit({ actor, transaction }, 'piece', analysis.pieceId, 'analysis-removed', {
    analysis: { from: { id: analysis.id, ...summary(analysis) }, to: null },
  });
}

/**
 * The analysis's own claim: the named dyestuffs and mordants of the piece become "identified" and point at it.
 * A name that is not on the piece is refused (the cataloguer adds it first), so an analysis never invents a term.
 */
async function markIdentified({
  actor,
  transaction,
  input,
}: SignedInCtx<{ piece: Piece; analysis: Analysis; names: string[] }>) {
  const { piece, analysis, names } = input;
  const onPiece = new Set([...piece.dyestuffs, ...piece.historicalMordants].map((t) => t.name));
  const missing = names.filter((n) => !onPiece.has(n));
  if (missing.length)
    throw badRequest('Some fields are not valid.', {
      fields: { identifies: [`Not a dyestuff or mordant of this piece: ${missing.join(', ')}`] },
    });
  const mark = (list: Piece['dyestuffs']) =>
    list.map((t) => (names.includes(t.name) ? { ...t, evidence: 'identified' as const, analysisId: analysis.id } : t));
  const before = { dyestuffs: piece.dyestuffs, historicalMordants: piece.historicalMordants };
  const after = { dyestuffs: mark(piece.dyestuffs), historicalMordants: mark(piece.historicalMordants) };
  const changed = diff(before, after);
  if (!Object.keys(changed).length) return;
  // Through the model, so the search index hears of the change.
  await piece.update(after, { transaction });
  await audit({ actor, transaction }, 'piece', piece.id, 'update', changed);
}
