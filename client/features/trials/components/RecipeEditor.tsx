import { useId, useState } from 'react';
import {
  BASES,
  OPERATIONS,
  basisLabels,
  operationLabels,
  stepsSchema,
  type StepInput,
} from '../../../../shared/schemas/trial';
import { Button } from '../../../components/Button';
import { FormAlert } from '../../../components/form/FormAlert';
import { formMessage, useFormErrors } from '../../../lib/form';
import { useChemicals, useDyestuffs } from '../../reference';
import { useBatches } from '../../batches';
import { useReplaceSteps, type TrialView } from '../api';
import { incompatibleInStep } from '../../../../shared/compute/incompatible';

type Ing = { kind: 'dyestuff' | 'chemical'; refId: string; amount: string; basis: string };
type Draft = {
  id: number | null;
  operation: string;
  liquorRatio: string;
  temperatureC: string;
  minutes: string;
  ph: string;
  pasteVolumeMl: string;
  stockGPerL: string;
  batchId: string;
  batchVolumeMl: string;
  notes: string;
  ingredients: Ing[];
  /** A historical-only chemical in a modern trial: confirmed, and why. */
  historicalUseConfirmed: boolean;
  historicalUseReason: string;
};

const s = (x: number | null | undefined) => (x == null ? '' : String(x));
const n = (x: string) => (x.trim() === '' ? null : Number(x));
const input = 'mt-1 block w-full rounded-md border border-rule-strong bg-sheet px-2 py-1.5 text-sm';

const fromStep = (st: TrialView['steps'][number]): Draft => ({
  id: st.id,
  operation: st.operation,
  liquorRatio: s(st.liquorRatio),
  temperatureC: s(st.temperatureC),
  minutes: s(st.minutes),
  ph: s(st.ph),
  pasteVolumeMl: s(st.paste?.volumeMl),
  stockGPerL: s(st.paste?.stockGPerL),
  batchId: s(st.batchId),
  batchVolumeMl: s(st.batchVolumeMl),
  notes: st.notes ?? '',
  ingredients: st.ingredients.map((i) => ({
    kind: i.kind as Ing['kind'],
    refId: String(i.refId),
    amount: String(i.amount),
    basis: i.basis,
  })),
  historicalUseConfirmed: st.historicalUse != null,
  historicalUseReason: st.historicalUse?.reason ?? '',
});
const blank = (): Draft => ({
  id: null,
  operation: 'dye-bath',
  liquorRatio: '30',
  temperatureC: '',
  minutes: '',
  ph: '',
  pasteVolumeMl: '',
  stockGPerL: '',
  batchId: '',
  batchVolumeMl: '',
  notes: '',
  ingredients: [],
  historicalUseConfirmed: false,
  historicalUseReason: '',
});

const toInput = (d: Draft): StepInput => ({
  id: d.id,
  operation: d.operation as StepInput['operation'],
  liquorRatio: n(d.liquorRatio),
  temperatureC: n(d.temperatureC),
  minutes: n(d.minutes),
  ph: n(d.ph),
  paste: d.pasteVolumeMl.trim() ? { volumeMl: Number(d.pasteVolumeMl), stockGPerL: n(d.stockGPerL) } : null,
  batchId: n(d.batchId),
  batchVolumeMl: n(d.batchVolumeMl),
  notes: d.notes || null,
  ingredients: d.ingredients.map((i) => ({
    kind: i.kind,
    refId: Number(i.refId),
    amount: n(i.amount) as number,
    basis: i.basis as 'owf' | 'g/L' | 'g',
  })),
  ...(d.historicalUseConfirmed || d.historicalUseReason.trim()
    ? { historicalUseConfirmed: d.historicalUseConfirmed, historicalUseReason: d.historicalUseReason.trim() || null }
    : {}),
});

function Num({
  label,
  value,
  onChange,
  error,
  unit,
}: {
  label: string;
  value: string;
  onChange: (v: string) => void;
  error?: string[];
  unit?: string;
}) {
  return (
    <label className="block text-xs font-medium">
      {label}
      {unit ? <span className="font-normal text-ink-faint"> ({unit})</span> : null}
      <input
        className={`${input} font-mono ${error ? 'border-danger' : ''}`}
        inputMode="decimal"
        value={value}
        onChange={(e) => onChange(e.target.value)}
        aria-invalid={error ? true : undefined}
      />
      {error ? <span className="text-danger">{error.join(' ')}</span> : null}
    </label>
  );
}

/** Dangerous pairs among the chemicals chosen for this step, as soon as they are chosen (the same rules as the server's). */
function MixWarnings({
  draft,
  step,
  chemicals,
}: {
  draft: Draft;
  step: number;
  chemicals: Array<{ id: number; name: string; formula: string | null; role: string }>;
}) {
  const chosen = [
    ...new Map(
      draft.ingredients
        .filter((g) => g.kind === 'chemical')
        .map((g) => chemicals.find((c) => String(c.id) === g.refId))
        .filter((c): c is (typeof chemicals)[number] => Boolean(c))
        .map((c) => [c.id, c]),
    ).values(),
  ];
  const warnings = incompatibleInStep(step, chosen);
  if (!warnings.length) return null;
  return (
    <div className="mt-3 space-y-1" data-testid="mix-warnings">
      {warnings.map((w) => (
        <p key={w.code} className="rounded-md border-2 border-danger bg-danger-tint px-3 py-2 text-sm text-danger">
          <span className="font-semibold">⚠ {w.message}</span> <span className="text-xs">Source: {w.source}.</span>
        </p>
      ))}
    </div>
  );
}

/**
 * Beside a step of a modern trial that names a historical-only chemical: a confirmation and its reason,
 * which the server requires before it saves the step (422 otherwise) and records with who and when.
 */
function HistoricalUse({
  trial,
  draft,
  chemicals,
  onChange,
  errors,
  step,
}: {
  trial: TrialView;
  draft: Draft;
  chemicals: Array<{ id: number; name: string; status: string }>;
  step: number;
  onChange: (patch: Partial<Draft>) => void;
  errors: { confirmed?: string[]; reason?: string[] };
}) {
  const id = useId();
  if (trial.kind !== 'modern') return null;
  const names = [
    ...new Set(
      draft.ingredients
        .filter((g) => g.kind === 'chemical')
        .map((g) => chemicals.find((c) => String(c.id) === g.refId))
        .filter((c) => c?.status === 'historical-only')
        .map((c) => c!.name),
    ),
  ];
  if (!names.length) return null;
  return (
    <div className="mt-3 space-y-2 rounded-md border-2 border-danger bg-danger-tint p-3 text-sm text-danger">
      <p className="font-semibold">
        ⚠ {names.join(', ')} {names.length === 1 ? 'is' : 'are'} kept for historical recipes only. Prefer a modern
        substitute; use {names.length === 1 ? 'it' : 'them'} only under the supplier's safety data sheet, local rules
        and licensed practice.
      </p>
      <label className="flex items-start gap-2">
        <input
          type="checkbox"
          name={`steps.${step - 1}.historicalUseConfirmed`}
          checked={draft.historicalUseConfirmed}
          onChange={(e) => onChange({ historicalUseConfirmed: e.target.checked })}
          aria-invalid={errors.confirmed ? true : undefined}
          aria-describedby={errors.confirmed ? `${id}-confirmed` : undefined}
        />
        <span>
          I confirm step {step} uses {names.join(', ')} in this modern trial.
        </span>
      </label>
      {errors.confirmed ? (
        <p id={`${id}-confirmed`} className="text-xs">
          {errors.confirmed.join(' ')}
        </p>
      ) : null}
      <label className="block text-xs font-medium text-ink">
        Reason (recorded with your name and the date)
        <textarea
          name={`steps.${step - 1}.historicalUseReason`}
          className={`${input} ${errors.reason ? 'border-danger' : ''}`}
          rows={2}
          value={draft.historicalUseReason}
          onChange={(e) => onChange({ historicalUseReason: e.target.value })}
          aria-invalid={errors.reason ? true : undefined}
          aria-describedby={errors.reason ? `${id}-reason` : undefined}
        />
      </label>
      {errors.reason ? (
        <p id={`${id}-reason`} className="text-xs">
          {errors.reason.join(' ')}
        </p>
      ) : null}
    </div>
  );
}

/** Edit the whole ordered recipe and save it in one request (the server replaces it in one transaction). */
export function RecipeEditor({ trial, onDone }: { trial: TrialView; onDone: () => void }) {
  const [steps, setSteps] = useState<Draft[]>(trial.steps.length ? trial.steps.map(fromStep) : [blank()]);
  const chemicals = useChemicals();
  const dyestuffs = useDyestuffs();
  const activeBaths = useBatches({ status: 'active' });
  // Active baths by code, plus any bath a stored step already draws from (it may since be exhausted).
  const baths = [
    ...(activeBaths.data?.items ?? []).map((b) => ({
      id: b.id,
      label: `${b.code} — ${b.name} (${Math.round(b.remainingMl)} mL left)`,
    })),
    ...trial.steps.flatMap((st) =>
      st.batch && !activeBaths.data?.items.some((b) => b.id === st.batch!.id)
        ? [
            {
              id: st.batch.id,
              label: `${st.batch.code} — ${st.batch.name} (${st.batch.status}, ${Math.round(st.batch.remainingMl)} mL left)`,
            },
          ]
        : [],
    ),
  ].filter((b, i, all) => all.findIndex((x) => x.id === b.id) === i);
  const save = useReplaceSteps(trial.id);
  const { formRef, errors, check, fromServer } = useFormErrors();
  const err = (i: number, k: string) => errors[`steps.${i}.${k}`];
  const fields = Object.keys(errors).length ? errors : undefined;
  const update = (i: number, patch: Partial<Draft>) =>
    setSteps((all) => all.map((d, j) => (j === i ? { ...d, ...patch } : d)));
  const move = (i: number, by: number) =>
    setSteps((all) => {
      const next = [...all];
      const [x] = next.splice(i, 1);
      next.splice(i + by, 0, x);
      return next;
    });
  const setIng = (i: number, k: number, patch: Partial<Ing>) =>
    update(i, { ingredients: steps[i].ingredients.map((x, j) => (j === k ? { ...x, ...patch } : x)) });

  return (
    <form
      ref={formRef}
      noValidate
      className="space-y-4"
      onSubmit={(e) => {
        e.preventDefault();
        const input = { steps: steps.map(toInput) };
        if (check(stepsSchema, input)) save.mutate(input, { onSuccess: onDone, onError: fromServer });
      }}
    >
      {steps.map((d, i) => (
        <fieldset key={i} className="rounded-lg border border-rule bg-sheet p-4">
          <legend className="px-1 text-sm font-semibold">Step {i + 1}</legend>
          <div className="grid gap-3 sm:grid-cols-4">
            <label className="block text-xs font-medium">
              Operation
              <select className={input} value={d.operation} onChange={(e) => update(i, { operation: e.target.value })}>
                {OPERATIONS.map((o) => (
                  <option key={o} value={o}>
                    {operationLabels[o]}
                  </option>
                ))}
              </select>
            </label>
            <Num
              label="Liquor ratio 1:"
              value={d.liquorRatio}
              onChange={(v) => update(i, { liquorRatio: v })}
              error={err(i, 'liquorRatio')}
            />
            <Num
              label="Temperature"
              unit="°C"
              value={d.temperatureC}
              onChange={(v) => update(i, { temperatureC: v })}
              error={err(i, 'temperatureC')}
            />
            <Num
              label="Time"
              unit="min"
              value={d.minutes}
              onChange={(v) => update(i, { minutes: v })}
              error={err(i, 'minutes')}
            />
            <Num label="pH" value={d.ph} onChange={(v) => update(i, { ph: v })} error={err(i, 'ph')} />
            <Num
              label="Paste volume"
              unit="mL"
              value={d.pasteVolumeMl}
              onChange={(v) => update(i, { pasteVolumeMl: v })}
              error={err(i, 'paste.volumeMl')}
            />
            <Num
              label="Stock strength"
              unit="g/L"
              value={d.stockGPerL}
              onChange={(v) => update(i, { stockGPerL: v })}
              error={err(i, 'paste.stockGPerL')}
            />
            <label className="block text-xs font-medium sm:col-span-2">
              Drawn from bath
              <select
                className={`${input} ${err(i, 'batchId') ? 'border-danger' : ''}`}
                value={d.batchId}
                onChange={(e) => update(i, { batchId: e.target.value })}
                aria-invalid={err(i, 'batchId') ? true : undefined}
              >
                <option value="">No bath</option>
                {baths.map((b) => (
                  <option key={b.id} value={b.id}>
                    {b.label}
                  </option>
                ))}
              </select>
              {err(i, 'batchId') ? <span className="text-danger">{err(i, 'batchId')!.join(' ')}</span> : null}
            </label>
            <Num
              label="Volume drawn"
              unit="mL"
              value={d.batchVolumeMl}
              onChange={(v) => update(i, { batchVolumeMl: v })}
              error={err(i, 'batchVolumeMl')}
            />
          </div>
          <table className="mt-3 w-full text-sm">
            <thead className="text-left text-xs text-ink-soft">
              <tr>
                <th>Kind</th>
                <th>Ingredient</th>
                <th>Amount</th>
                <th>Basis</th>
                <th />
              </tr>
            </thead>
            <tbody>
              {d.ingredients.map((ing, k) => {
                const options =
                  ing.kind === 'chemical'
                    ? (chemicals.data?.items ?? []).map((c) => ({
                        id: c.id,
                        label: `${c.name}${c.status === 'historical-only' ? ' — historical only' : ''}`,
                      }))
                    : (dyestuffs.data?.items ?? []).map((x) => ({ id: x.id, label: x.name }));
                return (
                  <tr key={k}>
                    <td className="pr-2">
                      <select
                        aria-label={`Step ${i + 1} ingredient ${k + 1} kind`}
                        className={input}
                        value={ing.kind}
                        onChange={(e) => setIng(i, k, { kind: e.target.value as Ing['kind'], refId: '' })}
                      >
                        <option value="chemical">chemical</option>
                        <option value="dyestuff">dyestuff</option>
                      </select>
                    </td>
                    <td className="pr-2">
                      <select
                        aria-label={`Step ${i + 1} ingredient ${k + 1}`}
                        aria-invalid={err(i, `ingredients.${k}.refId`) ? true : undefined}
                        className={input}
                        value={ing.refId}
                        onChange={(e) => setIng(i, k, { refId: e.target.value })}
                      >
                        <option value="">Choose…</option>
                        {options.map((o) => (
                          <option key={o.id} value={o.id}>
                            {o.label}
                          </option>
                        ))}
                      </select>
                      {err(i, `ingredients.${k}.refId`) ? (
                        <span className="text-xs text-danger">{err(i, `ingredients.${k}.refId`)!.join(' ')}</span>
                      ) : null}
                    </td>
                    <td className="pr-2">
                      <input
                        aria-label={`Step ${i + 1} ingredient ${k + 1} amount`}
                        aria-invalid={err(i, `ingredients.${k}.amount`) ? true : undefined}
                        className={`${input} w-24 font-mono`}
                        inputMode="decimal"
                        value={ing.amount}
                        onChange={(e) => setIng(i, k, { amount: e.target.value })}
                      />
                      {err(i, `ingredients.${k}.amount`) ? (
                        <span className="text-xs text-danger">{err(i, `ingredients.${k}.amount`)!.join(' ')}</span>
                      ) : null}
                    </td>
                    <td className="pr-2">
                      <select
                        aria-label={`Step ${i + 1} ingredient ${k + 1} basis`}
                        className={input}
                        value={ing.basis}
                        onChange={(e) => setIng(i, k, { basis: e.target.value })}
                      >
                        {BASES.map((b) => (
                          <option key={b} value={b}>
                            {basisLabels[b]}
                          </option>
                        ))}
                      </select>
                    </td>
                    <td>
                      <button
                        type="button"
                        className="text-xs text-danger underline"
                        onClick={() => update(i, { ingredients: d.ingredients.filter((_, j) => j !== k) })}
                      >
                        Remove
                      </button>
                    </td>
                  </tr>
                );
              })}
            </tbody>
          </table>
          <MixWarnings draft={d} step={i + 1} chemicals={chemicals.data?.items ?? []} />
          <HistoricalUse
            trial={trial}
            draft={d}
            chemicals={chemicals.data?.items ?? []}
            onChange={(patch) => update(i, patch)}
            errors={{ confirmed: err(i, 'historicalUseConfirmed'), reason: err(i, 'historicalUseReason') }}
            step={i + 1}
          />
          <label className="mt-3 block text-xs font-medium">
            Notes
            <textarea
              className={input}
              rows={2}
              value={d.notes}
              onChange={(e) => update(i, { notes: e.target.value })}
            />
          </label>
          <div className="mt-3 flex flex-wrap gap-3 text-sm">
            <button
              type="button"
              className="underline"
              onClick={() =>
                update(i, {
                  ingredients: [...d.ingredients, { kind: 'chemical', refId: '', amount: '', basis: 'owf' }],
                })
              }
            >
              Add ingredient
            </button>
            <button
              type="button"
              className="underline disabled:opacity-40"
              disabled={i === 0}
              onClick={() => move(i, -1)}
            >
              Move up
            </button>
            <button
              type="button"
              className="underline disabled:opacity-40"
              disabled={i === steps.length - 1}
              onClick={() => move(i, 1)}
            >
              Move down
            </button>
            <button
              type="button"
              className="text-danger underline"
              onClick={() => setSteps((all) => all.filter((_, j) => j !== i))}
            >
              Remove step
            </button>
          </div>
        </fieldset>
      ))}
      <FormAlert message={fields ? 'Some fields need attention; see the steps above.' : formMessage(save.error)} />
      <div className="flex gap-3">
        <Button type="button" variant="secondary" onClick={() => setSteps((all) => [...all, blank()])}>
          Add step
        </Button>
        <Button type="submit" disabled={save.isPending}>
          {save.isPending ? 'Saving…' : 'Save recipe'}
        </Button>
        <Button type="button" variant="quiet" onClick={onDone}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
