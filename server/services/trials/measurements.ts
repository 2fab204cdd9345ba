import { parse } from 'csv-parse/sync';
import { measurementSchema, type MeasurementInput } from '../../../shared/schemas/trial.ts';
import { spectrumToLab, toFractions } from '../../../shared/colour/spectral.ts';
import { unprocessable } from '../../http/errors.ts';
import { ColourMeasurement, type Trial } from '../../models/index.ts';
import type { Actor } from '../../policies/index.ts';
import type { ServiceCtx } from '../context.ts';
import { audit } from '../audit.ts';

/** The stored spectrum (fractions 0–1) and the L*a*b* for the reading's own illuminant and observer. */
function labOf(m: ReturnType<typeof measurementSchema.parse>) {
  if (!m.spectrum) return { L: m.L!, a: m.a!, b: m.b!, spectrum: null };
  const { startNm, intervalNm, values, unit } = m.spectrum;
  const spectrum = { startNm, intervalNm, values: toFractions(values, unit) };
  return { ...spectrumToLab(spectrum, m.illuminant, m.observer).lab, spectrum };
}

/** A reading's columns, attached to nothing: the caller sets the trial or the piece. */
export const readingRow = (actor: Actor, m: ReturnType<typeof measurementSchema.parse>) => ({
  ...labOf(m),
  pieceId: null as number | null,
  regionId: null,
  trialId: null as number | null,
  instrument: m.instrument ?? null,
  geometry: m.geometry ?? null,
  specular: m.specular ?? null,
  illuminant: m.illuminant,
  observer: m.observer,
  label: m.label ?? null,
  source: 'instrument',
  takenOn: m.takenOn ?? null,
  createdById: actor?.id ?? null,
});

const row = (trial: Trial, actor: Actor, m: ReturnType<typeof measurementSchema.parse>) => ({
  ...readingRow(actor, m),
  trialId: trial.id,
});

export async function addMeasurement({ actor, transaction, input }: ServiceCtx<MeasurementInput & { trial: Trial }>) {
  const { trial, ...rest } = input;
  return ColourMeasurement.create(row(trial, actor, measurementSchema.parse(rest)), { transaction });
}

export async function removeMeasurement({ actor, transaction, input }: ServiceCtx<{ measurement: ColourMeasurement }>) {
  const m = input.measurement;
  await m.destroy({ transaction });
  const reading = { id: m.id, label: m.label, L: m.L, a: m.a, b: m.b, illuminant: m.illuminant, observer: m.observer };
  await audit({ actor, transaction }, 'trial', m.trialId!, 'measurement-removed', {
    measurement: { from: reading, to: null },
  });
}

export type CsvLineError = { line: number; errors: string[] };

// Header names are matched loosely: "L*", "l", "L" all mean L*.
const norm = (h: string) =>
  h
    .trim()
    .toLowerCase()
    .replace(/[*\s_-]/g, '');
const COLUMNS: Record<string, string> = {
  l: 'L',
  a: 'a',
  b: 'b',
  'illuminant/observer': 'illuminantObserver',
  illuminantobserver: 'illuminantObserver',
  illuminant: 'illuminant',
  observer: 'observer',
  geometry: 'geometry',
  specular: 'specular',
  'sci/sce': 'specular',
  instrument: 'instrument',
  label: 'label',
  date: 'takenOn',
  takenon: 'takenOn',
};
const REQUIRED = ['L', 'a', 'b'];
const COLUMN_WORDS: Record<string, string> = {
  L: 'L*',
  a: 'a*',
  b: 'b*',
  illuminant: 'illuminant',
  observer: 'observer',
  geometry: 'geometry',
  specular: 'SCI/SCE',
  takenOn: 'date',
};

/** "D65/10", "D65/10°", "D65 10" → illuminant and observer. */
function splitIlluminant(v: string) {
  const m = v.trim().match(/^([A-Za-z0-9-]+)\s*[/ ]\s*(\d+)\s*°?$/);
  return m ? { illuminant: m[1].toUpperCase(), observer: m[2] } : { illuminant: v.trim(), observer: '' };
}
// Spectrophotometer exports write the geometry in several ways; map the common ones to ours.
const GEOMETRY_ALIASES: Record<string, string> = {
  'd:8°': 'd:8°',
  'd/8': 'd:8°',
  'd:8': 'd:8°',
  'd/8°': 'd:8°',
  '45°a:0°': '45°a:0°',
  '45a:0': '45°a:0°',
  '45/0': '45°a:0°',
  '45:0': '45°a:0°',
  '45°:0°': '45°a:0°',
};

/**
 * Parse a CSV of readings. Every bad row is reported with its line number (the
 * header is line 1); the result is all rows or none.
 */
export function parseMeasurementCsv(csv: string): {
  rows: ReturnType<typeof measurementSchema.parse>[];
  errors: CsvLineError[];
} {
  let records: Array<{ record: string[]; info: { lines: number } }>;
  try {
    // info.lines is the file line a record ends on, so blank lines do not shift the reported numbers.
    records = parse(csv, {
      bom: true,
      skip_empty_lines: true,
      trim: true,
      relax_column_count: true,
      info: true,
    }) as unknown as typeof records;
  } catch (e) {
    const line = (e as { lines?: number }).lines ?? 1;
    return { rows: [], errors: [{ line, errors: [`The file is not readable CSV: ${(e as Error).message}`] }] };
  }
  if (records.length === 0) return { rows: [], errors: [{ line: 1, errors: ['The file is empty.'] }] };
  const header = records[0].record.map((h) => COLUMNS[norm(h)] ?? COLUMNS[h.trim().toLowerCase()] ?? null);
  const missing = REQUIRED.filter((c) => !header.includes(c));
  if (missing.length)
    return { rows: [], errors: [{ line: 1, errors: [`The header needs the columns ${missing.join(', ')}.`] }] };
  if (records.length === 1)
    return { rows: [], errors: [{ line: 2, errors: ['The file has a header but no readings.'] }] };

  const rows: ReturnType<typeof measurementSchema.parse>[] = [];
  const errors: CsvLineError[] = [];
  records.slice(1).forEach(({ record: cells, info }) => {
    const line = info.lines;
    const raw: Record<string, string> = {};
    header.forEach((key, j) => {
      if (key && cells[j] !== undefined && cells[j] !== '') raw[key] = cells[j];
    });
    // A value that is not a number is passed on as text so the schema names it.
    const num = (k: string) => {
      if (raw[k] === undefined) return undefined;
      const n = Number(raw[k].replace(',', '.'));
      return Number.isFinite(n) ? n : raw[k];
    };
    const io: { illuminant?: string; observer?: string } = raw.illuminantObserver
      ? splitIlluminant(raw.illuminantObserver)
      : {};
    const geometry = raw.geometry?.replace(/\s/g, '');
    const candidate = {
      L: num('L'),
      a: num('a'),
      b: num('b'),
      illuminant: raw.illuminant ?? io.illuminant ?? undefined,
      observer: (raw.observer ?? io.observer)?.replace('°', '') || undefined,
      geometry: geometry
        ? (GEOMETRY_ALIASES[geometry.toLowerCase()] ?? GEOMETRY_ALIASES[geometry] ?? raw.geometry)
        : undefined,
      specular: raw.specular?.toUpperCase(),
      instrument: raw.instrument,
      label: raw.label,
      takenOn: raw.takenOn,
    };
    const parsed = measurementSchema.safeParse(candidate);
    const lineErrors = parsed.success
      ? []
      : parsed.error.issues.map(
          (issue) => `${COLUMN_WORDS[String(issue.path[0])] ?? String(issue.path[0])}: ${issue.message}`,
        );
    if (lineErrors.length) errors.push({ line, errors: lineErrors });
    else if (parsed.success) rows.push(parsed.data);
  });
  return { rows, errors };
}

/** Import every reading of the file, or none: a file with any bad line is refused (422) with the lines. */
export async function importMeasurements({ actor, transaction, input }: ServiceCtx<{ trial: Trial; csv: string }>) {
  const { rows, errors } = parseMeasurementCsv(input.csv);
  if (errors.length)
    throw unprocessable(
      `Nothing was imported: ${errors.length} line${errors.length === 1 ? '' : 's'} need${errors.length === 1 ? 's' : ''} fixing.`,
      { lines: errors },
    );
  return ColourMeasurement.bulkCreate(
    rows.map((m) => row(input.trial, actor, m)),
    { transaction },
  );
}
