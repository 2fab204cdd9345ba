import { suggestFromFindings } from '../../shared/compute/dyestuff-markers.ts';
import { periodDays, periodLuxHours } from '../../shared/compute/light-dose.ts';
import { UV_MAX_MICROWATTS_PER_LUMEN } from '../../shared/data/light-sensitivity.ts';
import type { AnalysisOut, ConditionReportOut, DisplayPeriodOut } from '../../shared/schemas/records.ts';
import type { Analysis, ConditionReport, DisplayPeriod } from '../models/index.ts';
import { can, type Actor } from '../policies/index.ts';

export function presentAnalysis(a: Analysis, actor: Actor): AnalysisOut {
  return {
    id: a.id,
    pieceId: a.pieceId,
    method: a.method as AnalysisOut['method'],
    regionId: a.regionId,
    site: a.site,
    laboratory: a.laboratory,
    analyst: a.analyst,
    analysedOn: a.analysedOn,
    notes: a.notes,
    findings: a.findings.map((f) => ({ substance: f.substance, confidence: f.confidence })),
    suggests: suggestFromFindings(a.findings),
    report: a.reportSha256
      ? {
          sha256: a.reportSha256,
          bytes: Number(a.reportBytes),
          name: a.reportName,
          // Only the team may fetch the lab's report.
          url: can(actor, 'analysis:report') ? `/api/analyses/${a.id}/report` : null,
        }
      : null,
    createdAt: a.createdAt.toISOString(),
    abilities: { 'analysis:update': can(actor, 'analysis:update') },
  };
}

export function presentConditionReport(r: ConditionReport): ConditionReportOut {
  return {
    id: r.id,
    pieceId: r.pieceId,
    assessedOn: r.assessedOn,
    assessor: r.assessor,
    state: r.state,
    notes: r.notes,
    photoIds: r.photoIds,
    regionIds: r.regionIds,
    createdAt: r.createdAt.toISOString(),
  };
}

export function presentDisplay(d: DisplayPeriod): DisplayPeriodOut {
  const p = { from: d.fromDate, to: d.toDate, lux: d.lux, hoursPerDay: d.hoursPerDay };
  return {
    id: d.id,
    pieceId: d.pieceId,
    from: d.fromDate,
    to: d.toDate,
    lux: d.lux,
    hoursPerDay: d.hoursPerDay,
    uvMicrowattsPerLumen: d.uvMicrowattsPerLumen,
    place: d.place,
    days: periodDays(p),
    luxHours: periodLuxHours(p),
    uvAboveGuide: d.uvMicrowattsPerLumen != null && d.uvMicrowattsPerLumen > UV_MAX_MICROWATTS_PER_LUMEN,
  };
}
