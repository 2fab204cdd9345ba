import { Op } from 'sequelize';
import { differenceReport } from '../../../shared/colour/index.ts';
import { ColourMeasurement, PaletteColour, Photo, type Trial } from '../../models/index.ts';
import { verdictBands } from '../settings.ts';

export type ColourSource = 'instrument' | 'image-estimate';
export type ResolvedColour = {
  L: number; a: number; b: number;
  source: ColourSource;
  /** What the colour is, in words, e.g. "region 'ground red', measured". */
  label: string;
  /** When an instrument reading replaced an image estimate of the same place, the estimate that was set aside. */
  setAside: { L: number; a: number; b: number; source: 'image-estimate' } | null;
};

const lab = (x: { L: number; a: number; b: number }) => ({ L: x.L, a: x.a, b: x.b });

const latestReading = (where: Record<string, unknown>) => ColourMeasurement.findOne({ where: { ...where, trialId: { [Op.is]: null } }, order: [['takenOn', 'DESC'], ['id', 'DESC']] });

/** The estimate of a region (or of a whole photo): the leading non-background colour, corrected variant first. */
async function estimate(where: Record<string, unknown>) {
  const rows = await PaletteColour.findAll({ where: { ...where, background: false }, order: [['rank', 'ASC']] });
  return rows.find((r) => r.variant === 'corrected') ?? rows[0] ?? null;
}

/** The original's colour a trial aims at; an instrument reading of the same place outranks an image estimate. */
export async function resolveTarget(trial: Trial): Promise<ResolvedColour | null> {
  if (trial.targetMeasurementId != null) {
    const m = await ColourMeasurement.findByPk(trial.targetMeasurementId);
    return m ? { ...lab(m), source: 'instrument', label: m.label ?? 'instrument measurement of the original', setAside: null } : null;
  }
  if (trial.targetRegionId != null) {
    const [m, pc] = await Promise.all([latestReading({ regionId: trial.targetRegionId }), estimate({ regionId: trial.targetRegionId })]);
    if (m) return { ...lab(m), source: 'instrument', label: m.label ?? 'instrument measurement of the target region', setAside: pc ? { ...lab(pc), source: 'image-estimate' } : null };
    return pc ? { ...lab(pc), source: 'image-estimate', label: `palette of the target region (${pc.name})`, setAside: null } : null;
  }
  if (trial.targetPaletteColourId != null) {
    const pc = await PaletteColour.findByPk(trial.targetPaletteColourId);
    if (!pc) return null;
    const m = pc.regionId != null ? await latestReading({ regionId: pc.regionId }) : null;
    if (m) return { ...lab(m), source: 'instrument', label: m.label ?? 'instrument measurement of the region this palette colour comes from', setAside: { ...lab(pc), source: 'image-estimate' } };
    return { ...lab(pc), source: 'image-estimate', label: `palette colour ${pc.name}${pc.tradeName ? ` (${pc.tradeName})` : ''}`, setAside: null };
  }
  return null;
}

/** The trial's own colour: the mean of its instrument readings, else the estimate from its swatch photo. */
export async function resolveResult(trial: Trial): Promise<ResolvedColour | null> {
  const readings = await ColourMeasurement.findAll({ where: { trialId: trial.id } });
  const photos = await Photo.findAll({ where: { trialId: trial.id }, attributes: ['id'], order: [['id', 'DESC']] });
  const pc = photos.length ? await estimate({ photoId: photos[0].id, regionId: { [Op.is]: null } }) : null;
  if (readings.length) {
    const mean = (k: 'L' | 'a' | 'b') => readings.reduce((s, r) => s + r[k], 0) / readings.length;
    return {
      L: mean('L'), a: mean('a'), b: mean('b'), source: 'instrument',
      label: readings.length === 1 ? 'instrument reading of the swatch' : `mean of ${readings.length} instrument readings of the swatch`,
      setAside: pc ? { ...lab(pc), source: 'image-estimate' } : null,
    };
  }
  return pc ? { ...lab(pc), source: 'image-estimate', label: `swatch photo palette (${pc.name})`, setAside: null } : null;
}

/** Target, result and their difference with the verdict from the bands in force. */
export async function trialColour(trial: Trial) {
  const [target, result, { bands, source }] = await Promise.all([resolveTarget(trial), resolveResult(trial), verdictBands()]);
  if (!target || !result) return { target, result, difference: null, bandsSource: source };
  return { target, result, difference: differenceReport(lab(target), lab(result), bands), bandsSource: source };
}
