import { useState } from 'react';
import {
  GEOMETRIES,
  ILLUMINANTS,
  OBSERVERS,
  measurementSchema,
  type MeasurementInput,
} from '../../../../shared/schemas/trial';
import { formMessage, useFormErrors } from '../../../lib/form';
import { Button } from '../../../components/Button';
import { Field } from '../../../components/form/Field';
import { FormAlert } from '../../../components/form/FormAlert';
import { Select } from '../../../components/form/Select';
import { ApiError } from '../../../lib/http';
import {
  useAddMeasurement,
  useDeleteMeasurement,
  useImportMeasurements,
  useUploadSwatch,
  type TrialView,
} from '../api';
import { conditionsText } from '../../../../shared/colour/conditions';
import { fmt } from '../format';
import { ColourComparison } from './ColourComparison';
import { MetamerismSection } from './MetamerismSection';
import { SpectrumChart } from './SpectrumChart';
import { TextArea } from '../../../components/form/TextArea';
import { parseSpectrumText } from '../../../../shared/colour/spectrum-text';

type AddReading = {
  mutate: (body: MeasurementInput, opts: { onSuccess: () => void; onError: (e: unknown) => void }) => void;
  error: Error | null;
  isPending: boolean;
};

/** A reading typed as L*a*b* or pasted/loaded as a spectrum: of a trial's swatch, or (with a place label) of the original. */
export function MeasurementForm({
  add,
  name = 'Add a reading',
  withLabel = false,
}: {
  add: AddReading;
  name?: string;
  withLabel?: boolean;
}) {
  const [d, setD] = useState({
    label: '',
    L: '',
    a: '',
    b: '',
    illuminant: 'D65',
    observer: '10',
    geometry: 'd:8°',
    specular: 'SCI',
    instrument: '',
    spectrum: '',
    startNm: '',
    intervalNm: '',
    unit: '',
  });
  const { formRef, errors, check, fromServer, show, under } = useFormErrors();
  const set = (k: keyof typeof d) => (e: { target: { value: string } }) => setD({ ...d, [k]: e.target.value });
  const num = (x: string) => (x.trim() === '' ? (undefined as unknown as number) : Number(x));
  const opts = (xs: readonly string[], label = (x: string) => x) => xs.map((x) => ({ value: x, label: label(x) }));
  return (
    <form
      ref={formRef}
      noValidate
      aria-label={name}
      className="grid gap-3 sm:grid-cols-4"
      onSubmit={(e) => {
        e.preventDefault();
        // A pasted or loaded spectrum replaces L*a*b*: the server computes them for the conditions below.
        let spectrum: MeasurementInput['spectrum'] = null;
        if (d.spectrum.trim()) {
          const read = parseSpectrumText(d.spectrum, {
            startNm: d.startNm.trim() ? Number(d.startNm) : undefined,
            intervalNm: d.intervalNm.trim() ? Number(d.intervalNm) : undefined,
          });
          if (!read.ok) return show({ spectrum: [read.message] });
          spectrum = { ...read.spectrum, unit: (d.unit || undefined) as 'fraction' | 'percent' | undefined };
        }
        const body: MeasurementInput = {
          spectrum,
          L: spectrum ? undefined : num(d.L),
          a: spectrum ? undefined : num(d.a),
          b: spectrum ? undefined : num(d.b),
          illuminant: d.illuminant as MeasurementInput['illuminant'],
          observer: d.observer as MeasurementInput['observer'],
          geometry: d.geometry as MeasurementInput['geometry'],
          specular: d.specular as 'SCI' | 'SCE',
          instrument: d.instrument || null,
          ...(withLabel ? { label: d.label.trim() || null } : {}),
        };
        if (check(measurementSchema, body))
          add.mutate(body, {
            onSuccess: () => setD({ ...d, label: '', L: '', a: '', b: '', spectrum: '', startNm: '', intervalNm: '' }),
            onError: fromServer,
          });
      }}
    >
      {withLabel ? (
        <Field
          className="sm:col-span-4"
          label="Place on the piece"
          value={d.label}
          onChange={set('label')}
          error={errors.label}
          hint="Where it was measured, e.g. seam allowance, red ground; readings with the same place are one target"
        />
      ) : null}
      <Field label="L*" className="font-mono" inputMode="decimal" value={d.L} onChange={set('L')} error={errors.L} />
      <Field label="a*" className="font-mono" inputMode="decimal" value={d.a} onChange={set('a')} error={errors.a} />
      <Field label="b*" className="font-mono" inputMode="decimal" value={d.b} onChange={set('b')} error={errors.b} />
      <Field label="Instrument" value={d.instrument} onChange={set('instrument')} error={errors.instrument} />
      <Select
        label="Illuminant"
        value={d.illuminant}
        onChange={set('illuminant')}
        options={opts(ILLUMINANTS)}
        error={errors.illuminant}
      />
      <Select
        label="Observer"
        value={d.observer}
        onChange={set('observer')}
        options={opts(OBSERVERS, (x) => `${x}°`)}
        error={errors.observer}
      />
      <Select
        label="Geometry"
        value={d.geometry}
        onChange={set('geometry')}
        options={opts(GEOMETRIES)}
        error={errors.geometry}
      />
      <Select
        label="Specular"
        value={d.specular}
        onChange={set('specular')}
        options={opts(['SCI', 'SCE'])}
        error={errors.specular}
      />
      <TextArea
        className="sm:col-span-4"
        label="Reflectance spectrum (optional, instead of L*a*b*)"
        rows={4}
        spellCheck={false}
        value={d.spectrum}
        onChange={set('spectrum')}
        error={under('spectrum')}
        hint="Paste a wavelength and a value on each line (400, 12.3), a row of wavelengths over a row of values, or the values alone with the first wavelength and step below. Fractions 0–1 or %; 360–400 nm to 700–780 nm in steps of 1, 5, 10 or 20 nm."
      />
      <label className="block text-sm font-medium sm:col-span-2">
        Or load the spectrum from a CSV file
        <input
          className="mt-1 block text-sm"
          type="file"
          accept=".csv,.txt,text/csv,text/plain"
          onChange={async (e) => {
            const f = e.target.files?.[0];
            if (f) setD({ ...d, spectrum: await f.text() });
            e.target.value = '';
          }}
        />
      </label>
      <Select
        className="sm:col-span-2"
        label="Values in"
        value={d.unit}
        onChange={set('unit')}
        options={[
          { value: '', label: 'fractions or % (read from the values)' },
          { value: 'fraction', label: 'fractions 0–1' },
          { value: 'percent', label: 'percent' },
        ]}
        error={errors['spectrum.unit']}
      />
      <Field
        label="First wavelength"
        unit="nm"
        inputMode="numeric"
        value={d.startNm}
        onChange={set('startNm')}
        hint="for values alone"
      />
      <Field
        label="Step"
        unit="nm"
        inputMode="numeric"
        value={d.intervalNm}
        onChange={set('intervalNm')}
        hint="for values alone"
      />
      <div className="sm:col-span-4">
        <FormAlert message={formMessage(add.error)} />
      </div>
      <div className="sm:col-span-4">
        <Button type="submit" variant="secondary" disabled={add.isPending}>
          {withLabel ? 'Add reading of the original' : 'Add reading'}
        </Button>
      </div>
    </form>
  );
}

function CsvImport({ trialId }: { trialId: number }) {
  const imp = useImportMeasurements(trialId);
  const lines =
    imp.error instanceof ApiError
      ? (imp.error.details?.lines as Array<{ line: number; errors: string[] }> | undefined)
      : undefined;
  return (
    <div className="space-y-2">
      <label className="block text-sm font-medium">
        Import readings from CSV{' '}
        <span className="font-normal text-ink-faint">
          (columns L, a, b, illuminant/observer such as D65/10, geometry d:8° or 45°a:0°)
        </span>
        <input
          className="mt-1 block text-sm"
          type="file"
          accept=".csv,text/csv"
          onChange={async (e) => {
            const f = e.target.files?.[0];
            if (f) imp.mutate(await f.text());
            e.target.value = '';
          }}
        />
      </label>
      {imp.isPending ? <p className="text-sm">Importing…</p> : null}
      {imp.data ? (
        <FormAlert tone="ok" message={`${imp.data.imported} reading${imp.data.imported === 1 ? '' : 's'} imported.`} />
      ) : null}
      {imp.error ? (
        <div role="alert" className="rounded-md bg-danger-tint p-3 text-sm text-danger">
          <p className="font-medium">{imp.error.message}</p>
          {lines ? (
            <ul className="mt-1 list-disc pl-5">
              {lines.map((l) => (
                <li key={l.line}>
                  Line {l.line}: {l.errors.join('; ')}
                </li>
              ))}
            </ul>
          ) : null}
        </div>
      ) : null}
    </div>
  );
}

/** The result: swatch photos, instrument readings, and the colour difference to the target. */
export function ResultSection({ trial }: { trial: TrialView }) {
  const canEdit = trial.abilities['trial:update'];
  const remove = useDeleteMeasurement(trial.id);
  const add = useAddMeasurement(trial.id);
  const upload = useUploadSwatch(trial.id);
  return (
    <section aria-labelledby="result-h" className="space-y-4">
      <h2 id="result-h" className="text-xl font-semibold">
        Result and colour difference
      </h2>
      {trial.colour ? <ColourComparison colour={trial.colour} /> : null}
      {trial.colour?.metamerism ? <MetamerismSection m={trial.colour.metamerism} /> : null}
      <h3 className="font-semibold">Instrument readings</h3>
      <p className="text-xs text-ink-soft">
        Readings are averaged only with others under the same illuminant and observer; the comparison uses those under
        the original's illuminant.
      </p>
      {trial.measurements.length ? (
        <div className="max-w-3xl overflow-x-auto">
          <table className="w-full rounded-lg border border-rule bg-sheet text-sm">
            <thead className="bg-paper text-left text-ink-soft">
              <tr>
                <th className="px-3 py-1.5 text-right">L*</th>
                <th className="px-3 py-1.5 text-right">a*</th>
                <th className="px-3 py-1.5 text-right">b*</th>
                <th className="px-3 py-1.5">Illuminant/observer</th>
                <th className="px-3 py-1.5">Geometry</th>
                <th className="px-3 py-1.5">Spectrum</th>
                <th />
              </tr>
            </thead>
            <tbody>
              {trial.measurements.map((m) => (
                <tr key={m.id} className="border-t border-rule">
                  <td className="px-3 py-1.5 text-right font-mono">{fmt(m.L, 2)}</td>
                  <td className="px-3 py-1.5 text-right font-mono">{fmt(m.a, 2)}</td>
                  <td className="px-3 py-1.5 text-right font-mono">{fmt(m.b, 2)}</td>
                  <td className="px-3 py-1.5">{conditionsText(m)}</td>
                  <td className="px-3 py-1.5">
                    {m.geometry ?? '—'} {m.specular ?? ''}
                  </td>
                  <td className="px-3 py-1.5">
                    {m.spectrum
                      ? `${m.spectrum.startNm}–${m.spectrum.startNm + m.spectrum.intervalNm * (m.spectrum.values.length - 1)} nm`
                      : '—'}
                  </td>
                  <td className="px-3 py-1.5">
                    {canEdit ? (
                      <button className="text-xs text-danger underline" onClick={() => remove.mutate(m.id)}>
                        Remove
                      </button>
                    ) : null}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      ) : (
        <p className="text-ink-soft">No readings yet.</p>
      )}
      {trial.measurements.some((m) => m.spectrum) ? (
        <SpectrumChart
          title="Reflectance spectra of the swatch readings"
          series={trial.measurements.flatMap((m, i) =>
            m.spectrum ? [{ label: `Reading ${i + 1} (${m.label ?? conditionsText(m)})`, spectrum: m.spectrum }] : [],
          )}
        />
      ) : null}
      {canEdit ? (
        <div className="grid gap-6 lg:grid-cols-2">
          <MeasurementForm add={add} />
          <div className="space-y-4">
            <CsvImport trialId={trial.id} />
            <label className="block text-sm font-medium">
              Add a swatch photo{' '}
              <span className="font-normal text-ink-faint">
                (its palette is an image estimate; readings outrank it)
              </span>
              <input
                className="mt-1 block text-sm"
                type="file"
                accept="image/*"
                onChange={(e) => {
                  const f = e.target.files?.[0];
                  if (f) upload.mutate(f);
                  e.target.value = '';
                }}
              />
            </label>
            {upload.isPending ? <p className="text-sm">Uploading and reading the palette…</p> : null}
            {upload.error ? <FormAlert message={upload.error.message} /> : null}
          </div>
        </div>
      ) : null}
      {trial.photos.length ? (
        <ul className="flex flex-wrap gap-3" aria-label="Swatch photos">
          {trial.photos.map((p) => (
            <li key={p.id} className="rounded bg-neutral-ground p-2">
              <img
                src={`/media/photos/${p.id}/thumb`}
                alt={p.caption ?? p.originalName ?? `Swatch photo ${p.id}`}
                className="h-32 w-auto"
              />
            </li>
          ))}
        </ul>
      ) : null}
    </section>
  );
}
