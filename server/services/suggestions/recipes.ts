import { Op } from 'sequelize';
import { deltaE00 } from '../../../shared/colour/difference.ts';
import { conditionsText, type Illuminant, type Observer } from '../../../shared/colour/conditions.ts';
import { spectrumToLab, type Spectrum } from '../../../shared/colour/spectral.ts';
import { bathVolumeL, gramsFromOwf } from '../../../shared/compute/recipe.ts';
import {
  leaveOneOut,
  quantile,
  strengthForTarget,
  type Conditions,
  type Rung,
} from '../../../shared/compute/kubelka-munk.ts';
import {
  suggestionTrialSchema,
  type RecipeSuggestion,
  type RecipeSuggestionsResponse,
  type SuggestionTrialInput,
} from '../../../shared/schemas/suggestions.ts';
import { audit } from '../audit.ts';
import type { SignedInCtx } from '../context.ts';
import { createTrial, replaceSteps } from '../trials/trials.ts';
import { badRequest, notFound } from '../../http/errors.ts';
import { Chemical, ColourMeasurement, MordantBatch, RecipeStep, Trial } from '../../models/index.ts';
import type { Ingredient } from '../../models/trials.ts';
import { resultCandidates, spectrumBehind, targetCandidates, type ResolvedColour } from '../trials/colour.ts';

/**
 * "What should I try first for this colour?" From the studio's own finished modern trials:
 * (a) the trials whose results are nearest the target (ΔE00 under the target's viewing conditions), and
 * (b) ladders, trials that differ only in the strength of one ingredient, interpolated in strength
 *     (shared/compute/kubelka-munk.ts: single-constant Kubelka–Munk when every rung was read as a spectrum, else
 *     along the ladder's measured L*a*b* path), extrapolation flagged.
 * A trial that uses a historical-only chemical is never a basis: suggestions are modern recipes only.
 */

type Lab = { L: number; a: number; b: number };
type Target = Lab & Conditions & { label: string; spectrum: Spectrum | null; source: 'instrument' | 'image-estimate' };
export type SuggestionTargetInput = {
  L?: number;
  a?: number;
  b?: number;
  illuminant?: Illuminant;
  observer?: Observer;
  paletteColourId?: number;
  regionId?: number;
  measurementId?: number;
};

/** The target colour and the conditions it holds under, resolved as a trial's target is. */
export async function resolveSuggestionTarget(q: SuggestionTargetInput): Promise<Target> {
  if (q.L != null && q.a != null && q.b != null)
    return {
      L: q.L,
      a: q.a,
      b: q.b,
      illuminant: q.illuminant ?? 'D65',
      observer: q.observer ?? '10',
      label: 'the colour typed in',
      spectrum: null,
      source: 'instrument',
    };
  const [first] = await targetCandidates({
    targetPaletteColourId: q.paletteColourId ?? null,
    targetRegionId: q.regionId ?? null,
    targetMeasurementId: q.measurementId ?? null,
  } as Trial);
  if (!first) {
    if (q.regionId != null) throw badRequest('This region has no palette colour or reading yet.');
    throw notFound(q.paletteColourId != null ? 'Palette colour' : q.measurementId != null ? 'Reading' : 'Region');
  }
  return { ...resolvedLab(first), label: first.label, spectrum: spectrumBehind(first), source: first.source };
}

const resolvedLab = (c: ResolvedColour) => ({
  L: c.L,
  a: c.a,
  b: c.b,
  illuminant: c.illuminant as Conditions['illuminant'],
  observer: c.observer as Conditions['observer'],
});

/** A finished trial's result under the target's conditions: a spectrum computed for them, or a reading under them. */
type Evidence = { trial: Trial; steps: RecipeStep[]; lab: Lab; spectrum: Spectrum | null; exact: boolean };

function resultUnder(target: Conditions, results: ResolvedColour[]): Omit<Evidence, 'trial' | 'steps'> | null {
  for (const r of results) {
    const s = spectrumBehind(r);
    if (s) return { lab: spectrumToLab(s, target.illuminant, target.observer).lab, spectrum: s, exact: true };
  }
  const same = results.filter((r) => r.illuminant === target.illuminant);
  const best = same.find((r) => r.observer === target.observer) ?? same[0];
  if (!best) return null;
  return { lab: { L: best.L, a: best.a, b: best.b }, spectrum: null, exact: best.observer === target.observer };
}

/** Repeated spectral readings of one swatch, averaged wavelength by wavelength (those on the first one's grid). */
function meanSpectrum(spectra: Spectrum[]): Spectrum | null {
  if (!spectra.length) return null;
  const [first] = spectra;
  const same = spectra.filter(
    (s) => s.startNm === first.startNm && s.intervalNm === first.intervalNm && s.values.length === first.values.length,
  );
  const values = first.values.map((_v, k) => same.reduce((sum, s) => sum + s.values[k], 0) / same.length);
  return { startNm: first.startNm, intervalNm: first.intervalNm, values };
}

async function gatherEvidence(target: Conditions): Promise<Evidence[]> {
  const trials = await Trial.findAll({ where: { status: 'finished', kind: 'modern' }, order: [['id', 'ASC']] });
  if (!trials.length) return [];
  const ids = trials.map((t) => t.id);
  const [steps, readings] = await Promise.all([
    RecipeStep.findAll({
      where: { trialId: ids },
      order: [
        ['trialId', 'ASC'],
        ['position', 'ASC'],
      ],
    }),
    ColourMeasurement.findAll({ where: { trialId: ids }, attributes: ['trialId', 'spectrum'] }),
  ]);
  const chemicalIds = [
    ...new Set(steps.flatMap((s) => s.ingredients.filter((i) => i.kind === 'chemical').map((i) => i.refId))),
  ];
  const historicalOnly = new Set(
    (
      await Chemical.findAll({
        where: { id: { [Op.in]: chemicalIds.length ? chemicalIds : [0] }, status: 'historical-only' },
        attributes: ['id'],
      })
    ).map((c) => c.id),
  );
  const stepsOf = new Map<number, RecipeStep[]>();
  for (const s of steps) stepsOf.set(s.trialId, [...(stepsOf.get(s.trialId) ?? []), s]);
  const read = new Set(readings.map((r) => r.trialId));
  const spectraOf = new Map<number, Spectrum[]>();
  for (const r of readings)
    if (r.spectrum && r.trialId != null) spectraOf.set(r.trialId, [...(spectraOf.get(r.trialId) ?? []), r.spectrum]);
  const out: Evidence[] = [];
  for (const trial of trials) {
    const own = stepsOf.get(trial.id) ?? [];
    if (!own.length) continue;
    if (own.some((s) => s.ingredients.some((i) => i.kind === 'chemical' && historicalOnly.has(i.refId)))) continue;
    // Trials without an instrument reading may still have a swatch photo (an image estimate, D65/2°).
    if (!read.has(trial.id) && target.illuminant !== 'D65') continue;
    const spectrum = meanSpectrum(spectraOf.get(trial.id) ?? []);
    const result = spectrum
      ? { lab: spectrumToLab(spectrum, target.illuminant, target.observer).lab, spectrum, exact: true }
      : resultUnder(target, await resultCandidates(trial));
    if (result) out.push({ trial, steps: own, ...result });
  }
  return out;
}

// --- Ladders -------------------------------------------------------------------------------------------------

/** Everything about a recipe that a ladder keeps the same, with one ingredient's amount left out. */
function signature(trial: Trial, steps: RecipeStep[], skip: { step: number; ingredient: number } | null) {
  return JSON.stringify([
    (trial.fibre ?? '').trim().toLowerCase(),
    steps.map((s, si) => [
      s.operation,
      s.liquorRatio,
      s.temperatureC,
      s.minutes,
      s.ph,
      s.ingredients
        .map((i, ii) => [i.kind, i.refId, i.basis, si === skip?.step && ii === skip.ingredient ? '*' : i.amount])
        .sort((x, y) => String(x).localeCompare(String(y))),
    ]),
  ]);
}

type Ladder = { rungs: Array<Evidence & { strength: number }>; step: number; ingredient: number; what: Ingredient };

/** Ladders among the evidence: groups of at least two trials with the same signature and different strengths. */
export function findLadders(evidence: Evidence[]): Ladder[] {
  const groups = new Map<string, Ladder>();
  for (const e of evidence)
    e.steps.forEach((s, si) =>
      s.ingredients.forEach((ing, ii) => {
        if (ing.basis === 'g') return; // a fixed weight does not scale with the fibre: not a strength
        const key = `${si}:${ing.kind}:${ing.refId}|${signature(e.trial, e.steps, { step: si, ingredient: ii })}`;
        const g = groups.get(key) ?? { rungs: [], step: si, ingredient: ii, what: ing };
        // One rung per strength: a repeat dyeing at the same strength is averaged by the reader, not here.
        if (!g.rungs.some((r) => r.strength === ing.amount)) g.rungs.push({ ...e, strength: ing.amount });
        groups.set(key, g);
      }),
    );
  return [...groups.values()]
    .filter((g) => g.rungs.length >= 2)
    .map((g) => ({ ...g, rungs: g.rungs.sort((x, y) => x.strength - y.strength) }));
}

const rungsOf = (l: Ladder): Rung[] => l.rungs.map((r) => ({ strength: r.strength, lab: r.lab, spectrum: r.spectrum }));

// --- Recipes -------------------------------------------------------------------------------------------------

const round = (x: number, d: number) => Math.round(x * 10 ** d) / 10 ** d;

type BathOffer = { id: number; code: string; name: string };
/** Active baths by the chemicals they hold. */
async function activeBaths(): Promise<Map<number, BathOffer[]>> {
  const out = new Map<number, BathOffer[]>();
  for (const b of await MordantBatch.findAll({ where: { status: 'active' }, order: [['code', 'ASC']] }))
    for (const i of b.ingredients)
      if (i.kind === 'chemical')
        out.set(i.refId, [...(out.get(i.refId) ?? []), { id: b.id, code: b.code, name: b.name }]);
  return out;
}

function scaledSteps(
  steps: RecipeStep[],
  dryMassG: number,
  baths: Map<number, BathOffer[]>,
  set?: { step: number; ingredient: number; amount: number },
) {
  return steps.map((s, si) => ({
    baths: [
      ...new Map(
        s.ingredients.flatMap((i) => (i.kind === 'chemical' ? (baths.get(i.refId) ?? []) : [])).map((b) => [b.id, b]),
      ).values(),
    ],
    operation: s.operation,
    liquorRatio: s.liquorRatio,
    temperatureC: s.temperatureC,
    minutes: s.minutes,
    ph: s.ph,
    notes: s.notes,
    ingredients: s.ingredients.map((ing, ii) => {
      const interpolated = set?.step === si && set.ingredient === ii;
      const amount = interpolated ? round(set!.amount, ing.basis === 'owf' ? 1 : 2) : ing.amount;
      const grams =
        ing.basis === 'owf'
          ? gramsFromOwf(amount, dryMassG)
          : ing.basis === 'g/L'
            ? s.liquorRatio
              ? amount * bathVolumeL(dryMassG, s.liquorRatio)
              : null
            : amount;
      return {
        kind: ing.kind,
        refId: ing.refId,
        name: ing.name,
        amount,
        basis: ing.basis,
        grams: grams == null ? null : round(grams, 3),
        interpolated,
      };
    }),
  }));
}

const basisWords = { owf: '% owf', 'g/L': 'g/L', g: 'g' } as const;
const amountText = (i: { amount: number; basis: keyof typeof basisWords }) =>
  `${round(i.amount, 2)} ${basisWords[i.basis]}`;

function confidenceOf(deltaE: number, expected: number | null, extrapolated: boolean): RecipeSuggestion['confidence'] {
  if (extrapolated) return 'low';
  const worst = Math.max(deltaE, expected ?? 0);
  if (expected === null && deltaE > 2) return deltaE <= 5 ? 'medium' : 'low';
  return worst <= 2 ? 'high' : worst <= 5 ? 'medium' : 'low';
}

/** Ranked suggestions for a target colour. */
export async function suggestRecipes(
  q: SuggestionTargetInput & { dryMassG: number; limit: number },
): Promise<RecipeSuggestionsResponse> {
  const target = await resolveSuggestionTarget(q);
  const conditions: Conditions = { illuminant: target.illuminant, observer: target.observer };
  const where = conditionsText(conditions);
  const [evidence, baths] = await Promise.all([gatherEvidence(conditions), activeBaths()]);
  const ladders = findLadders(evidence);
  const items: RecipeSuggestion[] = [];

  for (const ladder of ladders) {
    const rungs = rungsOf(ladder);
    const found = strengthForTarget(rungs, target, conditions);
    const loo = leaveOneOut(rungs, conditions);
    const expected = loo.length ? quantile(loo, 0.5) : null;
    // The recipe of the rung nearest in strength, with the varied ingredient set to the strength found.
    const near = ladder.rungs.reduce((x, y) =>
      Math.abs(Math.log(y.strength / found.strength)) < Math.abs(Math.log(x.strength / found.strength)) ? y : x,
    );
    const steps = scaledSteps(near.steps, q.dryMassG, baths, {
      step: ladder.step,
      ingredient: ladder.ingredient,
      amount: found.strength,
    });
    const range = `${amountText({ ...ladder.what, amount: ladder.rungs[0].strength })} to ${amountText({
      ...ladder.what,
      amount: ladder.rungs[ladder.rungs.length - 1].strength,
    })}`;
    const how =
      found.prediction.method === 'kubelka-munk'
        ? 'K/S interpolated at each wavelength from the rungs’ spectra (single-constant Kubelka–Munk)'
        : 'interpolated along the rungs’ measured L*a*b*';
    items.push({
      basis: ladder.rungs.map((r) => ({ id: r.trial.id, code: r.trial.code, strength: r.strength })),
      source: 'ladder',
      recipe: { dryMassG: q.dryMassG, steps },
      predicted: {
        lab: found.prediction.lab,
        deltaE00: found.deltaE00,
        method: found.prediction.method,
        extrapolated: found.prediction.extrapolated,
      },
      expectedError: {
        deltaE00: expected,
        basis: loo.length
          ? `median of ${loo.length} leave-one-out prediction${loo.length > 1 ? 's' : ''} on this ladder`
          : 'two rungs only: no rung left to check a prediction against',
      },
      confidence: confidenceOf(found.deltaE00, expected, found.prediction.extrapolated),
      explanation:
        `${ladder.what.name} at ${amountText({ ...ladder.what, amount: found.strength })}, from a ladder of ` +
        `${ladder.rungs.length} trials (${range}), ${how}, under ${where}.` +
        (found.prediction.extrapolated
          ? ' This strength lies outside the ladder: an extrapolation, so treat it as a first guess.'
          : ''),
    });
  }

  const nearest = evidence
    .map((e) => ({ e, d: deltaE00(target, e.lab) }))
    .sort((x, y) => x.d - y.d)
    .slice(0, q.limit);
  for (const { e, d } of nearest)
    items.push({
      basis: [{ id: e.trial.id, code: e.trial.code, strength: null }],
      source: 'nearest-trial',
      recipe: { dryMassG: q.dryMassG, steps: scaledSteps(e.steps, q.dryMassG, baths) },
      predicted: { lab: e.lab, deltaE00: d, method: 'as-dyed', extrapolated: false },
      expectedError: { deltaE00: d, basis: 'its own result; a repeat dyeing varies by a little more' },
      confidence: confidenceOf(d, null, false),
      explanation:
        `Trial ${e.trial.code} as dyed came out ΔE00 ${d.toFixed(1)} from this colour under ${where}` +
        (e.exact ? '.' : ' (its reading is for the other observer).'),
    });

  const penalty = (s: RecipeSuggestion) =>
    s.predicted.deltaE00 + (s.expectedError.deltaE00 ?? 0) + (s.predicted.extrapolated ? 3 : 0);
  items.sort((x, y) => penalty(x) - penalty(y));
  return {
    target: {
      L: target.L,
      a: target.a,
      b: target.b,
      illuminant: target.illuminant,
      observer: target.observer,
      source: target.source,
      label: target.label,
    },
    items: items.slice(0, q.limit),
    considered: { trials: evidence.length, ladders: ladders.length },
  };
}

/** "Try this": a planned trial with the suggested recipe, its target and the evidence as its notes, in one transaction. */
export async function createSuggestedTrial({ actor, transaction, input }: SignedInCtx<SuggestionTrialInput>) {
  const v = suggestionTrialSchema.parse(input);
  const trial = await createTrial({
    actor,
    transaction,
    input: {
      pieceId: v.pieceId ?? null,
      kind: 'modern',
      status: 'planned',
      dryMassG: v.dryMassG,
      fibre: v.fibre ?? null,
      notes: `Suggested recipe. ${v.evidence}`,
      targetPaletteColourId: v.targetPaletteColourId ?? null,
      targetRegionId: v.targetRegionId ?? null,
      targetMeasurementId: v.targetMeasurementId ?? null,
    },
  });
  await replaceSteps({ actor, transaction, input: { steps: v.steps, trial } });
  await audit({ actor, transaction }, 'trial', trial.id, 'trial-suggested', {
    evidence: { from: null, to: v.evidence },
  });
  return trial;
}

/**
 * Leave-one-out on every ladder the finished trials form (`npm run bench -- suggest`): per ladder, what it varies and
 * the ΔE00 of each inner rung predicted from the others, under the given conditions.
 */
export async function ladderEvaluation(conditions: Conditions) {
  const ladders = findLadders(await gatherEvidence(conditions));
  return ladders.map((l) => ({
    what: `${l.what.name} (${l.rungs.map((r) => r.strength).join(', ')} ${basisWords[l.what.basis]})`,
    method: l.rungs.every((r) => r.spectrum) ? ('kubelka-munk' as const) : ('lab-path' as const),
    errors: leaveOneOut(rungsOf(l), conditions),
  }));
}
