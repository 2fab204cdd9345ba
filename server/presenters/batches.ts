import { DISPOSAL_NOTICE } from '../../shared/schemas/batches.ts';
import type { BatchEvent, MordantBatch } from '../models/index.ts';
import type { walkLedger } from '../services/batches/ledger-figures.ts';

type Figures = ReturnType<typeof walkLedger>;

export const presentBatchEvent = (e: BatchEvent) => ({
  id: e.id, type: e.type, volumeMl: e.volumeMl, fibreMassG: e.fibreMassG, trialId: e.trialId, additions: e.additions, ph: e.ph,
  result: e.result, route: e.route, ruleFollowed: e.ruleFollowed, notes: e.notes, occurredAt: e.occurredAt.toISOString(), createdById: e.createdById,
});

const today = () => new Date().toISOString().slice(0, 10);

export function presentBatchSummary(b: MordantBatch, f: Figures) {
  return {
    id: b.id, code: b.code, kind: b.kind, name: b.name, volumeMl: b.volumeMl, status: b.status, madeOn: b.madeOn, madeById: b.madeById,
    checkBy: b.checkBy, dueForCheck: b.status === 'active' && b.checkBy != null && b.checkBy <= today(), parentId: b.parentId,
    remainingMl: f.remainingMl, uses: f.uses, fibreMassG: f.fibreMassG,
    estimatedStrength: { value: f.estimatedStrength, estimate: true, basis: 'relative to the fresh charge (1 = as made); each use takes the uptake share set for the batch [common practice]' },
  };
}

export function presentBatch(b: MordantBatch, f: Figures, events: BatchEvent[], extra: { cautions: Array<{ id: number; name: string; signalWord: string | null; hStatements: string[]; ppe: string | null; caution: string | null; status: string }>; parent: { id: number; code: string } | null; children: Array<{ id: number; code: string; name: string }>; abilities: Record<string, boolean> }) {
  return {
    ...presentBatchSummary(b, f),
    ingredients: b.ingredients, thickenerGPerL: b.thickenerGPerL, ph: b.ph, uptakePerUse: b.uptakePerUse, notes: b.notes,
    topUpSuggestion: { items: f.topUpSuggestion, rule: 'Add 25–50 % of the original charge per reuse [common practice, from memory]; check with a test strip.' },
    testStripPrompt: f.testStripDue ? 'The estimated strength has fallen below half the fresh charge: dye a test strip before the next use.' : null,
    timeline: f.timeline,
    events: events.map(presentBatchEvent),
    cautions: extra.cautions, parent: extra.parent, children: extra.children,
    disposalNotice: DISPOSAL_NOTICE,
    abilities: extra.abilities,
  };
}

export type BatchSummary = ReturnType<typeof presentBatchSummary>;
export type BatchDetail = ReturnType<typeof presentBatch>;
export type BatchEventOut = ReturnType<typeof presentBatchEvent>;
