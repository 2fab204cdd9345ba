import { useState, type FormEvent } from 'react';
import { useNavigate } from 'react-router-dom';
import { BATCH_KINDS, batchCreateFormSchema } from '../../../../shared/schemas/batches';
import { Button } from '../../../components/Button';
import { Field } from '../../../components/form/Field';
import { FormAlert } from '../../../components/form/FormAlert';
import { Select } from '../../../components/form/Select';
import { formMessage, useFormErrors } from '../../../lib/form';
import { paths } from '../../../paths';
import { useBatches, useCreateBatch } from '../api';
import { IngredientRows, ingredientsFrom } from './IngredientRows';

const num = (v: FormDataEntryValue | null) => (v === null || v === '' ? undefined : Number(v));

/** A new bath or a dilution of an existing one (a child batch). */
export function NewBathForm({ onDone }: { onDone: () => void }) {
  const create = useCreateBatch();
  const parents = useBatches({ status: 'active' });
  const navigate = useNavigate();
  const { formRef, errors, check, fromServer } = useFormErrors();
  const [rows, setRows] = useState([{ key: '', grams: '' }]);

  async function onSubmit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const f = new FormData(e.currentTarget);
    const raw = {
      code: f.get('code'),
      kind: f.get('kind'),
      name: f.get('name'),
      volumeMl: num(f.get('volumeMl')),
      madeOn: f.get('madeOn'),
      checkBy: f.get('checkBy') || null,
      thickenerGPerL: num(f.get('thickenerGPerL')) ?? null,
      ph: num(f.get('ph')) ?? null,
      ingredients: ingredientsFrom(rows),
      uptakePerUse: num(f.get('uptakePerUse')) ?? null,
      parentId: num(f.get('parentId')) ?? null,
      notes: f.get('notes') || null,
    };
    const data = check(batchCreateFormSchema, raw);
    if (!data) return;
    try {
      const b = await create.mutateAsync(data);
      onDone();
      navigate(paths.bath(b.id));
    } catch (err) {
      fromServer(err);
    }
  }
  return (
    <form
      ref={formRef}
      onSubmit={onSubmit}
      noValidate
      className="mb-8 grid gap-3 sm:grid-cols-3 rounded-md border border-rule bg-sheet p-4"
      aria-label="New bath"
    >
      <Field label="Code" name="code" placeholder="MB-12" error={errors.code} />
      <Field label="Name" name="name" error={errors.name} className="sm:col-span-2" />
      <Select
        label="Kind"
        name="kind"
        options={BATCH_KINDS.map((k) => ({ value: k, label: k.replace('-', ' ') }))}
        error={errors.kind}
      />
      <Field label="Volume" unit="mL" name="volumeMl" type="number" step="any" min="0" error={errors.volumeMl} />
      <Field
        label="Made on"
        name="madeOn"
        type="date"
        defaultValue={new Date().toISOString().slice(0, 10)}
        error={errors.madeOn}
      />
      <Field
        label="Check by"
        name="checkBy"
        type="date"
        error={errors.checkBy}
        hint="Print pastes spoil within days [common practice]"
      />
      <Field
        label="Thickener"
        unit="g/L"
        name="thickenerGPerL"
        type="number"
        step="any"
        min="0"
        error={errors.thickenerGPerL}
      />
      <Field label="pH" name="ph" type="number" step="0.1" min="0" max="14" error={errors.ph} />
      <Field
        label="Uptake per use (estimate)"
        unit="%"
        name="uptakePerUse"
        type="number"
        step="any"
        min="0"
        max="100"
        placeholder="by kind"
        error={errors.uptakePerUse}
        hint="A percentage: the share of strength one use of a standard load takes (the made volume at 1:20, e.g. 100 g fibre for 2 L), scaled by the fibre mass of each use. Empty: 10 % for a bath, 0 for a stock or print paste, which are only drawn from."
      />
      <Select
        label="Dilution of"
        name="parentId"
        options={[
          { value: '', label: '— none —' },
          ...(parents.data?.items ?? []).map((p) => ({ value: String(p.id), label: `${p.code} · ${p.name}` })),
        ]}
        error={errors.parentId}
      />
      <IngredientRows rows={rows} onChange={setRows} errors={errors} />
      <Field label="Notes" name="notes" className="sm:col-span-2" error={errors.notes} />
      <div className="sm:col-span-3">
        <FormAlert message={formMessage(create.error) ?? errors._?.join(' ') ?? null} />
      </div>
      <div className="sm:col-span-3">
        <Button type="submit" disabled={create.isPending}>
          Create bath
        </Button>
      </div>
    </form>
  );
}
