import type { Writable } from 'node:stream';
import { csvStringifier } from './csv.ts';
import { Op } from 'sequelize';
import { ConditionReport, Piece } from '../models/index.ts';
import {
  PIECE_CSV_FIELDS,
  LIST_SEPARATOR,
  formatEvidenced,
  type PieceCsvField,
} from '../../shared/schemas/piece-import.ts';

const PAGE = 1000;

/** One piece as CSV cells, in the import's own format so the file re-imports unchanged. */
export function pieceCells(p: Piece): Record<PieceCsvField, string> {
  const s = (v: string | number | null) => (v === null || v === undefined ? '' : String(v));
  return {
    accessionNumber: p.accessionNumber,
    objectName: p.objectName,
    title: p.title,
    dateText: s(p.dateText),
    dateEdtf: s(p.dateEdtf),
    earliestYear: s(p.earliestYear),
    latestYear: s(p.latestYear),
    place: s(p.place),
    fibres: p.fibres.join(LIST_SEPARATOR),
    weave: s(p.weave),
    threadCount: s(p.threadCount),
    heightMm: s(p.heightMm),
    widthMm: s(p.widthMm),
    repeatMm: s(p.repeatMm),
    techniques: p.techniques.join(LIST_SEPARATOR),
    dyestuffs: formatEvidenced(p.dyestuffs),
    historicalMordants: formatEvidenced(p.historicalMordants),
    description: s(p.description),
    provenance: s(p.provenance),
    condition: s(p.condition),
    creditLine: s(p.creditLine),
    status: p.status,
    patternName: s(p.patternName),
    storageLocation: s(p.storageLocation),
    objectRights: s(p.objectRights),
    imageRights: s(p.imageRights),
  };
}

/** Stream every (not deleted) piece, a page at a time, as UTF-8 CSV with a header row of field names. */
export async function writePiecesCsv(out: Writable) {
  // conditionReports is export-only (the import ignores a column it does not know): dated reports, newest first.
  const csv = csvStringifier({ header: true, columns: [...PIECE_CSV_FIELDS, 'conditionReports'], bom: false });
  csv.pipe(out);
  let lastId = 0;
  for (;;) {
    const page = await Piece.findAll({ where: { id: { [Op.gt]: lastId } }, order: [['id', 'ASC']], limit: PAGE });
    const reports = await conditionCells(page.map((p) => p.id));
    for (const p of page)
      if (!csv.write({ ...pieceCells(p), conditionReports: reports.get(p.id) ?? '' }))
        await new Promise((r) => csv.once('drain', r));
    if (page.length < PAGE) break;
    lastId = page[page.length - 1].id;
  }
  csv.end();
  await new Promise((resolve, reject) => out.on('finish', resolve).on('error', reject));
}

/** "2024-02-06: fair, stable (assessor)" per report, newest first, per piece. */
async function conditionCells(pieceIds: number[]) {
  const out = new Map<number, string>();
  if (!pieceIds.length) return out;
  const rows = await ConditionReport.findAll({
    where: { pieceId: pieceIds },
    order: [
      ['assessedOn', 'DESC'],
      ['id', 'DESC'],
    ],
  });
  for (const r of rows) {
    const cell = `${r.assessedOn}: ${r.state} (${r.assessor})`;
    out.set(r.pieceId, out.has(r.pieceId) ? `${out.get(r.pieceId)}${LIST_SEPARATOR}${cell}` : cell);
  }
  return out;
}
