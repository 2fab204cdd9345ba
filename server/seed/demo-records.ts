import { readFileSync } from 'node:fs';
import path from 'node:path';
import type { Transaction } from 'sequelize';
import type { AnalysisFinding } from '../models/records.ts';
import type { Piece, User } from '../models/index.ts';
import { ROOT_DIR } from '../env.ts';
import { makeAnalysis, makeConditionReport, makeDisplayPeriod } from './factories.ts';

type DemoRecords = {
  analyses: Array<{
    piece: string;
    method: string;
    site: string;
    laboratory: string;
    analyst: string;
    analysedOn: string;
    findings: AnalysisFinding[];
    backs: { dyestuffs?: string[]; historicalMordants?: string[] };
  }>;
  conditionReports: Array<{ piece: string; assessedOn: string; assessor: string; state: string; notes: string }>;
  displays: Array<{
    piece: string;
    from: string;
    to: string;
    lux: number;
    hoursPerDay: number;
    uvMicrowattsPerLumen: number;
    place: string;
  }>;
};

/**
 * The analyses behind the demo pieces' "identified" entries (each entry gets its analysisId), condition
 * reports and display periods (server/seed/data/demo-records.json, an invented scenario).
 */
export async function seedDemoRecords(
  t: Transaction,
  { pieces, researcher, curator }: { pieces: Record<string, Piece>; researcher: User; curator: User },
) {
  const data = JSON.parse(
    readFileSync(path.join(ROOT_DIR, 'server/seed/data/demo-records.json'), 'utf8'),
  ) as DemoRecords;
  for (const a of data.analyses) {
    const { backs, piece: accession, ...values } = a;
    const piece = pieces[accession];
    const analysis = await makeAnalysis({ ...values, pieceId: piece.id, createdById: researcher.id }, t);
    const point = (list: Piece['dyestuffs'], names: string[] = []) =>
      list.map((x) =>
        names.includes(x.name) ? { ...x, evidence: 'identified' as const, analysisId: analysis.id } : x,
      );
    await piece.update(
      {
        dyestuffs: point(piece.dyestuffs, backs.dyestuffs),
        historicalMordants: point(piece.historicalMordants, backs.historicalMordants),
      },
      { transaction: t },
    );
  }
  for (const { piece, ...r } of data.conditionReports)
    await makeConditionReport({ ...r, pieceId: pieces[piece].id, createdById: curator.id }, t);
  for (const d of data.displays)
    await makeDisplayPeriod(
      {
        pieceId: pieces[d.piece].id,
        fromDate: d.from,
        toDate: d.to,
        lux: d.lux,
        hoursPerDay: d.hoursPerDay,
        uvMicrowattsPerLumen: d.uvMicrowattsPerLumen,
        place: d.place,
        createdById: curator.id,
      },
      t,
    );
}
