import type { Transaction } from 'sequelize';
import { DEFAULT_TOLERANCES, evaluateChart, patchGeometry, type ToleranceLevels } from '../../shared/compute/chart.ts';
import { CHART_1976, CHART_1976_SOURCE } from '../../shared/data/colour-chart-1976.ts';
import { cornerIssues, type ChartInput, type PhotoChart } from '../../shared/schemas/chart.ts';
import { badRequest, unprocessable } from '../http/errors.ts';
import { chartRect, sampleChart } from '../media/chart.ts';
import { workingImage } from '../media/decode.ts';
import { masterFileOnDisk } from '../media/files.ts';
import { repalette } from '../media/pipeline.ts';
import { AppSetting, type Photo } from '../models/index.ts';
import { audit } from './audit.ts';
import type { ServiceCtx, TxCtx } from './context.ts';

/** The admin's imaging tolerance levels for a chart's grade, or the shipped ones (recalled from memory). */
export const CHART_TOLERANCES_KEY = 'colour.chartTolerances';

export async function chartTolerances(transaction?: Transaction): Promise<ToleranceLevels> {
  const row = await AppSetting.findByPk(CHART_TOLERANCES_KEY, { transaction });
  return row ? { levels: row.value as ToleranceLevels['levels'], source: row.source } : DEFAULT_TOLERANCES;
}

export async function setChartTolerances({ actor, transaction, input }: ServiceCtx<ToleranceLevels>) {
  const before = await chartTolerances(transaction);
  await AppSetting.upsert({ key: CHART_TOLERANCES_KEY, value: input.levels, source: input.source }, { transaction });
  await audit({ actor, transaction }, 'setting', 0, 'chart-tolerances-set', {
    [CHART_TOLERANCES_KEY]: { from: before, to: input },
  });
  return chartTolerances(transaction);
}

const auditPhoto = (ctx: TxCtx, photo: Photo, action: string, from: unknown, to: unknown) =>
  audit(ctx, photo.pieceId != null ? 'piece' : 'photo', photo.pieceId ?? photo.id, action, {
    chart: { from, to },
    photoId: { from: null, to: photo.id },
  });

/** The chart's essentials for the history (not every patch). */
const summary = (c: PhotoChart | null) =>
  c && { corners: c.corners, reference: c.reference, meanBefore: c.before.mean, meanAfter: c.after.mean };

/** Smallest patch pitch (working-image pixels) whose middle can still be sampled: a 2 px box. */
const MIN_HALF_PX = 1;

/**
 * Marks (or re-marks) the colour chart of a photo: samples its 24 patches from the colour-managed working image,
 * fits the correction to the published 1976 values or the institution's measured ones, stores the result on the
 * photo and recomputes every palette (the chart left out, a 'calibrated' set added). The master is never altered.
 */
export async function setChart({ actor, transaction, input }: ServiceCtx<{ photo: Photo; chart: ChartInput }>) {
  const { photo, chart } = input;
  const fields = cornerIssues(chart.corners, photo);
  if (Object.keys(fields).length) throw badRequest('A corner lies outside the photo.', { fields });
  const master = photo.derivatives.master?.path;
  if (!master) throw new Error(`Photo ${photo.id} has no master file`);
  const work = await workingImage(await masterFileOnDisk(master, photo.sha256));
  const { samples } = sampleChart(work, chart.corners, work.scale);
  const geometry = patchGeometry(chart.corners);
  if (Math.min(...geometry.map((g) => g.half)) * work.scale < MIN_HALF_PX)
    throw unprocessable('The chart is too small in this photo to read its patches: photograph it larger.', {
      fields: { corners: ['The patches are too small to sample'] },
    });
  const measured = chart.reference !== 'published-1976' ? chart.reference.measured : null;
  const reference = CHART_1976.map((p, i) => ({ name: p.name, lab: measured ? measured[i] : p.lab }));
  const tolerances = await chartTolerances(transaction);
  let result;
  try {
    result = evaluateChart(samples, geometry, reference, tolerances.levels);
  } catch {
    throw unprocessable('The marked patches do not give a correction: check that the corners are on the chart.', {
      fields: { corners: ['These points do not find the chart'] },
    });
  }
  const before = photo.chart ?? null;
  const stored: PhotoChart = {
    corners: chart.corners,
    reference: measured ? 'measured' : 'published-1976',
    referenceSource: measured ? "The institution's own measured values (L*a*b* D65)" : CHART_1976_SOURCE,
    method: result.method,
    matrix: result.matrix,
    excluded: chartRect(chart.corners, photo),
    patches: result.patches,
    before: result.before,
    after: result.after,
    grade: result.grade,
    tolerances,
  };
  await photo.update({ chart: stored }, { transaction });
  await auditPhoto({ actor, transaction }, photo, 'chart-set', summary(before), summary(stored));
  return { chart: stored, palette: await repalette({ transaction, photo, scope: 'all', decoded: work }) };
}

export async function clearChart({ actor, transaction, input }: ServiceCtx<{ photo: Photo }>) {
  const { photo } = input;
  const before = photo.chart ?? null;
  await photo.update({ chart: null }, { transaction });
  await auditPhoto({ actor, transaction }, photo, 'chart-cleared', summary(before), null);
  return { chart: null, palette: await repalette({ transaction, photo, scope: 'all' }) };
}
