import { useState } from 'react';
import { BLUE_WOOL_GRADES, FASTNESS_TESTS, GREY_GRADES } from '../../../../shared/compute/fastness';
import type { Fastness, ReadingPair } from '../../../../shared/schemas/fastness';
import { greyScaleGrades } from '../../../../shared/compute/grey-scale';
import { Field } from '../../../components/form/Field';
import { trialUpdateSchema, type TrialUpdateInput } from '../../../../shared/schemas/trial';
import { Button } from '../../../components/Button';
import { FormAlert } from '../../../components/form/FormAlert';
import { Select } from '../../../components/form/Select';
import { formMessage, useFormErrors, type FieldErrors } from '../../../lib/form';
import { useUpdateTrial, type TrialView } from '../api';

type Draft = {
  light: string;
  lightInformal: boolean;
  washChange: string;
  washStaining: string;
  washInformal: boolean;
  dry: string;
  dryInformal: boolean;
  wet: string;
  wetInformal: boolean;
  /** Readings typed as "L* a* b*", before and after, per grade that can be computed. */
  readings: Record<PairKey, { before: string; after: string }>;
};

// The grades that can be computed from readings, and where each pair lives in the stored grades.
const PAIRS = {
  washChange: { scale: 'change', label: 'Washing: change in colour', path: 'fastness.washing.readings.change' },
  washStaining: { scale: 'staining', label: 'Washing: staining', path: 'fastness.washing.readings.staining' },
  dry: { scale: 'staining', label: 'Rubbing dry', path: 'fastness.rubbingDry.readings.staining' },
  wet: { scale: 'staining', label: 'Rubbing wet', path: 'fastness.rubbingWet.readings.staining' },
} as const;
type PairKey = keyof typeof PAIRS;
const storedPair = (f: Fastness | null, k: PairKey): ReadingPair | null | undefined =>
  k === 'washChange'
    ? f?.washing?.readings?.change
    : k === 'washStaining'
      ? f?.washing?.readings?.staining
      : k === 'dry'
        ? f?.rubbingDry?.readings?.staining
        : f?.rubbingWet?.readings?.staining;
const labWords = (c?: { L: number; a: number; b: number }) => (c ? `${c.L} ${c.a} ${c.b}` : '');
/** "52.1 31 18.2" → { L, a, b }; what is missing or not a number is passed on for the schema to name. */
const parseLab = (text: string) => {
  const [L, a, b] = text
    .trim()
    .split(/[\s,;]+/)
    .map((x) => (x === '' ? undefined : Number(x)));
  return { L, a, b } as unknown as ReadingPair['before'];
};
const pairOf = (p: { before: string; after: string }) =>
  p.before.trim() || p.after.trim() ? { before: parseLab(p.before), after: parseLab(p.after) } : null;

/** The grade computed from a stored pair: number and step (ISO 105-A05 / A04, formulas recalled from memory). */
function Computed({ pair, scale }: { pair?: ReadingPair | null; scale: 'change' | 'staining' }) {
  if (!pair) return null;
  const g = greyScaleGrades(pair.before, pair.after)[scale];
  return (
    <span className="ml-1 font-sans text-xs text-ink-soft" data-testid="computed-grade">
      (computed {g.step}, {g.grade.toFixed(2)}, {scale === 'change' ? 'ISO 105-A05' : 'ISO 105-A04'})
    </span>
  );
}

const fromFastness = (f: Fastness | null): Draft => ({
  light: f?.light?.blueWool ?? '',
  lightInformal: f?.light?.informal ?? false,
  washChange: f?.washing?.change ?? '',
  washStaining: f?.washing?.staining ?? '',
  washInformal: f?.washing?.informal ?? false,
  dry: f?.rubbingDry?.staining ?? '',
  dryInformal: f?.rubbingDry?.informal ?? false,
  wet: f?.rubbingWet?.staining ?? '',
  wetInformal: f?.rubbingWet?.informal ?? false,
  readings: Object.fromEntries(
    (Object.keys(PAIRS) as PairKey[]).map((k) => {
      const p = storedPair(f, k);
      return [k, { before: labWords(p?.before), after: labWords(p?.after) }];
    }),
  ) as Draft['readings'],
});
const toFastness = (d: Draft) => {
  const r = (k: PairKey) => pairOf(d.readings[k]);
  const washReadings =
    r('washChange') || r('washStaining') ? { change: r('washChange'), staining: r('washStaining') } : null;
  return {
    light: d.light ? { blueWool: d.light, informal: d.lightInformal } : null,
    washing:
      d.washChange || d.washStaining || washReadings
        ? {
            change: d.washChange || null,
            staining: d.washStaining || null,
            readings: washReadings,
            informal: d.washInformal,
          }
        : null,
    rubbingDry:
      d.dry || r('dry') ? { staining: d.dry, readings: { staining: r('dry') }, informal: d.dryInformal } : null,
    rubbingWet:
      d.wet || r('wet') ? { staining: d.wet, readings: { staining: r('wet') }, informal: d.wetInformal } : null,
  };
};

// The grade fields and the dotted path of each in PATCH /api/trials/:id, where the shared schema and the server put their messages.
const GRADE_FIELDS = {
  light: 'fastness.light.blueWool',
  washChange: 'fastness.washing.change',
  washStaining: 'fastness.washing.staining',
  dry: 'fastness.rubbingDry.staining',
  wet: 'fastness.rubbingWet.staining',
} as const;
const gradeOptions = (grades: readonly string[]) => [
  { value: '', label: 'not tested' },
  ...grades.map((g) => ({ value: g, label: g })),
];
const Grade = ({
  label,
  value,
  grades,
  error,
  onChange,
}: {
  label: string;
  value: string;
  grades: readonly string[];
  error?: string[];
  onChange: (v: string) => void;
}) => (
  <Select
    label={label}
    className="font-mono"
    value={value}
    options={gradeOptions(grades)}
    error={error}
    onChange={(e) => onChange(e.target.value)}
  />
);
/** Messages about a part of the grades that has no field of its own here (a date or a note sent by another client). */
const otherMessages = (errors: FieldErrors) => {
  const shown = new Set<string>(Object.values(GRADE_FIELDS));
  const rest = Object.entries(errors)
    .filter(([k]) => !shown.has(k) && !Object.values(PAIRS).some((p) => k.startsWith(`${p.path}.`)))
    .flatMap(([, v]) => v);
  return rest.length ? [...new Set(rest)].join(' ') : null;
};
const Informal = ({ checked, onChange }: { checked: boolean; onChange: (v: boolean) => void }) => (
  <label className="mt-1 flex items-center gap-1 text-xs">
    <input type="checkbox" checked={checked} onChange={(e) => onChange(e.target.checked)} /> informal
  </label>
);

function Shown({ f }: { f: Fastness | null }) {
  const informal = (x?: { informal?: boolean } | null) =>
    x?.informal ? <span className="ml-1 text-xs text-ink-faint">(informal)</span> : null;
  const rows = [
    [
      `Light, ${FASTNESS_TESTS.light.standard} (blue wool)`,
      f?.light ? (
        <>
          {f.light.blueWool}
          {informal(f.light)}
        </>
      ) : null,
    ],
    [
      `Washing, ${FASTNESS_TESTS.washing.standard}`,
      f?.washing ? (
        <>
          change {f.washing.change ?? '—'}
          <Computed pair={f.washing.readings?.change} scale="change" />, staining {f.washing.staining ?? '—'}
          <Computed pair={f.washing.readings?.staining} scale="staining" />
          {informal(f.washing)}
        </>
      ) : null,
    ],
    [
      `Rubbing dry, ${FASTNESS_TESTS.rubbingDry.standard}`,
      f?.rubbingDry ? (
        <>
          {f.rubbingDry.staining}
          <Computed pair={f.rubbingDry.readings?.staining} scale="staining" />
          {informal(f.rubbingDry)}
        </>
      ) : null,
    ],
    [
      `Rubbing wet, ${FASTNESS_TESTS.rubbingWet.standard}`,
      f?.rubbingWet ? (
        <>
          {f.rubbingWet.staining}
          <Computed pair={f.rubbingWet.readings?.staining} scale="staining" />
          {informal(f.rubbingWet)}
        </>
      ) : null,
    ],
  ] as const;
  return (
    <dl className="grid max-w-xl grid-cols-[1fr_auto] gap-x-4 gap-y-1 text-sm">
      {rows.map(([k, v]) => (
        <div key={k} className="contents">
          <dt className="text-ink-soft">{k}</dt>
          <dd className="font-mono">{v ?? <span className="font-sans text-ink-faint">not tested</span>}</dd>
        </div>
      ))}
    </dl>
  );
}

/** Fastness grades: blue wool 1–8 for light, grey scale 1–5 with half grades for washing and rubbing. */
export function FastnessSection({ trial }: { trial: TrialView }) {
  const current = trial.fastness as Fastness | null;
  const [editing, setEditing] = useState(false);
  const [d, setD] = useState<Draft>(fromFastness(current));
  const update = useUpdateTrial(trial.id);
  const { formRef, errors, check, fromServer, clear, under } = useFormErrors();
  const setPair = (k: PairKey, side: 'before' | 'after') => (e: { target: { value: string } }) =>
    setD({ ...d, readings: { ...d.readings, [k]: { ...d.readings[k], [side]: e.target.value } } });
  const err = (k: keyof typeof GRADE_FIELDS) => errors[GRADE_FIELDS[k]];
  const save = () => {
    // Checked with the route's own schema, so the messages carry the same paths as the server's 400.
    const body = { fastness: toFastness(d) } as TrialUpdateInput;
    if (check(trialUpdateSchema, body))
      update.mutate(body, { onSuccess: () => setEditing(false), onError: fromServer });
  };
  return (
    <section aria-labelledby="fast-h" className="space-y-3">
      <div className="flex items-end justify-between">
        <h2 id="fast-h" className="text-xl font-semibold">
          Fastness
        </h2>
        {trial.abilities['trial:update'] && !editing ? (
          <Button
            variant="secondary"
            onClick={() => {
              setD(fromFastness(current));
              clear();
              update.reset();
              setEditing(true);
            }}
          >
            Record grades
          </Button>
        ) : null}
      </div>
      {editing ? (
        <form
          ref={formRef}
          noValidate
          aria-label="Fastness grades"
          className="grid gap-4 rounded-lg border border-rule bg-sheet p-4 sm:grid-cols-4"
          onSubmit={(e) => {
            e.preventDefault();
            save();
          }}
        >
          <div>
            <Grade
              label="Light (blue wool 1–8)"
              value={d.light}
              error={err('light')}
              grades={BLUE_WOOL_GRADES}
              onChange={(light) => setD({ ...d, light })}
            />
            <Informal checked={d.lightInformal} onChange={(lightInformal) => setD({ ...d, lightInformal })} />
          </div>
          <div>
            <Grade
              label="Washing: change in colour"
              value={d.washChange}
              error={err('washChange')}
              grades={GREY_GRADES}
              onChange={(washChange) => setD({ ...d, washChange })}
            />
            <Grade
              label="Washing: staining"
              value={d.washStaining}
              error={err('washStaining')}
              grades={GREY_GRADES}
              onChange={(washStaining) => setD({ ...d, washStaining })}
            />
            <Informal checked={d.washInformal} onChange={(washInformal) => setD({ ...d, washInformal })} />
          </div>
          <div>
            <Grade
              label="Rubbing dry (grey scale)"
              value={d.dry}
              error={err('dry')}
              grades={GREY_GRADES}
              onChange={(dry) => setD({ ...d, dry })}
            />
            <Informal checked={d.dryInformal} onChange={(dryInformal) => setD({ ...d, dryInformal })} />
          </div>
          <div>
            <Grade
              label="Rubbing wet (grey scale)"
              value={d.wet}
              error={err('wet')}
              grades={GREY_GRADES}
              onChange={(wet) => setD({ ...d, wet })}
            />
            <Informal checked={d.wetInformal} onChange={(wetInformal) => setD({ ...d, wetInformal })} />
          </div>
          <fieldset className="grid gap-3 sm:col-span-4 sm:grid-cols-4">
            <legend className="text-sm font-medium">
              Instrument readings (optional): L* a* b* under D65/10°, the grade is computed beside yours
            </legend>
            {(Object.keys(PAIRS) as PairKey[]).map((k) => {
              const p = PAIRS[k];
              const words =
                p.scale === 'change' ? ['Before the test', 'After the test'] : ['Cloth unstained', 'Cloth stained'];
              const what = p.label.toLowerCase().replace(':', ',');
              return (
                <div key={k} className="space-y-1">
                  <Field
                    label={`${words[0]} (${what})`}
                    className="font-mono"
                    placeholder="L* a* b*"
                    value={d.readings[k].before}
                    onChange={setPair(k, 'before')}
                    error={under(`${p.path}.before`)}
                  />
                  <Field
                    label={`${words[1]} (${what})`}
                    className="font-mono"
                    placeholder="L* a* b*"
                    value={d.readings[k].after}
                    onChange={setPair(k, 'after')}
                    error={under(`${p.path}.after`)}
                  />
                </div>
              );
            })}
          </fieldset>
          <div className="sm:col-span-4">
            <FormAlert message={formMessage(update.error) ?? otherMessages(errors)} />
          </div>
          <div className="flex gap-3 sm:col-span-4">
            <Button type="submit" disabled={update.isPending}>
              Save grades
            </Button>
            <Button type="button" variant="quiet" onClick={() => setEditing(false)}>
              Cancel
            </Button>
          </div>
        </form>
      ) : (
        <Shown f={current} />
      )}
    </section>
  );
}
