import { type FormEvent } from 'react';
import { dyestuffCreateSchema } from '../../../../shared/schemas/reference';
import { Button } from '../../../components/Button';
import { Field } from '../../../components/form/Field';
import { FormAlert } from '../../../components/form/FormAlert';
import { formMessage, useFormErrors } from '../../../lib/form';
import { useCreateDyestuff } from '../api';

/** An admin adds a dyestuff, checked with the shared schema. */
export function AddDyestuffForm() {
  const create = useCreateDyestuff();
  const { formRef, errors, check, fromServer } = useFormErrors();

  async function onSubmit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const form = e.currentTarget;
    const data = check(dyestuffCreateSchema, Object.fromEntries(new FormData(form)));
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
      aria-labelledby="add-dyestuff-heading"
    >
      <h3 id="add-dyestuff-heading" className="text-lg font-semibold">
        Add dyestuff
      </h3>
      <div className="grid gap-3 sm:grid-cols-3">
        <Field label="Name" name="name" required error={errors.name} />
        <Field label="C.I. generic name" name="ciName" error={errors.ciName} hint="e.g. C.I. Natural Red 8" />
        <Field label="Dye class" name="dyeClass" error={errors.dyeClass} hint="e.g. anthraquinone" />
        <Field label="Principal colorants" name="colorants" error={errors.colorants} />
        <Field label="Species" name="species" error={errors.species} />
        <Field label="Where the data come from" name="source" required error={errors.source} />
      </div>
      <Button type="submit" disabled={create.isPending}>
        {create.isPending ? 'Adding…' : 'Add dyestuff'}
      </Button>
      <FormAlert message={formMessage(create.error)} />
      {create.data && !create.error ? (
        <FormAlert tone="ok" message={`${create.data.name} added to the reference.`} />
      ) : null}
    </form>
  );
}
