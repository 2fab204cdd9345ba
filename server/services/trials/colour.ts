import { Op } from 'sequelize';
import { differenceReport } from '../../../shared/colour/index.ts';
import { metamerism } from '../../../shared/colour/metamerism.ts';
import { spectrumToLab, type Spectrum } from '../../../shared/colour/spectral.ts';
import {
  conditionsText,
  IMAGE_ESTIMATE_CONDITIONS,
  type ColourSource,
  type Illuminant,
  type Observer,
  type ViewingConditions,
} from '../../../shared/colour/conditions.ts';
import { ILLUMINANTS } from '../../../shared/schemas/trial.ts';
import { ColourMeasurement, PaletteColour, Photo, Region, type Trial } from '../../models/index.ts';
import { verdictBands } from '../settings.ts';
import type { Bands } from '../../../shared/colour/difference.ts';
import { VARIANT_TRUST, VARIANT_WORDS } from '../../../shared/schemas/chart.ts';

export type { ColourSource };
type Lab = { L: number; a: number; b: number };
type Estimate = Lab & ViewingConditions & { source: 'image-estimate' };

/** A colour with the conditions it was measured or estimated under. */
export type ResolvedColour = Lab &
  ViewingConditions & {
    source: ColourSource;
    /** What the colour is, in words, e.g. "region 'ground red', measured". */
    label: string;
    /** How many instrument readings under these conditions were averaged (null for an image estimate). */
    readings: number | null;
    /** When an instrument reading replaced an image estimate of the same place, the estimate that was set aside. */
    setAside: Estimate | null;
  };

export type Difference = ReturnType<typeof differenceReport>;
/** One comparison: a target and a result under the same illuminant. */
export type Comparison = {
  illuminant: Illuminant;
  target: ResolvedColour;
  result: ResolvedColour;
  difference: Difference;
  observersDiffer: boolean;
  note: string | null;
  primary: boolean;
};
export type Missing = ViewingConditions & { message: string };

const lab = (x: Lab) => ({ L: x.L, a: x.a, b: x.b });
const conditionsOf = (m: ColourMeasurement): ViewingConditions => ({
  illuminant: m.illuminant as Illuminant,
  observer: m.observer as Observer,
});
const key = (c: ViewingConditions) => `${c.illuminant}/${c.observer}`;
const estimateOf = (pc: PaletteColour): Estimate => ({
  ...lab(pc),
  ...IMAGE_ESTIMATE_CONDITIONS,
  source: 'image-estimate',
});
const byConditions = (x: ViewingConditions, y: ViewingConditions) =>
  ILLUMINANTS.indexOf(x.illuminant) - ILLUMINANTS.indexOf(y.illuminant) || Number(y.observer) - Number(x.observer);

/** The spectrum behind a resolved reading of the original, kept beside it (never sent as such). */
const spectrumOf = new WeakMap<ResolvedColour, Spectrum>();

/** The reflectance spectrum behind a resolved reading, when it was read as one (recipe suggestions use it). */
export const spectrumBehind = (c: ResolvedColour): Spectrum | null => spectrumOf.get(c) ?? null;

const reading = (m: ColourMeasurement, label: string, setAside: Estimate | null = null): ResolvedColour => {
  const r: ResolvedColour = {
    ...lab(m),
    ...conditionsOf(m),
    source: 'instrument',
    label: m.label ?? label,
    readings: 1,
    setAside,
  };
  if (m.spectrum) spectrumOf.set(r, m.spectrum);
  return r;
};
// The label says which palette variant the estimate comes from (calibrated, corrected or raw).
const estimated = (pc: PaletteColour, label: string): ResolvedColour => ({
  ...estimateOf(pc),
  label: `${label}, ${VARIANT_WORDS[pc.variant]}`,
  readings: null,
  setAside: null,
});

/** Readings of one place of the original, newest first (an undated reading counts as oldest). */
const readingsOf = (where: Record<string, unknown>) =>
  ColourMeasurement.findAll({
    where: { ...where, trialId: { [Op.is]: null } },
    order: [
      ['takenOn', 'DESC'],
      ['id', 'DESC'],
    ],
  });

/** The newest reading under each set of conditions, leaving out the one already chosen. */
function newestPerConditions(rows: ColourMeasurement[], chosen: ColourMeasurement | null) {
  const seen = new Set(chosen ? [key(conditionsOf(chosen))] : []);
  return rows.filter((m) => {
    const k = key(conditionsOf(m));
    if (seen.has(k)) return false;
    seen.add(k);
    return true;
  });
}

/**
 * The estimate of a region (or of a whole photo): the leading non-background colour of its most trustworthy
 * variant (calibrated from a colour chart, then corrected from a grey patch, then raw).
 */
async function estimate(where: Record<string, unknown>) {
  const rows = await PaletteColour.findAll({ where: { ...where, background: false }, order: [['rank', 'ASC']] });
  for (const v of VARIANT_TRUST) {
    const row = rows.find((r) => r.variant === v);
    if (row) return row;
  }
  return null;
}

/**
 * The original's colours a trial aims at, the chosen target first: an instrument reading of the
 * same place outranks an image estimate. The rest are the same place under other conditions
 * (the newest reading under each, then the image estimate), for comparisons under other illuminants.
 */
export async function targetCandidates(trial: Trial): Promise<ResolvedColour[]> {
  if (trial.targetMeasurementId != null) {
    const m = await ColourMeasurement.findByPk(trial.targetMeasurementId);
    if (!m) return [];
    // The same place: the same region, or on the piece itself a reading with the same label.
    const place =
      m.regionId != null
        ? { regionId: m.regionId }
        : m.pieceId != null && m.label != null
          ? { pieceId: m.pieceId, regionId: { [Op.is]: null }, label: m.label }
          : null;
    const others = place ? newestPerConditions(await readingsOf(place), m) : [];
    const pc = m.regionId != null ? await estimate({ regionId: m.regionId }) : null;
    return [
      reading(m, 'instrument measurement of the original'),
      ...others.map((o) => reading(o, 'instrument measurement of the original')),
      ...(pc ? [estimated(pc, `palette of the measured region (${pc.name})`)] : []),
    ];
  }
  if (trial.targetRegionId != null) {
    const [rows, pc] = await Promise.all([
      readingsOf({ regionId: trial.targetRegionId }),
      estimate({ regionId: trial.targetRegionId }),
    ]);
    const est = pc ? estimated(pc, `palette of the target region (${pc.name})`) : null;
    if (!rows.length) return est ? [est] : [];
    const label = 'instrument measurement of the target region';
    return [
      reading(rows[0], label, pc ? estimateOf(pc) : null),
      ...newestPerConditions(rows, rows[0]).map((o) => reading(o, label)),
      ...(est ? [est] : []),
    ];
  }
  if (trial.targetPaletteColourId != null) {
    const pc = await PaletteColour.findByPk(trial.targetPaletteColourId);
    if (!pc) return [];
    const est = estimated(pc, `palette colour ${pc.name}${pc.tradeName ? ` (${pc.tradeName})` : ''}`);
    const rows = pc.regionId != null ? await readingsOf({ regionId: pc.regionId }) : [];
    if (!rows.length) return [est];
    const label = 'instrument measurement of the region this palette colour comes from';
    return [
      reading(rows[0], label, estimateOf(pc)),
      ...newestPerConditions(rows, rows[0]).map((o) => reading(o, label)),
      est,
    ];
  }
  return [];
}

/** The chosen target: the first candidate. */
export async function resolveTarget(trial: Trial): Promise<ResolvedColour | null> {
  return ((await targetCandidates(trial))[0] as ResolvedColour | undefined) ?? null;
}

/**
 * The trial's own colours: its instrument readings grouped by illuminant and observer, each
 * group averaged on its own (readings under different conditions are never averaged together),
 * then the estimate from its latest swatch photo (D65/2°).
 */
export async function resultCandidates(trial: Trial): Promise<ResolvedColour[]> {
  const [rows, photos] = await Promise.all([
    ColourMeasurement.findAll({ where: { trialId: trial.id }, order: [['id', 'ASC']] }),
    Photo.findAll({ where: { trialId: trial.id }, attributes: ['id'], order: [['id', 'DESC']] }),
  ]);
  const pc = photos.length ? await estimate({ photoId: photos[0].id, regionId: { [Op.is]: null } }) : null;
  const groups = new Map<string, ColourMeasurement[]>();
  for (const r of rows) groups.set(key(conditionsOf(r)), [...(groups.get(key(conditionsOf(r))) ?? []), r]);
  const measured = [...groups.values()].map((g): ResolvedColour => {
    const mean = (k: 'L' | 'a' | 'b') => g.reduce((s, r) => s + r[k], 0) / g.length;
    return {
      L: mean('L'),
      a: mean('a'),
      b: mean('b'),
      ...conditionsOf(g[0]),
      source: 'instrument',
      readings: g.length,
      label:
        g.length === 1 ? 'instrument reading of the swatch' : `mean of ${g.length} instrument readings of the swatch`,
      setAside: pc ? estimateOf(pc) : null,
    };
  });
  measured.sort(byConditions);
  return [...measured, ...(pc ? [estimated(pc, `swatch photo palette (${pc.name})`)] : [])];
}

/**
 * The result to compare with a target: only one under the target's illuminant. An instrument
 * reading outranks an image estimate, and the target's observer is preferred.
 */
export function matchResult(target: ViewingConditions, results: ResolvedColour[]) {
  const rank = (r: ResolvedColour) => (r.source === 'instrument' ? 0 : 2) + (r.observer === target.observer ? 0 : 1);
  return results.filter((r) => r.illuminant === target.illuminant).sort((x, y) => rank(x) - rank(y))[0] ?? null;
}

/** The result chosen for the trial's comparison. */
export async function resolveResult(trial: Trial): Promise<ResolvedColour | null> {
  const [target, results] = await Promise.all([resolveTarget(trial), resultCandidates(trial)]);
  return target ? matchResult(target, results) : ((results[0] as ResolvedColour | undefined) ?? null);
}

const sideWords = (c: ResolvedColour) => (c.source === 'instrument' ? 'reading' : 'image estimate');

/** Said beside the figures when the two colours were computed for different observers. */
export function observerNote(target: ResolvedColour, result: ResolvedColour) {
  if (target.observer === result.observer) return null;
  return `Observers differ: the original's ${sideWords(target)} is for the ${target.observer}° observer and the reproduction's ${sideWords(result)} for the ${result.observer}° observer (both under ${target.illuminant}). The figures are given, but part of the difference may come from the observer rather than the dyeing.`;
}

/** Which reading would make the comparison possible, in the words a dyer would act on. */
export function missingReading(target: ResolvedColour, results: ResolvedColour[]): Missing {
  const want = conditionsText(target);
  const elsewhere = results.filter((r) => r.source === 'instrument').map((r) => conditionsText(r));
  const why = elsewhere.length
    ? ` Its readings under ${elsewhere.join(', ')} are not compared with a colour under ${target.illuminant}.`
    : '';
  const message =
    target.source === 'instrument'
      ? `No reading of the swatch under ${want}: measure it under ${target.illuminant} to compare with the original's reading.${why}`
      : `No reading of the swatch under ${target.illuminant} and no swatch photo: measure it under ${target.illuminant} or add a swatch photo to compare with the original's image estimate (${want}).${why}`;
  return { illuminant: target.illuminant, observer: target.observer, message };
}

/** A reading of the original measured as a spectrum, computed for other conditions. */
function underConditions(t: ResolvedColour, spectrum: Spectrum, c: ViewingConditions): ResolvedColour {
  const computed: ResolvedColour = {
    ...t,
    ...spectrumToLab(spectrum, c.illuminant, c.observer).lab,
    illuminant: c.illuminant,
    observer: c.observer,
    label: `${t.label}, computed from its spectrum for ${conditionsText(c)}`,
  };
  spectrumOf.set(computed, spectrum);
  return computed;
}

/**
 * The swatch under exactly the target's conditions when any of its readings is a spectrum: the
 * mean of its spectral readings computed for those conditions and of its plain readings taken
 * under them. Null when it has no spectral reading (the plain matching then applies).
 */
function fromSpectra(t: ViewingConditions, rows: ColourMeasurement[]): ResolvedColour | null {
  const spectral = rows.filter((r) => r.spectrum);
  if (!spectral.length) return null;
  const plain = rows.filter((r) => !r.spectrum && r.illuminant === t.illuminant && r.observer === t.observer);
  const labs = [...spectral.map((r) => spectrumToLab(r.spectrum!, t.illuminant, t.observer).lab), ...plain.map(lab)];
  const mean = (k: 'L' | 'a' | 'b') => labs.reduce((s, x) => s + x[k], 0) / labs.length;
  const n = labs.length;
  const from = `${spectral.length === 1 ? 'a spectrum' : `${spectral.length} spectra`} computed for ${conditionsText(t)}`;
  return {
    L: mean('L'),
    a: mean('a'),
    b: mean('b'),
    illuminant: t.illuminant,
    observer: t.observer,
    source: 'instrument',
    readings: n,
    label:
      n === 1
        ? `instrument reading of the swatch (${from})`
        : `mean of ${n} instrument readings of the swatch (${from})`,
    setAside: null,
  };
}

/**
 * The original's spectrum against the swatch's under every illuminant: the swatch's newest
 * spectral reading, averaged with the others on the same wavelengths.
 */
function pairMetamerism(target: ResolvedColour, reference: Spectrum, rows: ColourMeasurement[], bands: Bands) {
  const spectral = rows.filter((r) => r.spectrum);
  if (!spectral.length) return null;
  const newest = spectral[spectral.length - 1].spectrum!;
  const same = spectral
    .map((r) => r.spectrum!)
    .filter(
      (s) =>
        s.startNm === newest.startNm && s.intervalNm === newest.intervalNm && s.values.length === newest.values.length,
    );
  const sample: Spectrum = {
    ...newest,
    values: newest.values.map((_, i) => same.reduce((sum, s) => sum + s.values[i], 0) / same.length),
  };
  return {
    ...metamerism(reference, sample, target.observer, bands),
    reference: { label: target.label, spectrum: reference },
    sample: {
      label:
        same.length === 1 ? 'spectral reading of the swatch' : `mean of ${same.length} spectral readings of the swatch`,
      readings: same.length,
      spectrum: sample,
    },
  };
}

/**
 * Target, result and their difference with the verdict from the bands in force. The primary
 * comparison is under the chosen target's illuminant; `comparisons` also gives one under every
 * other illuminant both sides were read under (useful for judging metamerism).
 */
export async function trialColour(trial: Trial) {
  const [targets, results, { bands, source }, readings] = await Promise.all([
    targetCandidates(trial),
    resultCandidates(trial),
    verdictBands(),
    ColourMeasurement.findAll({ where: { trialId: trial.id }, order: [['id', 'ASC']] }),
  ]);
  const target = (targets[0] as ResolvedColour | undefined) ?? null;
  const compare = (t: ResolvedColour, primary: boolean): Comparison | null => {
    const r = fromSpectra(t, readings) ?? matchResult(t, results);
    if (!r) return null;
    return {
      illuminant: t.illuminant,
      target: t,
      result: r,
      difference: differenceReport(lab(t), lab(r), bands),
      observersDiffer: t.observer !== r.observer,
      note: observerNote(t, r),
      primary,
    };
  };
  const primary = target ? compare(target, true) : null;
  const comparisons: Comparison[] = primary ? [primary] : [];
  const illuminants = new Set([target?.illuminant]);
  for (const t of targets.slice(1)) {
    if (illuminants.has(t.illuminant)) continue;
    const c = compare(t, false);
    if (c) {
      illuminants.add(t.illuminant);
      comparisons.push(c);
    }
  }
  // An original measured as a spectrum answers under the conditions of every reading of the swatch.
  const targetSpectrum = target ? spectrumOf.get(target) : undefined;
  if (target && targetSpectrum)
    for (const r of results) {
      if (r.source !== 'instrument' || illuminants.has(r.illuminant)) continue;
      const c = compare(underConditions(target, targetSpectrum, r), !comparisons.some((x) => x.primary));
      if (c) {
        illuminants.add(r.illuminant);
        comparisons.push(c);
      }
    }
  const primaryComparison = comparisons.find((c) => c.primary) ?? null;
  const main = primaryComparison;
  return {
    target: main?.target ?? target,
    result: main?.result ?? (target ? null : ((results[0] as ResolvedColour | undefined) ?? null)),
    difference: main?.difference ?? null,
    conditions: main
      ? {
          illuminant: main.illuminant,
          targetObserver: main.target.observer,
          resultObserver: main.result.observer,
          observersDiffer: main.observersDiffer,
        }
      : null,
    note: main?.note ?? null,
    missing: target && !main ? missingReading(target, results) : null,
    /** Every colour of the trial: each group of readings under one set of conditions, then the swatch-photo estimate. */
    results,
    comparisons,
    bandsSource: source,
    metamerism: target && targetSpectrum ? pairMetamerism(target, targetSpectrum, readings, bands) : null,
  };
}

export type TrialColour = Awaited<ReturnType<typeof trialColour>>;

/** Instrument readings of a piece's original: on the piece itself or on a region of one of its photos. */
export async function pieceMeasurements(pieceId: number) {
  const photoIds = (await Photo.findAll({ where: { pieceId }, attributes: ['id'] })).map((p) => p.id);
  const regionIds = photoIds.length
    ? (await Region.findAll({ where: { photoId: photoIds }, attributes: ['id'] })).map((r) => r.id)
    : [];
  return ColourMeasurement.findAll({
    where: {
      trialId: { [Op.is]: null },
      [Op.or]: [{ pieceId }, ...(regionIds.length ? [{ regionId: regionIds }] : [])],
    },
    order: [['id', 'ASC']],
  });
}
