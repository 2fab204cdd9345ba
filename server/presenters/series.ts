import { cellKey, type Cell } from '../../shared/schemas/series.ts';
import type { Trial, TrialSeries } from '../models/index.ts';
import { cellRecipe, expand, gramsFor, materials, type StoredFactor } from '../services/series/plan.ts';

export const presentSeriesSummary = (s: TrialSeries) => ({
  id: s.id, code: s.code, title: s.title, kind: s.kind, heldOn: s.heldOn, cellCount: s.cells.length, participantCount: s.participants.length, dryMassG: s.dryMassG,
});

export function presentSeries(s: TrialSeries, trials: Trial[], abilities: Record<string, boolean>) {
  const factors = s.factors as StoredFactor[];
  const names = factors.map((f) => f.name);
  const kept = new Set((s.cells as Cell[]).map((c) => cellKey(c, names)));
  const dry = s.dryMassG ?? 0;
  const cells = expand(factors).map((c) => {
    const key = cellKey(c, names);
    return {
      key, cell: c, kept: kept.has(key),
      recipe: cellRecipe(c, factors).map((st) => ({ operation: st.operation, ingredients: st.ingredients.map((i) => ({ ...i, grams: gramsFor(i.amount, dry) })) })),
    };
  });
  const keptCells = cells.filter((c) => c.kept).map((c) => c.cell);
  const perParticipant = materials(keptCells, factors, dry, s.deadVolumePct, s.liquorRatio);
  const copies = s.kind === 'workshop' ? Math.max(1, s.participants.length) : 1;
  const whole = materials(Array.from({ length: copies }, () => keptCells).flat(), factors, dry, s.deadVolumePct, s.liquorRatio);
  return {
    ...presentSeriesSummary(s),
    pieceId: s.pieceId, factors, participants: s.participants, deadVolumePct: s.deadVolumePct, liquorRatio: s.liquorRatio, notes: s.notes, ownerId: s.ownerId,
    cells, keptCount: keptCells.length,
    materials: { whole, perParticipant: s.kind === 'workshop' ? s.participants.map((code) => ({ code, ...perParticipant })) : [] },
    trials: trials.map((t) => ({ id: t.id, code: t.code, status: t.status, cell: t.cell, dryMassG: t.dryMassG })),
    abilities,
  };
}

export type SeriesSummary = ReturnType<typeof presentSeriesSummary>;
export type SeriesDetail = ReturnType<typeof presentSeries>;
