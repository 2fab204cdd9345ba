import type { ConditionCreateInput } from '../../../shared/schemas/records.ts';
import { badRequest } from '../../http/errors.ts';
import { ConditionReport, Photo, Piece, Region } from '../../models/index.ts';
import { audit } from '../audit.ts';
import type { SignedInCtx } from '../context.ts';

export async function createConditionReport({
  actor,
  transaction,
  input,
}: SignedInCtx<{ piece: Piece; values: ConditionCreateInput }>) {
  const { piece, values } = input;
  // Linked photos and regions must belong to this piece.
  const photoIds = [...new Set(values.photoIds)];
  const regionIds = [...new Set(values.regionIds)];
  const fields: Record<string, string[]> = {};
  if (photoIds.length) {
    const found = await Photo.count({ where: { id: photoIds, pieceId: piece.id }, transaction });
    if (found !== photoIds.length) fields.photoIds = ['Choose photos of this piece'];
  }
  if (regionIds.length) {
    const regions = await Region.findAll({
      where: { id: regionIds },
      include: [{ model: Photo, as: 'photo', attributes: ['pieceId'], where: { pieceId: piece.id } }],
      transaction,
    });
    if (regions.length !== regionIds.length) fields.regionIds = ['Choose regions of photos of this piece'];
  }
  if (Object.keys(fields).length) throw badRequest('Some fields are not valid.', { fields });
  const report = await ConditionReport.create(
    {
      pieceId: piece.id,
      assessedOn: values.assessedOn,
      assessor: values.assessor,
      state: values.state,
      notes: values.notes ?? null,
      photoIds,
      regionIds,
      createdById: actor.id,
    },
    { transaction },
  );
  await audit({ actor, transaction }, 'piece', piece.id, 'condition-reported', {
    condition: { from: null, to: { id: report.id, assessedOn: report.assessedOn, state: report.state } },
  });
  return report;
}
