/**
 * Bath draws when a recipe is scaled to another dry mass: the volume drawn from a bath scales with the
 * mass, as the bath or paste it makes up does. A bath that would not hold the scaled draws is named.
 */
export type DrawStep = {
  batchId: number | null;
  batchVolumeMl: number | null;
  batch?: { code: string; remainingMl: number; status: string } | null;
};
export type DrawWarning = {
  batchId: number;
  code: string;
  neededMl: number;
  heldMl: number;
  status: string;
  message: string;
};

export const scaleDraw = (volumeMl: number | null, fromDryMassG: number, toDryMassG: number) =>
  volumeMl == null || !(fromDryMassG > 0) ? volumeMl : (volumeMl * toDryMassG) / fromDryMassG;

const ml = (x: number) => `${Math.round(x).toLocaleString('en-GB')} mL`;

/** Per bath, the scaled recipe's draws summed, against what the bath holds now (its ledger's remaining volume). */
export function drawWarnings(steps: readonly DrawStep[], fromDryMassG: number, toDryMassG: number): DrawWarning[] {
  const need = new Map<number, { code: string; neededMl: number; heldMl: number; status: string }>();
  for (const s of steps) {
    if (s.batchId == null || s.batchVolumeMl == null || !s.batch) continue;
    const v = scaleDraw(s.batchVolumeMl, fromDryMassG, toDryMassG)!;
    const cur = need.get(s.batchId) ?? {
      code: s.batch.code,
      neededMl: 0,
      heldMl: s.batch.remainingMl,
      status: s.batch.status,
    };
    cur.neededMl += v;
    need.set(s.batchId, cur);
  }
  const out: DrawWarning[] = [];
  for (const [batchId, n] of need) {
    // Half a millilitre of rounding is not a shortfall.
    if (n.neededMl <= n.heldMl + 0.5) continue;
    const state = n.status === 'disposed' ? ' (disposed of)' : n.status === 'exhausted' ? ' (exhausted)' : '';
    out.push({
      ...n,
      batchId,
      message: `Scaled, this recipe draws ${ml(n.neededMl)} from ${n.code}, which holds ${ml(n.heldMl)} now${state}: make up or top up the bath first.`,
    });
  }
  return out;
}
