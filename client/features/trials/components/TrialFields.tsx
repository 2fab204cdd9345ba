import { formatNumber } from '../../../../shared/format';
import { conditionsText, viewingLabel } from '../../../../shared/colour/conditions';
import { IMAGE_ESTIMATE } from '../../../components/ViewingConditions';
import { DRY_MASS_BASES, TARGET_AIMS, TRIAL_STATUSES, dryMassBasisLabels } from '../../../../shared/schemas/trial';
import { recipeMass } from '../../../../shared/compute/moisture';
import { Field } from '../../../components/form/Field';
import { Select } from '../../../components/form/Select';
import { TextAreaField } from '../../pieces';
import { usePiece } from '../../pieces';
import { usePieceTrials } from '../api';
import { STATUS_WORDS } from '../format';

export type TrialFormValues = {
  status: string;
  fibre: string;
  weave: string;
  gsm: string;
  dryMassG: string;
  dryMassBasis: string;
  startedOn: string;
  notes: string;
  target: string; // "palette:12", "region:4" or ""
  aim: string; // "as-made", "as-seen" or "": which state of the piece a region or reading target stands for
};
export type FieldErrors = Record<string, string[]> | undefined;

/** "palette:12" → the three target ids a trial or a series stores (one set at most). */
export const targetIds = (target: string) => {
  const [kind, id] = target.split(':');
  return {
    targetPaletteColourId: kind === 'palette' ? Number(id) : null,
    targetRegionId: kind === 'region' ? Number(id) : null,
    targetMeasurementId: kind === 'measurement' ? Number(id) : null,
  };
};
export const targetValue = (t: {
  paletteColourId: number | null;
  regionId: number | null;
  measurementId: number | null;
}) =>
  t.paletteColourId
    ? `palette:${t.paletteColourId}`
    : t.regionId
      ? `region:${t.regionId}`
      : t.measurementId
        ? `measurement:${t.measurementId}`
        : '';

export const toTrialInput = (v: TrialFormValues) => {
  // Text that is not a number goes to the schema as typed, so its message says "as a number".
  const num = (s: string) => (s.trim() === '' ? null : Number.isFinite(Number(s)) ? Number(s) : s);
  return {
    status: v.status as (typeof TRIAL_STATUSES)[number],
    fibre: v.fibre || null,
    weave: v.weave || null,
    gsm: num(v.gsm) as number | null,
    dryMassG: (num(v.dryMassG) ?? undefined) as number,
    dryMassBasis: (v.dryMassBasis || 'air-dry') as (typeof DRY_MASS_BASES)[number],
    startedOn: v.startedOn || null,
    notes: v.notes || null,
    ...targetIds(v.target),
    // A palette colour is not one side of a fading pair: the aim only goes with a region or a reading.
    targetAim: (v.aim && /^(region|measurement):/.test(v.target) ? v.aim : null) as (typeof TARGET_AIMS)[number] | null,
  };
};

/** The target choices of a piece: its colour regions and the leading palette colours of each photo. */
export function TargetSelect({
  pieceId,
  value,
  onChange,
  error,
}: {
  pieceId: number;
  value: string;
  onChange: (v: string) => void;
  error?: string[];
}) {
  const piece = usePiece(pieceId);
  const readings = usePieceTrials(pieceId).data?.targets.measurements ?? [];
  const photos = piece.data?.photos ?? [];
  const options = [
    { value: '', label: 'No target yet' },
    ...readings.map((m) => ({
      value: `measurement:${m.id}`,
      label: `Instrument measurement: ${m.label ?? `#${m.id}`}, ${conditionsText(m)} (L* ${formatNumber(m.L)} a* ${formatNumber(m.a)} b* ${formatNumber(m.b)})`,
    })),
    ...photos.flatMap((p) =>
      p.regions
        .filter((r) => r.purpose === 'colour-area' || r.purpose === 'motif')
        .map((r) => ({ value: `region:${r.id}`, label: `Region: ${r.label ?? `#${r.id}`} (photo ${p.id})` })),
    ),
    ...photos.flatMap((p) =>
      p.palette
        .filter((c) => !c.background)
        .map((c) => ({
          value: `palette:${c.id}`,
          label: `Palette colour: ${c.name}${c.tradeName ? ` (${c.tradeName})` : ''}, ${Math.round(c.share * 100)} % of photo ${p.id}, ${viewingLabel(IMAGE_ESTIMATE)}`,
        })),
    ),
  ];
  if (value.startsWith('measurement:') && !options.some((o) => o.value === value))
    options.push({ value, label: `Instrument measurement #${value.split(':')[1]}` });
  return (
    <Select
      label="Target colour of the original"
      options={options}
      value={value}
      onChange={(e) => onChange(e.target.value)}
      error={error}
    />
  );
}

/** The other figure of the dry mass, from the fibre's commercial moisture regain (ASTM D1909, recalled from memory). */
function MassFigure({ values }: { values: TrialFormValues }) {
  const g = Number(values.dryMassG);
  if (!values.dryMassG.trim() || !(g > 0)) return null;
  const m = recipeMass(g, values.dryMassBasis === 'oven-dry' ? 'oven-dry' : 'air-dry', values.fibre);
  if (m.problem) return <p className="mt-1 text-xs text-warn">{m.problem}</p>;
  if (m.otherG == null)
    return (
      <p className="mt-1 text-xs text-ink-faint">
        Name a fibre (cotton, linen, wool, silk…) to see the {m.basis === 'oven-dry' ? 'air-dry' : 'oven-dry'} figure.
      </p>
    );
  return (
    <p className="mt-1 text-xs text-ink-soft" data-testid="mass-figure">
      = <span className="font-mono">{formatNumber(m.otherG, 1)} g</span>{' '}
      {m.basis === 'oven-dry' ? 'air-dry, the mass the recipe is worked on' : 'oven-dry'} (
      {formatNumber(m.regainPct!, 2)} % regain for {m.fibre}; {m.source})
    </p>
  );
}

export function TrialFields({
  values,
  onChange,
  errors,
  pieceId,
}: {
  values: TrialFormValues;
  onChange: (v: TrialFormValues) => void;
  errors: FieldErrors;
  pieceId: number | null;
}) {
  const set = (k: keyof TrialFormValues) => (e: { target: { value: string } }) =>
    onChange({ ...values, [k]: e.target.value });
  return (
    <div className="grid gap-4 sm:grid-cols-2">
      <Select
        label="Status"
        options={TRIAL_STATUSES.map((s) => ({ value: s, label: STATUS_WORDS[s] }))}
        value={values.status}
        onChange={set('status')}
        error={errors?.status}
      />
      <Field
        label="Dry fibre mass"
        unit="g"
        inputMode="decimal"
        required
        value={values.dryMassG}
        onChange={set('dryMassG')}
        error={errors?.dryMassG}
        hint="Every % owf is of the air-dry (conditioned) mass."
      />
      <div>
        <Select
          label="Weighed"
          options={DRY_MASS_BASES.map((b) => ({ value: b, label: dryMassBasisLabels[b] }))}
          value={values.dryMassBasis}
          onChange={set('dryMassBasis')}
          error={errors?.dryMassBasis}
        />
        <MassFigure values={values} />
      </div>
      <Field label="Fibre" value={values.fibre} onChange={set('fibre')} error={errors?.fibre} placeholder="cotton" />
      <Field
        label="Weave"
        value={values.weave}
        onChange={set('weave')}
        error={errors?.weave}
        placeholder="plain (tabby)"
      />
      <Field
        label="Fabric weight"
        unit="g/m²"
        inputMode="decimal"
        value={values.gsm}
        onChange={set('gsm')}
        error={errors?.gsm}
      />
      <Field
        label="Started on"
        type="date"
        value={values.startedOn}
        onChange={set('startedOn')}
        error={errors?.startedOn}
      />
      {pieceId != null ? (
        <div className="sm:col-span-2">
          <TargetSelect
            pieceId={pieceId}
            value={values.target}
            onChange={(target) => onChange({ ...values, target })}
            error={
              errors?.target ?? errors?.targetRegionId ?? errors?.targetPaletteColourId ?? errors?.targetMeasurementId
            }
          />
        </div>
      ) : null}
      {pieceId != null && /^(region|measurement):/.test(values.target) ? (
        <Select
          label="Aim at the piece"
          value={values.aim}
          onChange={set('aim')}
          options={[
            { value: '', label: 'Not said' },
            { value: 'as-made', label: 'As made (the protected area)' },
            { value: 'as-seen', label: 'As seen (the faded area)' },
          ]}
          error={errors?.targetAim}
        />
      ) : null}
      <div className="sm:col-span-2">
        <TextAreaField label="Notes" value={values.notes} onChange={set('notes')} error={errors?.notes} />
      </div>
    </div>
  );
}
