import { computedFastnessGrades } from '../../shared/compute/fastness-grades.ts';
import type { Fastness } from '../../shared/schemas/fastness.ts';
import type { TrialStatus } from '../models/trials.ts';
import type {
  Chemical,
  ColourMeasurement,
  Dyestuff,
  Photo,
  Piece,
  RecipeStep,
  Substitution,
  Trial,
  User,
} from '../models/index.ts';
import { abilities, type Actor } from '../policies/index.ts';
import { computeStep, gramsInStep, trialRecipeMass, type QStep } from '../../shared/trials/quantities.ts';
import { mordantChecks } from '../../shared/compute/mordant-checks.ts';
import { incompatibleInStep } from '../../shared/compute/incompatible.ts';
import { trialMetalLoad } from '../../shared/trials/metal-load.ts';
import { isHazardous } from './chemical-caution.ts';
import { presentChemical } from './reference.ts';
import type {
  MeasurementView,
  StepWarning,
  TrialColourOut,
  TrialSummaryView,
  TrialView,
} from '../../shared/schemas/trial.ts';

type Colour = TrialColourOut;
const TRIAL_ACTIONS = ['trial:update', 'trial:delete'] as const;

export const trialPolicyRecord = (t: Trial) => ({ ownerId: t.dyerId });

const pieceRef = (p: Piece | null | undefined) =>
  p ? { id: p.id, accessionNumber: p.accessionNumber, title: p.title, createdById: p.createdById } : null;
const userRef = (u: User | null | undefined) => (u ? { id: u.id, name: u.name } : null);

export type { MeasurementView, StepWarning, TrialSummaryView, TrialView };

export function presentTrialSummary(
  t: Trial & { piece?: Piece | null; dyer?: User | null },
  actor: Actor,
  colour: Colour | null,
): TrialSummaryView {
  return {
    id: t.id,
    code: t.code,
    kind: t.kind,
    status: t.status as TrialStatus,
    piece: pieceRef(t.piece),
    dyer: userRef(t.dyer),
    fibre: t.fibre,
    dryMassG: t.dryMassG,
    dryMassBasis: t.dryMassBasis,
    startedOn: t.startedOn,
    notes: t.notes,
    updatedAt: t.updatedAt.toISOString(),
    colour,
    abilities: abilities(actor, TRIAL_ACTIONS, trialPolicyRecord(t)),
  };
}

const toQStep = (s: RecipeStep): QStep => ({
  operation: s.operation,
  ingredients: s.ingredients,
  liquorRatio: s.liquorRatio,
  paste: s.paste
    ? { volumeMl: Number(s.paste.volumeMl), stockGPerL: s.paste.stockGPerL == null ? null : Number(s.paste.stockGPerL) }
    : null,
});

type DetailParts = {
  steps: RecipeStep[];
  substitutions: Substitution[];
  measurements: ColourMeasurement[];
  photos: Photo[];
  chemicals: Map<number, Chemical>;
  dyestuffs: Map<number, Dyestuff>;
  batches: Map<number, { id: number; code: string; name: string; status: string; remainingMl: number }>;
  /** Who confirmed a historical-only chemical on a step, by user id. */
  people?: Map<number, { id: number; name: string }>;
  colour: Colour;
};

export function presentTrial(
  t: Trial & { piece?: Piece | null; dyer?: User | null },
  actor: Actor,
  parts: DetailParts,
): TrialView {
  const roles = new Map([...parts.chemicals].map(([id, c]) => [id, c.role as string]));
  // Every % owf is of the air-dry (commercial) mass: an oven-dry mass is brought to it with the fibre's regain.
  const mass = trialRecipeMass(t);
  const massG = mass.recipeMassG;
  const stepById = new Map(parts.steps.map((s) => [s.id, s]));
  const steps = parts.steps.map((s) => {
    const q = toQStep(s);
    const chems = s.ingredients
      .filter((i) => i.kind === 'chemical')
      .map((i) => parts.chemicals.get(i.refId))
      .filter((c): c is Chemical => Boolean(c));
    const historical: StepWarning[] =
      t.kind === 'modern'
        ? chems
            .filter((c) => c.status === 'historical-only')
            .map((c) => ({
              code: 'historical-only-in-modern' as const,
              chemicalId: c.id,
              name: c.name,
              message: `${c.name} is recorded for historical recipes only. Do not use it in a modern trial; see the substitutions and the supplier's safety data sheet.`,
            }))
        : [];
    const unique = [...new Map(chems.map((c) => [c.id, c])).values()];
    const mixes: StepWarning[] = incompatibleInStep(
      s.position,
      unique.map((c) => ({ id: c.id, name: c.name, formula: c.formula, role: c.role })),
    ).map((w) => ({
      code: 'incompatible-mix' as const,
      pair: w.code,
      chemicals: w.chemicals,
      message: w.message,
      hazard: w.hazard,
      source: w.source,
    }));
    const warnings = [...historical, ...mixes];
    return {
      id: s.id,
      position: s.position,
      operation: s.operation,
      ingredients: s.ingredients.map((i) => ({
        kind: i.kind,
        refId: i.refId,
        amount: i.amount,
        basis: i.basis,
        name:
          (i.kind === 'chemical' ? parts.chemicals.get(i.refId)?.name : parts.dyestuffs.get(i.refId)?.name) ?? i.name,
      })),
      liquorRatio: s.liquorRatio,
      temperatureC: s.temperatureC,
      minutes: s.minutes,
      ph: s.ph,
      paste: q.paste && { volumeMl: q.paste.volumeMl, stockGPerL: q.paste.stockGPerL ?? null },
      batchId: s.batchId,
      batch: s.batchId != null ? (parts.batches.get(s.batchId) ?? null) : null,
      batchVolumeMl: s.batchVolumeMl,
      notes: s.notes,
      computed: computeStep(q, massG, roles),
      cautions: [...new Map(chems.filter(isHazardous).map((c) => [c.id, presentChemical(c)])).values()],
      warnings,
      historicalUse: s.historicalUseConfirmedAt
        ? {
            reason: s.historicalUseReason,
            confirmedBy:
              s.historicalUseConfirmedById != null
                ? (parts.people?.get(s.historicalUseConfirmedById) ?? { id: s.historicalUseConfirmedById, name: null })
                : null,
            confirmedAt: s.historicalUseConfirmedAt.toISOString(),
          }
        : null,
    };
  });

  const chemOf = (id: number | null) => (id != null ? (parts.chemicals.get(id) ?? null) : null);
  const substitutions = parts.substitutions.map((s) => {
    const h = chemOf(s.historicalChemicalId);
    const m = chemOf(s.modernChemicalId);
    const step = s.stepId != null ? stepById.get(s.stepId) : undefined;
    const modernFromRecipe =
      s.modernAmountG == null && m && step ? gramsInStep(toQStep(step), m.id, massG, roles) : null;
    return {
      id: s.id,
      stepId: s.stepId,
      stepPosition: step?.position ?? null,
      historicalChemical: h ? presentChemical(h) : null,
      historicalPractice: s.historicalPractice,
      historicalAmountG: s.historicalAmountG,
      modernChemical: m ? presentChemical(m) : null,
      modernPractice: s.modernPractice,
      modernAmountG: s.modernAmountG,
      /** The modern amount used in the metal load: as entered, or from the recipe step. */
      modernAmountUsedG: s.modernAmountG ?? modernFromRecipe,
      modernAmountFrom:
        s.modernAmountG != null ? ('entered' as const) : modernFromRecipe != null ? ('recipe' as const) : null,
      reason: s.reason,
      notes: s.notes,
    };
  });
  const metalLoad = trialMetalLoad(
    substitutions.map((s) => ({
      historical: s.historicalChemical ? { formula: s.historicalChemical.formula, grams: s.historicalAmountG } : null,
      modern: s.modernChemical ? { formula: s.modernChemical.formula, grams: s.modernAmountUsedG } : null,
    })),
    massG,
  );
  const mordant = mordantChecks({
    fibre: t.fibre,
    steps: steps.map((s) => ({
      position: s.position,
      operation: s.operation,
      ingredients: s.ingredients.map((i, j) => ({
        kind: i.kind,
        refId: i.refId,
        name: i.name,
        percentOwf: s.computed.ingredients[j]?.percentOwf ?? null,
      })),
    })),
    chemicals: new Map(
      [...parts.chemicals].map(([id, c]) => [id, { id, name: c.name, formula: c.formula, role: c.role }]),
    ),
    dyestuffClasses: new Map([...parts.dyestuffs].map(([id, d]) => [id, d.dyeClass ?? null])),
  });

  return {
    ...presentTrialSummary(t, actor, parts.colour),
    weave: t.weave,
    gsm: t.gsm,
    fastness: t.fastness,
    fastnessComputed: computedFastnessGrades(t.fastness as Fastness | null),
    target: {
      paletteColourId: t.targetPaletteColourId,
      regionId: t.targetRegionId,
      measurementId: t.targetMeasurementId,
      aim: t.targetAim ?? null,
    },
    steps,
    substitutions,
    metalLoad,
    /** The dry mass as weighed and the air-dry mass the recipe is worked on. */
    mass,
    /**
     * Fibre-aware mordant ranges (common practice, recalled from memory) and the recipe's warnings:
     * alum on a plant fibre without tannin or alkali, and dangerous pairs within a step.
     */
    checks: {
      fibre: mordant.fibre,
      fibreClass: mordant.fibreClass,
      mordant: mordant.mordant,
      warnings: [
        ...mordant.warnings,
        ...steps.flatMap((s) =>
          s.warnings.filter((w) => w.code === 'incompatible-mix').map((w) => ({ ...w, stepPosition: s.position })),
        ),
      ],
    },
    measurements: parts.measurements.map(presentMeasurement),
    photos: parts.photos.map((p) => ({
      id: p.id,
      width: p.width,
      height: p.height,
      view: p.view,
      caption: p.caption,
      originalName: p.originalName,
    })),
    warnings: steps.flatMap((s) => s.warnings.map((w) => ({ ...w, stepPosition: s.position }))),
    historicalRecord: t.kind === 'historical',
  };
}

export const presentMeasurement = (m: ColourMeasurement): MeasurementView => ({
  id: m.id,
  L: m.L,
  a: m.a,
  b: m.b,
  illuminant: m.illuminant,
  observer: m.observer,
  geometry: m.geometry,
  specular: m.specular,
  instrument: m.instrument,
  label: m.label,
  takenOn: m.takenOn,
  source: m.source,
  spectrum: m.spectrum ?? null,
});
