import { useState, type FormEvent } from 'react';
import { DISPOSAL_NOTICE, batchEventSchema, type BatchEventInput } from '../../../../shared/schemas/batches';
import { Button } from '../../../components/Button';
import { Field } from '../../../components/form/Field';
import { FormAlert } from '../../../components/form/FormAlert';
import { formMessage, useFormErrors } from '../../../lib/form';
import { useAddBatchEvent, type BatchDetail } from '../api';

const TYPES = [
  { type: 'use', label: 'Draw for a trial' },
  { type: 'top-up', label: 'Top up' },
  { type: 'water', label: 'Add water' },
  { type: 'test-strip', label: 'Test strip' },
  { type: 'ph', label: 'pH check' },
  { type: 'disposal', label: 'Dispose' },
] as const;
type T = (typeof TYPES)[number]['type'];

/** The ledger's words for each event type. */
export const EVENT_LABELS: Record<T, string> = {
  use: 'draw',
  'top-up': 'top-up',
  water: 'water added',
  'test-strip': 'test strip',
  ph: 'pH check',
  disposal: 'disposal',
};

// An exhausted bath can only be disposed of; a disposed one takes no more events.
const offered = (status: BatchDetail['status']) =>
  status === 'active' ? TYPES : status === 'exhausted' ? TYPES.filter((t) => t.type === 'disposal') : [];

const num = (v: FormDataEntryValue | null) => (v === null || v === '' ? undefined : Number(v));
const str = (v: FormDataEntryValue | null) => (v === null || String(v).trim() === '' ? undefined : String(v).trim());

/** One form per ledger event type; the server decides and explains any refusal. */
export function EventForms({ batch }: { batch: BatchDetail }) {
  const types = offered(batch.status);
  const [type, setType] = useState<T>(types[0]?.type ?? 'use');
  const add = useAddBatchEvent(batch.id);
  const { formRef, errors, check, fromServer, clear } = useFormErrors();
  const [done, setDone] = useState<string | null>(null);
  const chemicals = batch.ingredients.filter((i) => i.kind === 'chemical');

  async function onSubmit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const form = e.currentTarget;
    const f = new FormData(form);
    const additions = chemicals
      .map((c) => ({ ...c, grams: num(f.get(`add-${c.refId}`)) }))
      .filter((c): c is typeof c & { grams: number } => c.grams !== undefined && c.grams > 0);
    const input: Partial<BatchEventInput> & { reason?: string } = {
      type,
      volumeMl: num(f.get('volumeMl')),
      fibreMassG: num(f.get('fibreMassG')),
      trialCode: str(f.get('trialCode')),
      ph: num(f.get('ph')),
      result: str(f.get('result')),
      route: str(f.get('route')),
      ruleFollowed: str(f.get('ruleFollowed')),
      reason: str(f.get('reason')),
      notes: str(f.get('notes')),
      additions: type === 'top-up' && additions.length ? additions : undefined,
    };
    setDone(null);
    const data = check(batchEventSchema, input);
    if (!data) return;
    try {
      await add.mutateAsync(data);
      setDone(`${TYPES.find((t) => t.type === type)!.label}: recorded.`);
      form.reset();
    } catch (err) {
      fromServer(err);
    }
  }

  if (batch.status === 'disposed')
    return <p className="text-sm text-ink-soft">This batch has been disposed of; the ledger is closed.</p>;
  return (
    <div>
      <div role="tablist" aria-label="Event type" className="flex flex-wrap gap-1 mb-4">
        {types.map((t) => (
          <button
            key={t.type}
            role="tab"
            type="button"
            aria-selected={type === t.type}
            onClick={() => {
              setType(t.type);
              clear();
              setDone(null);
              add.reset();
            }}
            className={`px-3 py-1.5 rounded-md text-sm border ${type === t.type ? 'bg-action text-white border-action' : 'border-rule-strong bg-sheet hover:bg-paper'}`}
          >
            {t.label}
          </button>
        ))}
      </div>
      <form
        ref={formRef}
        key={type}
        onSubmit={onSubmit}
        noValidate
        className="grid gap-3 sm:grid-cols-2 max-w-2xl"
        aria-label={TYPES.find((t) => t.type === type)!.label}
      >
        {type === 'use' && (
          <>
            <Field
              label="Volume drawn"
              unit="mL"
              name="volumeMl"
              type="number"
              step="any"
              min="0"
              inputMode="decimal"
              error={errors.volumeMl}
              hint={`${batch.remainingMl} mL left`}
            />
            <Field
              label="Trial code"
              name="trialCode"
              placeholder="T-2024-001"
              error={errors.trialCode ?? errors.trialId}
              hint="A recipe step’s draw is recorded when the recipe is saved; enter here only draws made outside a recipe."
            />
            <Field
              label="Fibre mass"
              unit="g"
              name="fibreMassG"
              type="number"
              step="any"
              min="0"
              error={errors.fibreMassG}
            />
          </>
        )}
        {type === 'top-up' && (
          <>
            {chemicals.map((c) => (
              <Field
                key={c.refId}
                label={`${c.name} added`}
                unit="g"
                name={`add-${c.refId}`}
                type="number"
                step="any"
                min="0"
                error={errors.additions}
              />
            ))}
            <Field
              label="Water added with it"
              unit="mL"
              name="volumeMl"
              type="number"
              step="any"
              min="0"
              error={errors.volumeMl}
            />
          </>
        )}
        {type === 'water' && (
          <Field
            label="Water added"
            unit="mL"
            name="volumeMl"
            type="number"
            step="any"
            min="0"
            error={errors.volumeMl}
          />
        )}
        {type === 'test-strip' && (
          <Field label="What the strip showed" name="result" error={errors.result} className="sm:col-span-2" />
        )}
        {type === 'ph' && (
          <Field label="pH reading" name="ph" type="number" step="0.1" min="0" max="14" error={errors.ph} />
        )}
        {type === 'disposal' && (
          <>
            <p className="sm:col-span-2 rounded-md bg-warn-tint px-3 py-2 text-sm text-warn">{DISPOSAL_NOTICE}</p>
            <Field
              label="Route"
              name="route"
              placeholder="collected by a licensed waste contractor"
              error={errors.route}
            />
            <Field label="Local rule or SDS section followed" name="ruleFollowed" error={errors.ruleFollowed} />
            {batch.status !== 'exhausted' && (
              <Field
                label="Reason for disposing before it is exhausted"
                name="reason"
                error={errors.reason}
                className="sm:col-span-2"
              />
            )}
          </>
        )}
        <Field label="Notes" name="notes" className="sm:col-span-2" error={errors.notes} />
        <div className="sm:col-span-2">
          <FormAlert message={formMessage(add.error)} />
        </div>
        {done ? (
          <p role="status" className="sm:col-span-2 rounded-md bg-ok-tint px-3 py-2 text-sm text-ok">
            {done}
          </p>
        ) : null}
        <div className="sm:col-span-2">
          <Button type="submit" variant={type === 'disposal' ? 'danger' : 'primary'} disabled={add.isPending}>
            {add.isPending ? 'Recording…' : 'Record'}
          </Button>
        </div>
      </form>
    </div>
  );
}
