import { useState } from 'react';
import { BLUE_WOOL_GRADES, FASTNESS_TESTS, GREY_GRADES } from '../../../../shared/compute/fastness';
import type { Fastness } from '../../../../shared/schemas/fastness';
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
};

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
});
const toFastness = (d: Draft) => ({
  light: d.light ? { blueWool: d.light, informal: d.lightInformal } : null,
  washing:
    d.washChange || d.washStaining
      ? { change: d.washChange || null, staining: d.washStaining || null, informal: d.washInformal }
      : null,
  rubbingDry: d.dry ? { staining: d.dry, informal: d.dryInformal } : null,
  rubbingWet: d.wet ? { staining: d.wet, informal: d.wetInformal } : null,
});

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
    .filter(([k]) => !shown.has(k))
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
          change {f.washing.change ?? '—'}, staining {f.washing.staining ?? '—'}
          {informal(f.washing)}
        </>
      ) : null,
    ],
    [
      `Rubbing dry, ${FASTNESS_TESTS.rubbingDry.standard}`,
      f?.rubbingDry ? (
        <>
          {f.rubbingDry.staining}
          {informal(f.rubbingDry)}
        </>
      ) : null,
    ],
    [
      `Rubbing wet, ${FASTNESS_TESTS.rubbingWet.standard}`,
      f?.rubbingWet ? (
        <>
          {f.rubbingWet.staining}
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
  const { formRef, errors, check, fromServer, clear } = useFormErrors();
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
