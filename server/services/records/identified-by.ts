import { QueryTypes, type Transaction } from 'sequelize';
import { sequelize } from '../../models/index.ts';

/**
 * The "identified by" facet's values: for each piece, the methods of the analyses its identified dyestuffs and
 * mordants point at (not every analysis of the piece: an XRF that found nothing identifies nothing). For the
 * search index the same rule is worked out in server/search/docs.ts from rows it reads anyway; MariaDB 10.6+ for
 * JSON_TABLE. A piece's value changes when its dyestuffs or mordants change (a Piece write) and when an analysis they
 * cite changes its method (PATCH /api/analyses/:id): server/search/hooks.ts logs both for search.
 */
export const IDENTIFIED_BY_SQL = `
SELECT DISTINCT p.id AS pieceId, a.method AS method
FROM pieces p
JOIN JSON_TABLE(
  JSON_MERGE_PRESERVE(p.dyestuffs, p.historicalMordants), '$[*]'
  COLUMNS (evidence VARCHAR(20) PATH '$.evidence', analysisId INT UNSIGNED PATH '$.analysisId')
) t ON t.evidence = 'identified' AND t.analysisId IS NOT NULL
JOIN analyses a ON a.id = t.analysisId AND a.pieceId = p.id
WHERE p.deletedAt IS NULL`;

/** Methods per piece (all pieces, or the ones named), as a map pieceId → sorted methods. */
export async function identifiedByMethods(pieceIds?: number[], transaction?: Transaction) {
  if (pieceIds && !pieceIds.length) return new Map<number, string[]>();
  const rows = await sequelize.query<{ pieceId: number; method: string }>(
    `${IDENTIFIED_BY_SQL}${pieceIds ? ' AND p.id IN (:pieceIds)' : ''} ORDER BY p.id, a.method`,
    { type: QueryTypes.SELECT, replacements: { pieceIds: pieceIds ?? [] }, transaction },
  );
  const out = new Map<number, string[]>();
  for (const r of rows) out.set(r.pieceId, [...(out.get(r.pieceId) ?? []), r.method]);
  return out;
}
