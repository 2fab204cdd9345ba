import { useState } from 'react';
import { REASONS, substitutionSchema, type SubstitutionInput } from '../../../../shared/schemas/trial';
import { Button } from '../../../components/Button';
import { Field } from '../../../components/form/Field';
import { FormAlert } from '../../../components/form/FormAlert';
import { Select } from '../../../components/form/Select';
import { formMessage, useFormErrors } from '../../../lib/form';
import { ChemicalCaution } from '../../reference';
import { useChemicals } from '../../reference';
import { useDeleteSubstitution, useSaveSubstitution, type TrialView } from '../api';
import { grams, REASON_WORDS } from '../format';
import { MetalLoad } from './MetalLoad';

type Draft = {
  stepId: string;
  historicalChemicalId: string;
  historicalPractice: string;
  historicalAmountG: string;
  modernChemicalId: string;
  modernPractice: string;
  modernAmountG: string;
  reason: string;
  notes: string;
};
const empty: Draft = {
  stepId: '',
  historicalChemicalId: '',
  historicalPractice: '',
  historicalAmountG: '',
  modernChemicalId: '',
  modernPractice: '',
  modernAmountG: '',
  reason: 'toxicity',
  notes: '',
};
// Empty is none; text that is not a number goes to the schema as typed, so its message asks for a number.
const n = (x: string) => (x.trim() === '' ? null : Number.isNaN(Number(x)) ? (x as unknown as number) : Number(x));

function SubstitutionForm({ trial, onDone }: { trial: TrialView; onDone: () => void }) {
  const [d, setD] = useState<Draft>(empty);
  const chemicals = useChemicals();
  const save = useSaveSubstitution(trial.id);
  const { formRef, errors, check, fromServer } = useFormErrors();
  const set = (k: keyof Draft) => (e: { target: { value: string } }) => setD({ ...d, [k]: e.target.value });
  const chemOptions = [
    { value: '', label: '—' },
    ...(chemicals.data?.items ?? []).map((c) => ({ value: String(c.id), label: c.name })),
  ];
  const stepOptions = [
    { value: '', label: '—' },
    ...trial.steps.map((s) => ({ value: String(s.id), label: `${s.position}. ${s.operation}` })),
  ];
  const submit = () => {
    const body: SubstitutionInput = {
      stepId: n(d.stepId),
      historicalChemicalId: n(d.historicalChemicalId),
      historicalPractice: d.historicalPractice || null,
      historicalAmountG: n(d.historicalAmountG),
      modernChemicalId: n(d.modernChemicalId),
      modernPractice: d.modernPractice || null,
      modernAmountG: n(d.modernAmountG),
      reason: d.reason as SubstitutionInput['reason'],
      notes: d.notes || null,
    };
    if (check(substitutionSchema, body))
      save.mutate(body, {
        onSuccess: () => {
          setD(empty);
          onDone();
        },
        onError: fromServer,
      });
  };
  return (
    <form
      ref={formRef}
      noValidate
      className="grid gap-3 rounded-lg border border-rule bg-sheet p-4 sm:grid-cols-3"
      onSubmit={(e) => {
        e.preventDefault();
        submit();
      }}
      aria-label="Record a substitution"
    >
      <Select
        label="Historical chemical"
        value={d.historicalChemicalId}
        onChange={set('historicalChemicalId')}
        options={chemOptions}
        error={errors.historicalChemicalId}
      />
      <Field
        label="or historical practice"
        value={d.historicalPractice}
        onChange={set('historicalPractice')}
        error={errors.historicalPractice}
      />
      <Field
        label="Historical amount"
        unit="g, this batch"
        className="font-mono"
        inputMode="decimal"
        value={d.historicalAmountG}
        onChange={set('historicalAmountG')}
        error={errors.historicalAmountG}
      />
      <Select
        label="Modern chemical"
        value={d.modernChemicalId}
        onChange={set('modernChemicalId')}
        options={chemOptions}
        error={errors.modernChemicalId}
      />
      <Field
        label="or modern practice"
        value={d.modernPractice}
        onChange={set('modernPractice')}
        placeholder="e.g. overdye with weld"
        error={errors.modernPractice}
      />
      <Field
        label="Modern amount"
        unit="g; empty = from the recipe step"
        className="font-mono"
        inputMode="decimal"
        value={d.modernAmountG}
        onChange={set('modernAmountG')}
        error={errors.modernAmountG}
      />
      <Select label="Step" value={d.stepId} onChange={set('stepId')} options={stepOptions} error={errors.stepId} />
      <Select
        label="Reason"
        value={d.reason}
        onChange={set('reason')}
        options={REASONS.map((r) => ({ value: r, label: REASON_WORDS[r] }))}
        error={errors.reason}
      />
      <Field label="Notes" value={d.notes} onChange={set('notes')} error={errors.notes} />
      <div className="sm:col-span-3">
        <FormAlert message={formMessage(save.error)} />
      </div>
      <div className="flex gap-3 sm:col-span-3">
        <Button type="submit" disabled={save.isPending}>
          Save substitution
        </Button>
        <Button type="button" variant="quiet" onClick={onDone}>
          Cancel
        </Button>
      </div>
    </form>
  );
}

/** Each historical chemical or practice the trial replaced, and the metal it kept out of the bath. */
export function SubstitutionsSection({ trial }: { trial: TrialView }) {
  const [adding, setAdding] = useState(false);
  const remove = useDeleteSubstitution(trial.id);
  const canEdit = trial.abilities['trial:update'];
  return (
    <section aria-labelledby="subs-h" className="space-y-4">
      <div className="flex items-end justify-between gap-3">
        <h2 id="subs-h" className="text-xl font-semibold">
          Substitutions and what this reproduction avoided
        </h2>
        {canEdit && !adding ? (
          <Button variant="secondary" onClick={() => setAdding(true)}>
            Add a substitution
          </Button>
        ) : null}
      </div>
      {adding ? <SubstitutionForm trial={trial} onDone={() => setAdding(false)} /> : null}
      {trial.substitutions.length === 0 ? (
        <p className="text-ink-soft">No substitutions recorded.</p>
      ) : (
        <ul className="space-y-3">
          {trial.substitutions.map((s) => (
            <li key={s.id} className="rounded-lg border border-rule bg-sheet p-4">
              <div className="grid gap-4 md:grid-cols-2">
                <div>
                  <p className="text-xs uppercase tracking-wide text-ink-faint">Historical</p>
                  <p className="font-medium">
                    {s.historicalChemical?.name ?? s.historicalPractice}
                    {s.historicalChemical && s.historicalPractice ? (
                      <span className="text-ink-soft"> — {s.historicalPractice}</span>
                    ) : null}
                  </p>
                  <p className="font-mono text-sm">{grams(s.historicalAmountG)}</p>
                  {s.historicalChemical ? (
                    <div className="mt-2">
                      <ChemicalCaution chemical={s.historicalChemical} compact />
                    </div>
                  ) : null}
                </div>
                <div>
                  <p className="text-xs uppercase tracking-wide text-ink-faint">Modern</p>
                  <p className="font-medium">
                    {s.modernChemical?.name ?? s.modernPractice}
                    {s.modernChemical && s.modernPractice ? (
                      <span className="text-ink-soft"> — {s.modernPractice}</span>
                    ) : null}
                  </p>
                  <p className="font-mono text-sm">
                    {grams(s.modernAmountUsedG)}
                    {s.modernAmountFrom === 'recipe' ? (
                      <span className="ml-1 font-sans text-xs text-ink-faint">from the recipe</span>
                    ) : null}
                  </p>
                  {s.modernChemical ? (
                    <div className="mt-2">
                      <ChemicalCaution chemical={s.modernChemical} modernUse={trial.kind === 'modern'} compact />
                    </div>
                  ) : null}
                </div>
              </div>
              <p className="mt-2 text-sm text-ink-soft">
                Reason: {REASON_WORDS[s.reason as keyof typeof REASON_WORDS]}
                {s.stepPosition ? ` · step ${s.stepPosition}` : ''}
                {s.notes ? ` · ${s.notes}` : ''}
              </p>
              {canEdit ? (
                <button
                  className="mt-2 text-sm text-danger underline"
                  onClick={() => confirm('Remove this substitution?') && remove.mutate(s.id)}
                >
                  Remove
                </button>
              ) : null}
            </li>
          ))}
        </ul>
      )}
      <MetalLoad load={trial.metalLoad} />
    </section>
  );
}
