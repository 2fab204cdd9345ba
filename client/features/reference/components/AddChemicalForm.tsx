import { type FormEvent } from 'react';
import {
  CHEMICAL_ROLES,
  CHEMICAL_STATUSES,
  chemicalCreateSchema,
  HAZARD_BASES,
  HAZARD_BASIS_LABELS,
  SIGNAL_WORDS,
} from '../../../../shared/schemas/reference';
import { Button } from '../../../components/Button';
import { Field } from '../../../components/form/Field';
import { FormAlert } from '../../../components/form/FormAlert';
import { Select } from '../../../components/form/Select';
import { formMessage, useFormErrors } from '../../../lib/form';
import { useCreateChemical } from '../api';
import { TextArea } from '../../../components/form/TextArea';

const options = (values: readonly string[]) => values.map((v) => ({ value: v, label: v.replace('-', ' ') }));

/** An admin adds a chemical: checked with the shared schema, a formula fault shown beside the formula with its position. */
export function AddChemicalForm() {
  const create = useCreateChemical();
  const { formRef, errors, check, fromServer, under } = useFormErrors();

  async function onSubmit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const form = e.currentTarget;
    const raw = Object.fromEntries(new FormData(form)) as Record<string, string>;
    const hStatements = (raw.hStatements ?? '')
      .split('\n')
      .map((l) => l.trim())
      .filter(Boolean);
    const data = check(chemicalCreateSchema, { ...raw, hStatements });
    if (!data) return;
    try {
      await create.mutateAsync(data);
      form.reset();
    } catch (err) {
      fromServer(err);
    }
  }

  return (
    <form
      ref={formRef}
      onSubmit={onSubmit}
      noValidate
      className="rounded-lg border border-rule bg-sheet p-4 space-y-3"
      aria-labelledby="add-chemical-heading"
    >
      <h3 id="add-chemical-heading" className="text-lg font-semibold">
        Add chemical
      </h3>
      <div className="grid gap-3 sm:grid-cols-3">
        <Field label="Name" name="name" required error={errors.name} />
        <Select label="Role" name="role" defaultValue="mordant" options={options(CHEMICAL_ROLES)} error={errors.role} />
        <Select
          label="Status"
          name="status"
          defaultValue="permitted"
          options={options(CHEMICAL_STATUSES)}
          error={errors.status}
        />
        <Field
          label="Formula"
          name="formula"
          error={errors.formula}
          hint="e.g. KAl(SO4)2·12H2O, Pb(CH3COO)2.3H2O, CaSO4·½H2O or Al2(SO4)3·14.3H2O; leave empty for gums and starches"
          className="font-mono"
        />
        <Field label="Metal" name="metal" error={errors.metal} hint="element symbol, e.g. Al; empty for none" />
        <Field label="Where the data come from" name="source" required error={errors.source} />
      </div>
      <fieldset className="space-y-3">
        <legend className="text-sm font-semibold">Hazard data</legend>
        <div className="grid gap-3 sm:grid-cols-3">
          <Select
            label="Signal word"
            name="signalWord"
            defaultValue=""
            options={[{ value: '', label: 'none' }, ...options(SIGNAL_WORDS)]}
            error={errors.signalWord}
          />
          <Select
            label="Hazard data from"
            name="hazardBasis"
            defaultValue="supplier"
            options={HAZARD_BASES.map((b) => ({ value: b, label: HAZARD_BASIS_LABELS[b] }))}
            error={errors.hazardBasis}
          />
          <Field
            label="Source of the hazard data"
            name="hazardSource"
            error={errors.hazardSource}
            hint="e.g. the Annex VI index number or the supplier's SDS and its date"
          />
        </div>
        <TextArea label="H statements, one a line" name="hStatements" rows={3} error={under('hStatements')} />
        <div className="grid gap-3 sm:grid-cols-2">
          <TextArea label="Caution" name="caution" rows={2} error={errors.caution} />
          <Field label="Protection" name="ppe" error={errors.ppe} />
        </div>
      </fieldset>
      <Button type="submit" disabled={create.isPending}>
        {create.isPending ? 'Adding…' : 'Add chemical'}
      </Button>
      <FormAlert message={formMessage(create.error)} />
      {create.data && !create.error ? (
        <FormAlert tone="ok" message={`${create.data.name} added to the reference.`} />
      ) : null}
    </form>
  );
}
