import { useState, type FormEvent } from 'react';
import { useNavigate } from 'react-router-dom';
import { BATCH_KINDS, batchCreateSchema } from '../../../../shared/schemas/batches';
import { Button } from '../../../components/Button';
import { Field } from '../../../components/form/Field';
import { ApiError } from '../../../lib/http';
import { paths } from '../../../paths';
import { useBatches, useCreateBatch } from '../api';
import { IngredientRows, ingredientsFrom } from './IngredientRows';

const num = (v: FormDataEntryValue | null) => (v === null || v === '' ? undefined : Number(v));

/** A new bath or a dilution of an existing one (a child batch). */
export function NewBathForm({ onDone }: { onDone: () => void }) {
  const create = useCreateBatch();
  const parents = useBatches({ status: 'active' });
  const navigate = useNavigate();
  const [errors, setErrors] = useState<Record<string, string[]>>({});
  const [rows, setRows] = useState([{ key: '', grams: '' }]);

  async function onSubmit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const f = new FormData(e.currentTarget);
    const raw = {
      code: f.get('code'), kind: f.get('kind'), name: f.get('name'), volumeMl: num(f.get('volumeMl')), madeOn: f.get('madeOn'),
      checkBy: f.get('checkBy') || null, thickenerGPerL: num(f.get('thickenerGPerL')) ?? null, ph: num(f.get('ph')) ?? null,
      ingredients: ingredientsFrom(rows), uptakePerUse: (num(f.get('uptakePct')) ?? 10) / 100, parentId: num(f.get('parentId')) ?? null, notes: f.get('notes') || null,
    };
    const parsed = batchCreateSchema.safeParse(raw);
    if (!parsed.success) {
      setErrors(Object.fromEntries(parsed.error.issues.map((i) => [String(i.path[0]), [i.message]])));
      return;
    }
    setErrors({});
    try {
      const b = await create.mutateAsync(parsed.data);
      onDone();
      navigate(paths.bath(b.id));
    } catch (err) {
      if (err instanceof ApiError && err.details?.fields) setErrors(err.details.fields);
    }
  }
  const formError = create.error instanceof ApiError && !create.error.details?.fields ? create.error.message : null;
  return (
    <form onSubmit={onSubmit} noValidate className="mb-8 grid gap-3 sm:grid-cols-3 rounded-md border border-rule bg-sheet p-4" aria-label="New bath">
      <Field label="Code" name="code" placeholder="MB-12" error={errors.code} />
      <Field label="Name" name="name" error={errors.name} className="sm:col-span-2" />
      <label className="text-sm font-medium">Kind
        <select name="kind" className="mt-1 block w-full rounded-md border border-rule-strong bg-sheet px-3 py-2 font-normal">
          {BATCH_KINDS.map((k) => <option key={k} value={k}>{k.replace('-', ' ')}</option>)}
        </select>
      </label>
      <Field label="Volume" unit="mL" name="volumeMl" type="number" step="any" min="0" error={errors.volumeMl} />
      <Field label="Made on" name="madeOn" type="date" defaultValue={new Date().toISOString().slice(0, 10)} error={errors.madeOn} />
      <Field label="Check by" name="checkBy" type="date" error={errors.checkBy} hint="Print pastes spoil within days [common practice]" />
      <Field label="Thickener" unit="g/L" name="thickenerGPerL" type="number" step="any" min="0" error={errors.thickenerGPerL} />
      <Field label="pH" name="ph" type="number" step="0.1" min="0" max="14" error={errors.ph} />
      <Field label="Uptake per use (estimate)" unit="%" name="uptakePct" type="number" step="any" min="0" max="100" defaultValue={10} error={errors.uptakePerUse} />
      <label className="text-sm font-medium">Dilution of
        <select name="parentId" className="mt-1 block w-full rounded-md border border-rule-strong bg-sheet px-3 py-2 font-normal">
          <option value="">— none —</option>
          {parents.data?.items.map((p) => <option key={p.id} value={p.id}>{p.code} · {p.name}</option>)}
        </select>
      </label>
      <IngredientRows rows={rows} onChange={setRows} error={errors.ingredients} />
      <Field label="Notes" name="notes" className="sm:col-span-2" error={errors.notes} />
      {formError ? <p role="alert" className="sm:col-span-3 rounded-md bg-danger-tint px-3 py-2 text-sm text-danger">{formError}</p> : null}
      <div className="sm:col-span-3"><Button type="submit" disabled={create.isPending}>Create bath</Button></div>
    </form>
  );
}
