import { useState } from 'react';
import { conditionCreateSchema } from '../../../../shared/schemas/records';
import { Button } from '../../../components/Button';
import { Field } from '../../../components/form/Field';
import { CheckboxGroup } from '../../../components/form/CheckboxGroup';
import { FormAlert } from '../../../components/form/FormAlert';
import { formMessage, useFormErrors } from '../../../lib/form';
import { useConditions, useCreateCondition } from '../api';

const today = () => new Date().toISOString().slice(0, 10);

/** Dated condition reports, newest first, and the form a curator records one with. */
export function ConditionPanel({ pieceId, photos }: { pieceId: number; photos: Array<{ id: number; label: string }> }) {
  const list = useConditions(pieceId, true);
  const [open, setOpen] = useState(false);
  const items = list.data?.items ?? [];
  return (
    <section className="space-y-4" aria-labelledby="condition-h">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <h2 id="condition-h" className="font-serif text-2xl">
          Condition reports
        </h2>
        {list.data?.canCreate && !open ? (
          <Button variant="secondary" onClick={() => setOpen(true)}>
            Report the condition
          </Button>
        ) : null}
      </div>
      {open ? <ConditionForm pieceId={pieceId} photos={photos} onDone={() => setOpen(false)} /> : null}
      {list.data && !items.length ? <p className="text-sm text-ink-soft">No condition reports yet.</p> : null}
      <ol className="space-y-3">
        {items.map((r) => (
          <li key={r.id} className="rounded-md border border-rule bg-sheet p-4">
            <h3 className="font-medium">
              <span className="num">{r.assessedOn}</span> · {r.state}
            </h3>
            <p className="text-sm text-ink-soft">Assessed by {r.assessor}</p>
            {r.notes ? <p className="mt-1 whitespace-pre-line text-sm">{r.notes}</p> : null}
            {r.photoIds.length ? (
              <p className="mt-1 text-sm">
                Photos: {r.photoIds.map((id) => photos.find((p) => p.id === id)?.label ?? `photo ${id}`).join(', ')}
              </p>
            ) : null}
          </li>
        ))}
      </ol>
    </section>
  );
}

function ConditionForm({
  pieceId,
  photos,
  onDone,
}: {
  pieceId: number;
  photos: Array<{ id: number; label: string }>;
  onDone: () => void;
}) {
  const create = useCreateCondition(pieceId);
  const { formRef, errors, check, fromServer } = useFormErrors();
  const [assessedOn, setAssessedOn] = useState(today());
  const [assessor, setAssessor] = useState('');
  const [state, setState] = useState('');
  const [notes, setNotes] = useState('');
  const [photoIds, setPhotoIds] = useState<number[]>([]);
  const submit = (e: React.FormEvent) => {
    e.preventDefault();
    const input = check(conditionCreateSchema, {
      assessedOn: assessedOn || undefined,
      assessor: assessor || undefined,
      state: state || undefined,
      notes: notes || null,
      photoIds,
    });
    if (input) create.mutate(input, { onSuccess: onDone, onError: fromServer });
  };
  return (
    <form ref={formRef} onSubmit={submit} noValidate className="space-y-4 rounded-md border border-rule p-4">
      <div className="grid gap-4 sm:grid-cols-3">
        <Field
          label="Date assessed"
          type="date"
          value={assessedOn}
          onChange={(e) => setAssessedOn(e.target.value)}
          error={errors.assessedOn}
        />
        <Field
          label="Assessor"
          value={assessor}
          onChange={(e) => setAssessor(e.target.value)}
          error={errors.assessor}
        />
        <Field
          label="Overall state"
          value={state}
          onChange={(e) => setState(e.target.value)}
          error={errors.state}
          hint="In the museum's own terms, e.g. good, fair, stable"
        />
      </div>
      {photos.length ? (
        <CheckboxGroup
          legend="Photos that show it"
          options={photos.map((p) => ({ value: p.id, label: p.label }))}
          selected={photoIds}
          onChange={setPhotoIds}
          error={errors.photoIds}
        />
      ) : null}
      <label className="block text-sm">
        <span className="font-medium">Notes</span>
        <textarea
          value={notes}
          onChange={(e) => setNotes(e.target.value)}
          rows={3}
          className="mt-1 block w-full rounded-md border border-rule-strong bg-sheet px-3 py-2 text-sm"
        />
      </label>
      <FormAlert message={formMessage(create.error)} />
      <div className="flex gap-2">
        <Button type="submit" disabled={create.isPending}>
          Save report
        </Button>
        <Button type="button" variant="quiet" onClick={onDone}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
