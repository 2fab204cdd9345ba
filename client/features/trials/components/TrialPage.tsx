import { useState, type FormEvent } from 'react';
import { Link, useNavigate, useParams } from 'react-router-dom';
import { Button } from '../../../components/Button';
import { FormAlert } from '../../../components/form/FormAlert';
import { Page } from '../../../components/Page';
import { TARGET_AIM_WORDS, trialUpdateSchema } from '../../../../shared/schemas/trial';
import { formMessage, useFormErrors } from '../../../lib/form';
import { ApiError } from '../../../lib/http';
import { paths } from '../../../paths';
import { NotFound } from '../../../routes/NotFound';
import { trialCardUrl, useDeleteTrial, useTrial, useUpdateTrial, type TrialView } from '../api';
import { fmt, STATUS_WORDS } from '../format';
import { FastnessSection } from './FastnessSection';
import { RecipeEditor } from './RecipeEditor';
import { RecipeSection } from './RecipeSection';
import { ResultSection } from './ResultSection';
import { SubstitutionsSection } from './SubstitutionsSection';
import { TrialFields, toTrialInput, type TrialFormValues } from './TrialFields';

const toValues = (t: TrialView): TrialFormValues => ({
  status: t.status,
  fibre: t.fibre ?? '',
  weave: t.weave ?? '',
  gsm: t.gsm == null ? '' : String(t.gsm),
  dryMassG: String(t.dryMassG),
  dryMassBasis: t.dryMassBasis,
  startedOn: t.startedOn ?? '',
  notes: t.notes ?? '',
  target: t.target.paletteColourId
    ? `palette:${t.target.paletteColourId}`
    : t.target.regionId
      ? `region:${t.target.regionId}`
      : t.target.measurementId
        ? `measurement:${t.target.measurementId}`
        : '',
  aim: t.target.aim ?? '',
});

function DetailsEditor({ trial, onDone }: { trial: TrialView; onDone: () => void }) {
  const [values, setValues] = useState(toValues(trial));
  const update = useUpdateTrial(trial.id);
  const { formRef, errors, check, fromServer } = useFormErrors();
  const onSubmit = (e: FormEvent) => {
    e.preventDefault();
    const data = check(trialUpdateSchema, toTrialInput(values));
    if (data) update.mutate(data, { onSuccess: onDone, onError: fromServer });
  };
  return (
    <form ref={formRef} noValidate className="space-y-4 rounded-lg border border-rule bg-sheet p-4" onSubmit={onSubmit}>
      <TrialFields values={values} onChange={setValues} errors={errors} pieceId={trial.piece?.id ?? null} />
      <FormAlert message={formMessage(update.error) ?? errors._?.join(' ') ?? null} />
      <div className="flex gap-3">
        <Button type="submit" disabled={update.isPending}>
          Save
        </Button>
        <Button type="button" variant="quiet" onClick={onDone}>
          Cancel
        </Button>
      </div>
    </form>
  );
}

/** The dry mass as weighed, its basis, and the other figure from the fibre's commercial regain. */
function DryMass({ trial }: { trial: TrialView }) {
  const m = trial.mass;
  return (
    <span>
      <span className="font-mono">{fmt(m.enteredG, 1)} g</span> {m.basis}
      {m.otherG != null ? (
        <span className="text-ink-soft">
          {' '}
          = <span className="font-mono">{fmt(m.otherG, 1)} g</span> {m.basis === 'oven-dry' ? 'air-dry' : 'oven-dry'} at{' '}
          {fmt(m.regainPct!, 2)} % regain for {m.fibre} ({m.source}
          {m.regainNote ? `; ${m.regainNote}` : ''})
        </span>
      ) : null}
      {m.problem ? <span className="block text-xs text-warn">{m.problem}</span> : null}
    </span>
  );
}

function Facts({ trial }: { trial: TrialView }) {
  const rows: Array<[string, React.ReactNode]> = [
    [
      'Piece',
      trial.piece ? (
        <Link className="underline" to={paths.piece(trial.piece.id)}>
          <span className="font-mono">{trial.piece.accessionNumber}</span> {trial.piece.title}
        </Link>
      ) : (
        '—'
      ),
    ],
    ...(trial.target.aim ? [['Aimed at', TARGET_AIM_WORDS[trial.target.aim]] as [string, React.ReactNode]] : []),
    ['Dyer', trial.dyer?.name ?? '—'],
    ['Status', STATUS_WORDS[trial.status]],
    [
      'Substrate',
      [trial.fibre, trial.weave, trial.gsm != null ? `${fmt(trial.gsm, 0)} g/m²` : null].filter(Boolean).join(', ') ||
        '—',
    ],
    ['Dry mass', <DryMass trial={trial} />],
    ['Started', trial.startedOn ?? '—'],
  ];
  return (
    <dl className="grid gap-x-6 gap-y-1 text-sm sm:grid-cols-[auto_1fr]">
      {rows.map(([k, v]) => (
        <div key={k} className="contents">
          <dt className="text-ink-soft">{k}</dt>
          <dd>{v}</dd>
        </div>
      ))}
      {trial.notes ? (
        <>
          <dt className="text-ink-soft">Notes</dt>
          <dd className="whitespace-pre-line">{trial.notes}</dd>
        </>
      ) : null}
    </dl>
  );
}

/** /trials/:id: the dyer's notebook page for one trial. */
export function TrialPage() {
  const id = Number(useParams().id);
  const q = useTrial(id);
  const navigate = useNavigate();
  const remove = useDeleteTrial(id);
  const [editing, setEditing] = useState<'details' | 'recipe' | null>(null);
  if (q.isPending) return <p className="py-10 text-ink-soft">Loading the trial…</p>;
  if (q.isError)
    return q.error instanceof ApiError && q.error.status === 404 ? (
      <NotFound title="Trial not found" />
    ) : (
      <p role="alert" className="text-danger">
        {q.error.message}
      </p>
    );
  const trial = q.data;
  const canEdit = trial.abilities['trial:update'];
  const historicalOnly = trial.warnings.flatMap((w) => (w.code === 'historical-only-in-modern' ? [w] : []));
  return (
    <Page
      title={`Trial ${trial.code}`}
      lead={
        trial.piece ? (
          <>
            Reproduces <span className="font-mono">{trial.piece.accessionNumber}</span> {trial.piece.title}
          </>
        ) : (
          'Not attached to a piece.'
        )
      }
      actions={
        <>
          {trial.piece ? (
            <Link
              className="rounded-md border border-rule-strong bg-sheet px-4 py-2 text-sm hover:bg-paper"
              to={paths.sideBySide(trial.piece.id)}
            >
              Side by side
            </Link>
          ) : null}
          <a
            className="rounded-md border border-rule-strong bg-sheet px-4 py-2 text-sm hover:bg-paper"
            href={trialCardUrl(trial.id)}
            title="This trial's printable sample card: swatch, recipe with units, ΔE00 to the target and a QR code back to this page"
          >
            Sample card (PDF)
          </a>
          {canEdit && !editing ? (
            <Button variant="secondary" onClick={() => setEditing('details')}>
              Edit details
            </Button>
          ) : null}
          {canEdit && !editing ? (
            <Button variant="secondary" onClick={() => setEditing('recipe')}>
              Edit recipe
            </Button>
          ) : null}
          {trial.abilities['trial:delete'] ? (
            <Button
              variant="danger"
              onClick={() =>
                confirm(`Delete trial ${trial.code} with its recipe and readings?`) &&
                remove.mutate(undefined, { onSuccess: () => navigate(paths.trials()) })
              }
            >
              Delete
            </Button>
          ) : null}
        </>
      }
    >
      <div className="space-y-10">
        {trial.historicalRecord ? (
          <p className="rounded-md border border-rule-strong bg-neutral-light px-4 py-3 text-sm">
            <strong>Historical recipe, recorded for scholarship.</strong> It documents past practice, including
            chemicals now kept for the historical record only; it is not a recipe to follow.
          </p>
        ) : null}
        {historicalOnly.length ? (
          <div role="alert" className="rounded-md border-2 border-danger bg-danger-tint px-4 py-3 text-danger">
            <p className="font-semibold">This modern trial uses chemicals kept for the historical record only:</p>
            <ul className="mt-1 list-disc pl-5 text-sm">
              {historicalOnly.map((w) => (
                <li key={`${w.stepPosition}-${w.chemicalId}`}>
                  Step {w.stepPosition}: {w.name}
                </li>
              ))}
            </ul>
            <p className="mt-1 text-sm">
              Replace them with a permitted substitute; follow the supplier's safety data sheet, local rules and
              licensed practice.
            </p>
          </div>
        ) : null}
        {editing === 'details' ? (
          <DetailsEditor trial={trial} onDone={() => setEditing(null)} />
        ) : (
          <Facts trial={trial} />
        )}
        {editing === 'recipe' ? (
          <RecipeEditor trial={trial} onDone={() => setEditing(null)} />
        ) : (
          <RecipeSection trial={trial} />
        )}
        <SubstitutionsSection trial={trial} />
        <ResultSection trial={trial} />
        <FastnessSection trial={trial} />
      </div>
    </Page>
  );
}
