import type { Transaction } from 'sequelize';
import type { EvidencedTermInput } from '../../../shared/schemas/piece.ts';
import { badRequest } from '../../http/errors.ts';
import { Analysis } from '../../models/index.ts';

/**
 * An "identified" dyestuff or mordant must point at an analysis of this very piece (a new piece has none yet:
 * it is catalogued with "attributed", and marked identified once its analysis is recorded).
 */
export async function checkIdentifiedAnalyses(
  pieceId: number | null,
  input: { dyestuffs?: EvidencedTermInput[]; historicalMordants?: EvidencedTermInput[] },
  transaction: Transaction,
) {
  const fields: Record<string, string[]> = {};
  const wanted: Array<[string, number]> = [];
  for (const field of ['dyestuffs', 'historicalMordants'] as const)
    input[field]?.forEach((t, i) => {
      if (t.evidence === 'identified' && t.analysisId != null) wanted.push([`${field}.${i}.analysisId`, t.analysisId]);
    });
  if (!wanted.length) return;
  const ids = [...new Set(wanted.map(([, id]) => id))];
  const known = new Set(
    pieceId === null
      ? []
      : (await Analysis.findAll({ where: { id: ids, pieceId }, attributes: ['id'], transaction })).map((a) => a.id),
  );
  for (const [path, id] of wanted)
    if (!known.has(id))
      fields[path] = [
        pieceId === null
          ? 'A new piece has no analyses yet: catalogue it as attributed, then record the analysis'
          : 'Choose one of the analyses of this piece',
      ];
  if (Object.keys(fields).length) throw badRequest('Some fields are not valid.', { fields });
}
