import {
  DISPOSAL_NOTICE,
  DRAW_ONLY_KINDS,
  type BatchDetail,
  type BatchEventOut,
  type BatchSummary,
} from '../../shared/schemas/batches.ts';
import { madeByReaction } from '../../shared/compute/stoichiometry.ts';
import type { ChemicalView } from '../../shared/schemas/reference.ts';
import type { BatchEvent, MordantBatch } from '../models/index.ts';
import type { Figures } from '../services/batches/ledger-figures.ts';

export const presentBatchEvent = (
  e: BatchEvent,
  trialCodes: ReadonlyMap<number, string> = new Map(),
): BatchEventOut => ({
  id: e.id,
  type: e.type,
  volumeMl: e.volumeMl,
  fibreMassG: e.fibreMassG,
  trialId: e.trialId,
  stepId: e.stepId ?? null,
  trialCode: e.trialId ? (trialCodes.get(e.trialId) ?? null) : null,
  additions: e.additions,
  ph: e.ph,
  result: e.result,
  route: e.route,
  ruleFollowed: e.ruleFollowed,
  notes: e.notes,
  occurredAt: e.occurredAt.toISOString(),
  createdById: e.createdById,
});

const STRIP_REASONS = {
  'low-strength': 'the estimated strength is below half the fresh bath',
  drift: 'the strips have drifted',
  'many-uses': 'three uses have passed without a strip',
} as const;

const today = () => new Date().toISOString().slice(0, 10);

export function presentBatchSummary(b: MordantBatch, f: Figures): BatchSummary {
  return {
    id: b.id,
    code: b.code,
    kind: b.kind,
    name: b.name,
    volumeMl: b.volumeMl,
    status: b.status,
    madeOn: b.madeOn,
    madeById: b.madeById,
    checkBy: b.checkBy,
    dueForCheck: b.status === 'active' && b.checkBy != null && b.checkBy <= today(),
    parentId: b.parentId,
    remainingMl: f.remainingMl,
    uses: f.uses,
    fibreMassG: f.fibreMassG,
    estimatedStrength: {
      value: f.estimatedStrength,
      estimate: true as const,
      basis:
        'relative to the bath as made (1 = as made), from the uptake per use the dyer set; an estimate, not a measurement',
    },
  };
}

export function presentBatch(
  b: MordantBatch,
  f: Figures,
  events: BatchEvent[],
  extra: {
    trialCodes: ReadonlyMap<number, string>;
    cautions: ChemicalView[];
    parent: { id: number; code: string } | null;
    children: Array<{ id: number; code: string; name: string }>;
    abilities: Record<string, boolean>;
  },
): BatchDetail {
  return {
    ...presentBatchSummary(b, f),
    ingredients: b.ingredients,
    thickenerGPerL: b.thickenerGPerL,
    ph: b.ph,
    uptakePerUse: b.uptakePerUse,
    notes: b.notes,
    made: made(b, f.estimatedStrength),
    uptake: DRAW_ONLY_KINDS.includes(b.kind)
      ? {
          value: 0,
          referenceLoadG: null,
          estimate: true,
          drawOnly: true,
          basis: 'only drawn from: a use takes volume, not strength',
        }
      : {
          value: b.uptakePerUse,
          referenceLoadG: f.referenceLoadG,
          estimate: true,
          drawOnly: false,
          basis: `share of the bath's mordant one load of ${f.referenceLoadG} g fibre takes up (the made volume at 1:20), scaled by the fibre mass of each use; a use without a fibre mass is liquor drawn off and takes none; an estimate, not a measurement`,
        },
    topUpSuggestion: f.topUp
      ? {
          items: f.topUp.ingredients,
          waterMl: f.topUp.waterMl,
          volumeAfterMl: f.topUp.volumeAfterMl,
          usesSinceTopUp: f.topUp.usesSinceTopUp,
          rule: `Brings the estimated strength back to the strength as made: each ingredient to its made g/L in ${f.topUp.volumeAfterMl} mL, and water back to the made volume, never more. From the ledger's estimate (${f.topUp.rule.source}); confirm with a test strip.`,
        }
      : null,
    testStripPrompt: f.testStrip.due
      ? `Dye a test strip before the next use: ${f.testStrip.reasons.map((r) => STRIP_REASONS[r]).join('; ')}.`
      : null,
    timeline: f.timeline,
    events: events.map((e) => presentBatchEvent(e, extra.trialCodes)),
    cautions: extra.cautions,
    parent: extra.parent,
    children: extra.children,
    disposalNotice: DISPOSAL_NOTICE,
    abilities: extra.abilities,
  };
}

const r2 = (x: number) => Math.round(x * 100) / 100;

/** A bath made by reaction in the pot: what its charge makes (computed, not the total weighed in), and now by the ledger's estimate. */
function made(b: MordantBatch, strength: number) {
  const m = madeByReaction(b.ingredients, b.volumeMl);
  if (!m) return null;
  return {
    reaction: m.reaction,
    active: {
      name: m.active.name,
      formula: m.active.formula,
      grams: r2(m.active.grams),
      gPerL: r2(m.active.gPerL),
      nowGPerL: { value: r2(m.active.gPerL * strength), estimate: true as const },
    },
    metal: m.metal ? { symbol: m.metal.symbol, gPerL: r2(m.metal.gPerL) } : null,
    limiting: m.limiting,
    excess: m.excess.map((x) => ({ name: x.name, grams: r2(x.grams) })),
    byProducts: m.byProducts.map((x) => ({ name: x.name, grams: r2(x.grams), fate: x.fate })),
    note: m.note,
    source: m.source,
  };
}

export type { BatchDetail, BatchEventOut, BatchSummary };
