import type { Transaction } from 'sequelize';
import { dateIssues, type PieceCreateInput, type PieceUpdateInput } from '../../shared/schemas/piece.ts';
import { accessionKey } from '../../shared/accession.ts';
import { edtfYears } from '../../shared/edtf.ts';
import { HttpError, badRequest, conflict } from '../http/errors.ts';
import { Piece, VocabularyTerm } from '../models/index.ts';
import { audit, diff } from './audit.ts';
import type { ServiceCtx } from './context.ts';
import { checkIdentifiedAnalyses } from './records/evidence.ts';

/** Fibres and techniques must come from the vocabularies an admin keeps. */
async function checkVocabulary(input: { fibres?: string[]; techniques?: string[] }, transaction: Transaction) {
  const fields: Record<string, string[]> = {};
  for (const [field, vocabulary] of [
    ['fibres', 'fibre'],
    ['techniques', 'technique'],
  ] as const) {
    const wanted = input[field];
    if (!wanted?.length) continue;
    const known = new Set(
      (await VocabularyTerm.findAll({ where: { vocabulary }, attributes: ['term'], transaction })).map((t) => t.term),
    );
    const unknown = wanted.filter((t) => !known.has(t));
    if (unknown.length) fields[field] = [`Not in the ${vocabulary} vocabulary: ${unknown.join(', ')}`];
  }
  if (Object.keys(fields).length) throw badRequest('Some fields are not valid.', { fields });
}

async function checkAccessionFree(accessionNumber: string, exceptId: number | null, transaction: Transaction) {
  // Case and spaces do not make a new number: "ex 2021/1" is taken when "EX 2021/1" exists.
  const other = await Piece.findOne({
    where: { accessionKey: accessionKey(accessionNumber) },
    paranoid: false,
    transaction,
  });
  if (other && other.id !== exceptId) {
    const as = other.accessionNumber === accessionNumber ? '' : ` (as ${other.accessionNumber})`;
    const message = other.deletedAt
      ? `That accession number belongs to a deleted piece${as}; an admin can restore it.`
      : `That accession number is already used${as}.`;
    throw conflict(message, { fields: { accessionNumber: [message] } });
  }
}

/** Fill the year bounds from the EDTF date when the cataloguer left them empty. */
function withYears<T extends { dateEdtf?: string | null; earliestYear?: number | null; latestYear?: number | null }>(
  p: T,
): T {
  if (!p.dateEdtf) return p;
  const r = edtfYears(p.dateEdtf);
  return { ...p, earliestYear: p.earliestYear ?? r?.earliest ?? null, latestYear: p.latestYear ?? r?.latest ?? null };
}

export async function createPiece({ actor, transaction, input }: ServiceCtx<PieceCreateInput>) {
  await checkVocabulary(input, transaction);
  await checkIdentifiedAnalyses(null, input, transaction);
  await checkAccessionFree(input.accessionNumber, null, transaction);
  const values = withYears(input);
  const piece = await Piece.create(
    {
      accessionNumber: values.accessionNumber,
      objectName: values.objectName,
      title: values.title,
      dateText: values.dateText ?? null,
      dateEdtf: values.dateEdtf ?? null,
      earliestYear: values.earliestYear ?? null,
      latestYear: values.latestYear ?? null,
      place: values.place ?? null,
      fibres: values.fibres ?? [],
      weave: values.weave ?? null,
      threadCount: values.threadCount ?? null,
      heightMm: values.heightMm ?? null,
      widthMm: values.widthMm ?? null,
      repeatMm: values.repeatMm ?? null,
      techniques: values.techniques ?? [],
      dyestuffs: values.dyestuffs ?? [],
      historicalMordants: values.historicalMordants ?? [],
      description: values.description ?? null,
      provenance: values.provenance ?? null,
      condition: values.condition ?? null,
      creditLine: values.creditLine ?? null,
      status: values.status ?? 'draft',
      makers: values.makers ?? [],
      patternName: values.patternName ?? null,
      marks: values.marks ?? [],
      storageLocation: values.storageLocation ?? null,
      objectRights: values.objectRights ?? null,
      imageRights: values.imageRights ?? null,
      createdById: actor?.id ?? null,
    },
    { transaction },
  );
  await audit({ actor, transaction }, 'piece', piece.id, 'create', diff({}, { ...values, status: piece.status }));
  return piece;
}

export async function updatePiece({
  actor,
  transaction,
  input,
}: ServiceCtx<{ piece: Piece; changes: PieceUpdateInput }>) {
  const { piece, changes } = input;
  await checkVocabulary(changes, transaction);
  await checkIdentifiedAnalyses(piece.id, changes, transaction);
  if (changes.accessionNumber) await checkAccessionFree(changes.accessionNumber, piece.id, transaction);
  // A new EDTF date re-derives the bounds unless the same request sets them.
  const patch =
    changes.dateEdtf !== undefined
      ? withYears({ ...changes, earliestYear: changes.earliestYear ?? null, latestYear: changes.latestYear ?? null })
      : changes;
  const before = piece.get({ plain: true }) as unknown as Record<string, unknown>;
  const merged = { ...before, ...patch } as Parameters<typeof dateIssues>[0];
  const issues = dateIssues(merged);
  if (issues.length)
    throw badRequest('Some fields are not valid.', {
      fields: Object.fromEntries(issues.map((i) => [i.path, [i.message]])),
    });
  const changed = diff(before, patch);
  if (!Object.keys(changed).length) return piece;
  await piece.update(patch, { transaction });
  const action = changed.status ? (changed.status.to === 'published' ? 'publish' : 'unpublish') : 'update';
  await audit({ actor, transaction }, 'piece', piece.id, action, changed);
  return piece;
}

export async function deletePiece({ actor, transaction, input }: ServiceCtx<{ piece: Piece }>) {
  await input.piece.destroy({ transaction });
  await audit({ actor, transaction }, 'piece', input.piece.id, 'delete');
}

export async function restorePiece({ actor, transaction, input }: ServiceCtx<{ piece: Piece }>) {
  if (!input.piece.deletedAt) throw new HttpError(409, 'conflict', 'That piece is not deleted.');
  await input.piece.restore({ transaction });
  await audit({ actor, transaction }, 'piece', input.piece.id, 'restore');
  return input.piece;
}
