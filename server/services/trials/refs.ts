import { Op, type Transaction } from 'sequelize';
import { badRequest } from '../../http/errors.ts';
import {
  Chemical,
  ColourMeasurement,
  Dyestuff,
  MordantBatch,
  PaletteColour,
  Photo,
  Piece,
  Region,
} from '../../models/index.ts';

type Targets = {
  targetPaletteColourId?: number | null;
  targetRegionId?: number | null;
  targetMeasurementId?: number | null;
};

const fieldError = (field: string, message: string) =>
  badRequest('Some fields are not valid.', { fields: { [field]: [message] } });

/** The piece a trial reproduces: it must exist and not be in the bin. */
export async function checkPiece(pieceId: number | null | undefined, transaction: Transaction) {
  if (pieceId == null) return null;
  const piece = await Piece.findOne({ where: { id: pieceId, deletedAt: { [Op.is]: null } }, transaction });
  if (!piece) throw fieldError('pieceId', 'No such piece in the archive.');
  return piece;
}

const photoPiece = async (photoId: number, transaction: Transaction) =>
  (await Photo.findByPk(photoId, { transaction }))?.pieceId ?? null;

/** A target must belong to the piece the trial reproduces. */
export async function checkTarget(pieceId: number | null, t: Targets, transaction: Transaction) {
  if (t.targetPaletteColourId != null) {
    const pc = await PaletteColour.findByPk(t.targetPaletteColourId, { transaction });
    if (!pc || pieceId == null || (await photoPiece(pc.photoId, transaction)) !== pieceId)
      throw fieldError('targetPaletteColourId', 'Choose a palette colour of this piece.');
  }
  if (t.targetRegionId != null) {
    const r = await Region.findByPk(t.targetRegionId, { transaction });
    if (!r || pieceId == null || (await photoPiece(r.photoId, transaction)) !== pieceId)
      throw fieldError('targetRegionId', 'Choose a region of this piece.');
  }
  if (t.targetMeasurementId != null) {
    const m = await ColourMeasurement.findByPk(t.targetMeasurementId, { transaction });
    const onPiece =
      m &&
      pieceId != null &&
      (m.pieceId === pieceId ||
        (m.regionId != null &&
          (await photoPiece((await Region.findByPk(m.regionId, { transaction }))?.photoId ?? 0, transaction)) ===
            pieceId));
    if (!m || m.trialId != null || !onPiece)
      throw fieldError('targetMeasurementId', 'Choose an instrument measurement of this piece.');
  }
}

/** Load the chemicals and dyestuffs named by ingredients, refusing unknown ids with the field that named them. */
export async function loadIngredientRefs(
  steps: Array<{ ingredients: Array<{ kind: 'dyestuff' | 'chemical'; refId: number }>; batchId?: number | null }>,
  transaction: Transaction,
) {
  const ids = (kind: 'dyestuff' | 'chemical') => [
    ...new Set(steps.flatMap((s) => s.ingredients.filter((i) => i.kind === kind).map((i) => i.refId))),
  ];
  const chemicals = new Map(
    (await Chemical.findAll({ where: { id: ids('chemical') }, transaction })).map((c) => [c.id, c]),
  );
  const dyestuffs = new Map(
    (await Dyestuff.findAll({ where: { id: ids('dyestuff') }, transaction })).map((d) => [d.id, d]),
  );
  const batchIds = [...new Set(steps.map((s) => s.batchId).filter((x): x is number => x != null))];
  const batches = new Set(
    (await MordantBatch.findAll({ where: { id: batchIds }, attributes: ['id'], transaction })).map((b) => b.id),
  );
  const fields: Record<string, string[]> = {};
  steps.forEach((s, i) => {
    s.ingredients.forEach((ing, j) => {
      const known = ing.kind === 'chemical' ? chemicals.has(ing.refId) : dyestuffs.has(ing.refId);
      if (!known) fields[`steps.${i}.ingredients.${j}.refId`] = [`No such ${ing.kind} in the reference.`];
    });
    if (s.batchId != null && !batches.has(s.batchId)) fields[`steps.${i}.batchId`] = ['Choose a bath from the list.'];
  });
  if (Object.keys(fields).length) throw badRequest('Some fields are not valid.', { fields });
  return { chemicals, dyestuffs };
}

export async function checkChemical(field: string, id: number | null | undefined, transaction: Transaction) {
  if (id == null) return null;
  const c = await Chemical.findByPk(id, { transaction });
  if (!c) throw fieldError(field, 'No such chemical in the reference.');
  return c;
}
