import { useState } from 'react';
import { REASONS, substitutionSchema, type SubstitutionInput } from '../../../../shared/schemas/trial';
import { Button } from '../../../components/Button';
import { FormAlert } from '../../../components/form/FormAlert';
import { formMessage, useFormErrors } from '../../../lib/form';
import { ChemicalCaution } from '../../reference/components/ChemicalCaution';
import { useChemicals } from '../../reference/api';
import { useDeleteSubstitution, useSaveSubstitution, type TrialView } from '../api';
import { grams, REASON_WORDS } from '../format';
import { MetalLoad } from './MetalLoad';

const input = 'mt-1 block w-full rounded-md border border-rule-strong bg-sheet px-2 py-1.5 text-sm';
type Draft = { stepId: string; historicalChemicalId: string; historicalPractice: string; historicalAmountG: string; modernChemicalId: string; modernPractice: string; modernAmountG: string; reason: string; notes: string };
const empty: Draft = { stepId: '', historicalChemicalId: '', historicalPractice: '', historicalAmountG: '', modernChemicalId: '', modernPractice: '', modernAmountG: '', reason: 'toxicity', notes: '' };
const n = (x: string) => (x.trim() === '' ? null : Number(x));

function SubstitutionForm({ trial, onDone }: { trial: TrialView; onDone: () => void }) {
  const [d, setD] = useState<Draft>(empty);
  const chemicals = useChemicals();
  const save = useSaveSubstitution(trial.id);
  const { formRef, errors, check, fromServer } = useFormErrors();
  const set = (k: keyof Draft) => (e: { target: { value: string } }) => setD({ ...d, [k]: e.target.value });
  const chemOptions = (chemicals.data?.items ?? []).map((c) => <option key={c.id} value={c.id}>{c.name}</option>);
  const error = (k: string) => (errors[k] ? <span className="block text-xs text-danger">{errors[k].join(' ')}</span> : null);
  const bad = (k: string) => (errors[k] ? { 'aria-invalid': true as const } : {});
  const submit = () => {
    const body: SubstitutionInput = {
      stepId: n(d.stepId), historicalChemicalId: n(d.historicalChemicalId), historicalPractice: d.historicalPractice || null, historicalAmountG: n(d.historicalAmountG),
      modernChemicalId: n(d.modernChemicalId), modernPractice: d.modernPractice || null, modernAmountG: n(d.modernAmountG), reason: d.reason as SubstitutionInput['reason'], notes: d.notes || null,
    };
    if (check(substitutionSchema, body)) save.mutate(body, { onSuccess: () => { setD(empty); onDone(); }, onError: fromServer });
  };
  return (
    <form ref={formRef} noValidate className="grid gap-3 rounded-lg border border-rule bg-sheet p-4 sm:grid-cols-3" onSubmit={(e) => { e.preventDefault(); submit(); }} aria-label="Record a substitution">
      <label className="text-xs font-medium">Historical chemical<select className={input} value={d.historicalChemicalId} onChange={set('historicalChemicalId')} {...bad('historicalChemicalId')}><option value="">—</option>{chemOptions}</select>{error('historicalChemicalId')}</label>
      <label className="text-xs font-medium">or historical practice<input className={input} value={d.historicalPractice} onChange={set('historicalPractice')} {...bad('historicalPractice')} />{error('historicalPractice')}</label>
      <label className="text-xs font-medium">Historical amount <span className="font-normal text-ink-faint">(g, this batch)</span><input className={`${input} font-mono`} inputMode="decimal" value={d.historicalAmountG} onChange={set('historicalAmountG')} {...bad('historicalAmountG')} />{error('historicalAmountG')}</label>
      <label className="text-xs font-medium">Modern chemical<select className={input} value={d.modernChemicalId} onChange={set('modernChemicalId')} {...bad('modernChemicalId')}><option value="">—</option>{chemOptions}</select>{error('modernChemicalId')}</label>
      <label className="text-xs font-medium">or modern practice<input className={input} value={d.modernPractice} onChange={set('modernPractice')} placeholder="e.g. overdye with weld" {...bad('modernPractice')} />{error('modernPractice')}</label>
      <label className="text-xs font-medium">Modern amount <span className="font-normal text-ink-faint">(g; empty = from the recipe step)</span><input className={`${input} font-mono`} inputMode="decimal" value={d.modernAmountG} onChange={set('modernAmountG')} {...bad('modernAmountG')} />{error('modernAmountG')}</label>
      <label className="text-xs font-medium">Step<select className={input} value={d.stepId} onChange={set('stepId')} {...bad('stepId')}><option value="">—</option>{trial.steps.map((s) => <option key={s.id} value={s.id}>{s.position}. {s.operation}</option>)}</select>{error('stepId')}</label>
      <label className="text-xs font-medium">Reason<select className={input} value={d.reason} onChange={set('reason')} {...bad('reason')}>{REASONS.map((r) => <option key={r} value={r}>{REASON_WORDS[r]}</option>)}</select></label>
      <label className="text-xs font-medium">Notes<input className={input} value={d.notes} onChange={set('notes')} /></label>
      <div className="sm:col-span-3"><FormAlert message={formMessage(save.error)} /></div>
      <div className="flex gap-3 sm:col-span-3">
        <Button type="submit" disabled={save.isPending}>Save substitution</Button>
        <Button type="button" variant="quiet" onClick={onDone}>Cancel</Button>
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
        <h2 id="subs-h" className="text-xl font-semibold">Substitutions and what this reproduction avoided</h2>
        {canEdit && !adding ? <Button variant="secondary" onClick={() => setAdding(true)}>Add a substitution</Button> : null}
      </div>
      {adding ? <SubstitutionForm trial={trial} onDone={() => setAdding(false)} /> : null}
      {trial.substitutions.length === 0 ? <p className="text-ink-soft">No substitutions recorded.</p> : (
        <ul className="space-y-3">
          {trial.substitutions.map((s) => (
            <li key={s.id} className="rounded-lg border border-rule bg-sheet p-4">
              <div className="grid gap-4 md:grid-cols-2">
                <div>
                  <p className="text-xs uppercase tracking-wide text-ink-faint">Historical</p>
                  <p className="font-medium">{s.historicalChemical?.name ?? s.historicalPractice}{s.historicalChemical && s.historicalPractice ? <span className="text-ink-soft"> — {s.historicalPractice}</span> : null}</p>
                  <p className="font-mono text-sm">{grams(s.historicalAmountG)}</p>
                  {s.historicalChemical ? <div className="mt-2"><ChemicalCaution chemical={s.historicalChemical} compact /></div> : null}
                </div>
                <div>
                  <p className="text-xs uppercase tracking-wide text-ink-faint">Modern</p>
                  <p className="font-medium">{s.modernChemical?.name ?? s.modernPractice}{s.modernChemical && s.modernPractice ? <span className="text-ink-soft"> — {s.modernPractice}</span> : null}</p>
                  <p className="font-mono text-sm">{grams(s.modernAmountUsedG)}{s.modernAmountFrom === 'recipe' ? <span className="ml-1 font-sans text-xs text-ink-faint">from the recipe</span> : null}</p>
                  {s.modernChemical ? <div className="mt-2"><ChemicalCaution chemical={s.modernChemical} modernUse={trial.kind === 'modern'} compact /></div> : null}
                </div>
              </div>
              <p className="mt-2 text-sm text-ink-soft">Reason: {REASON_WORDS[s.reason as keyof typeof REASON_WORDS]}{s.stepPosition ? ` · step ${s.stepPosition}` : ''}{s.notes ? ` · ${s.notes}` : ''}</p>
              {canEdit ? <button className="mt-2 text-sm text-danger underline" onClick={() => confirm('Remove this substitution?') && remove.mutate(s.id)}>Remove</button> : null}
            </li>
          ))}
        </ul>
      )}
      <MetalLoad load={trial.metalLoad} />
    </section>
  );
}
