import type { Cell, MaterialsList } from '../../shared/compute/series.ts';
import type { SeriesDetail, SeriesSummary } from '../../shared/schemas/series.ts';
import type { Trial, TrialSeries } from '../models/index.ts';
import {
  cellKey,
  cellRecipe,
  cellRecipes,
  expand,
  gramsFromOwf,
  materialsList,
  roundTo,
  type StoredFactor,
} from '../services/series/plan.ts';

// Figures rounded for display: grams to 0.01 g, litres to 0.001 L.
const tidy = (m: MaterialsList['total']) => ({
  lines: m.lines.map((l) => ({
    ...l,
    grams: roundTo(l.grams, 2),
    gramsWithAllowance: roundTo(l.gramsWithAllowance, 2),
  })),
  fibreG: roundTo(m.fibreG, 2),
  bathL: roundTo(m.bathL, 3),
  bathLWithAllowance: roundTo(m.bathLWithAllowance, 3),
});

export const presentSeriesSummary = (s: TrialSeries): SeriesSummary => ({
  id: s.id,
  code: s.code,
  title: s.title,
  kind: s.kind,
  heldOn: s.heldOn,
  cellCount: s.cells.length,
  participantCount: s.participants.length,
  dryMassG: s.dryMassG,
});

export function presentSeries(s: TrialSeries, trials: Trial[], abilities: Record<string, boolean>): SeriesDetail {
  const factors = s.factors as StoredFactor[];
  const kept = new Set((s.cells as Cell[]).map((c) => cellKey(c)));
  const dry = s.dryMassG ?? 0;
  const cells = expand(factors).map((c) => ({
    key: cellKey(c),
    cell: c,
    kept: kept.has(cellKey(c)),
    recipe: cellRecipe(c, factors).map((st) => ({
      operation: st.operation,
      ingredients: st.ingredients.map((i) => ({ ...i, grams: roundTo(gramsFromOwf(i.amount, dry), 2) })),
    })),
  }));
  const keptCells = cells.filter((c) => c.kept).map((c) => c.cell);
  const participants = s.kind === 'workshop' ? Math.max(1, s.participants.length) : 1;
  const list =
    dry > 0
      ? materialsList(cellRecipes(keptCells, factors, dry, s.liquorRatio), {
          deadVolumePct: s.deadVolumePct,
          participants,
        })
      : null;
  return {
    ...presentSeriesSummary(s),
    pieceId: s.pieceId,
    target: {
      paletteColourId: s.targetPaletteColourId ?? null,
      regionId: s.targetRegionId ?? null,
      measurementId: s.targetMeasurementId ?? null,
    },
    factors,
    participants: s.participants,
    deadVolumePct: s.deadVolumePct,
    liquorRatio: s.liquorRatio,
    notes: s.notes,
    ownerId: s.ownerId,
    cells,
    keptCount: keptCells.length,
    materials: list
      ? {
          deadVolumePct: list.deadVolumePct,
          unresolved: list.unresolved,
          whole: tidy(list.total),
          perParticipant:
            s.kind === 'workshop' ? s.participants.map((code) => ({ code, ...tidy(list.perParticipant) })) : [],
        }
      : null,
    trials: trials.map((t) => ({ id: t.id, code: t.code, status: t.status, cell: t.cell, dryMassG: t.dryMassG })),
    abilities,
  };
}

export type { SeriesDetail, SeriesSummary };
