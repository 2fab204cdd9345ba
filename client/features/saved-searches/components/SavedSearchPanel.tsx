import { useState, type FormEvent } from 'react';
import { savedSearchCreateSchema, tidySearchQuery } from '../../../../shared/schemas/saved-search';
import { Button } from '../../../components/Button';
import { Field } from '../../../components/form/Field';
import { useFormErrors } from '../../../lib/form';
import { useSaveSearch, useSavedSearches } from '../api';
import { SavedSearchLinks } from './SavedSearchLinks';

/** On Find: save the search in the address bar under a name, and open or delete saved ones. */
export function SavedSearchPanel({ query }: { query: string }) {
  const list = useSavedSearches();
  const save = useSaveSearch();
  const [name, setName] = useState('');
  const [done, setDone] = useState<string | null>(null);
  const { formRef, errors, check, fromServer } = useFormErrors();
  const current = tidySearchQuery(query);

  async function submit(e: FormEvent) {
    e.preventDefault();
    setDone(null);
    const input = check(savedSearchCreateSchema, { name: name.trim() || undefined, query: current });
    if (!input) return;
    try {
      const res = await save.mutateAsync(input);
      setDone(`Saved as “${res.savedSearch.name}”.`);
      setName('');
    } catch (err) {
      fromServer(err);
    }
  }

  return (
    <section aria-labelledby="saved-searches-h" className="space-y-3" data-testid="saved-searches">
      <h2 id="saved-searches-h" className="text-sm font-semibold">
        Saved searches
      </h2>
      <form ref={formRef} noValidate onSubmit={submit} className="space-y-2">
        <Field
          label="Save this search as"
          placeholder="e.g. madder reds on cotton"
          value={name}
          onChange={(e) => setName(e.target.value)}
          error={errors.name ?? errors.query}
        />
        <Button type="submit" variant="secondary" disabled={save.isPending}>
          Save search
        </Button>
        <p className="text-sm text-ink-soft" aria-live="polite">
          {done}
        </p>
      </form>
      {list.data ? <SavedSearchLinks items={list.data.items} empty="None saved yet." /> : null}
    </section>
  );
}
