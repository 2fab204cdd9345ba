import { pieceListQuery } from '../../../../shared/schemas/piece';
import { useFormErrors } from '../../../lib/form';
import type { ListParams } from '../api';
import { useVocabularies } from '../../vocabularies';

type Props = { value: ListParams; onChange: (next: ListParams) => void; canSeeDrafts: boolean; canSeeDeleted: boolean };

const select = 'mt-1 block w-full rounded-md border border-rule-strong bg-sheet px-2 py-2 text-sm';

/** Filters of the archive list; every change goes back to page 1. Each change is checked with the list's shared query schema (the words' length), its message under the field. */
export function ArchiveFilters({ value, onChange, canSeeDrafts, canSeeDeleted }: Props) {
  const vocab = useVocabularies().data;
  const { formRef, errors, check } = useFormErrors();
  const set = (k: keyof ListParams, v: string) => {
    const next = { ...value, [k]: v || undefined, page: 1 };
    // The list follows as typed (the box stays in step with the address bar); a wrong value is said under its field.
    check(pieceListQuery, next);
    onChange(next);
  };
  return (
    <form
      ref={formRef}
      noValidate
      role="search"
      className="grid gap-3 sm:grid-cols-3 lg:grid-cols-6 items-end"
      onSubmit={(e) => {
        e.preventDefault();
        check(pieceListQuery, value);
      }}
    >
      <div className="sm:col-span-3 lg:col-span-2">
        <label className="text-sm font-medium">
          Accession number or title
          <input
            type="search"
            className={errors.q ? select.replace('border-rule-strong', 'border-danger') : select}
            value={value.q ?? ''}
            onChange={(e) => set('q', e.target.value)}
            placeholder="e.g. 1931.4 or resist"
            aria-invalid={errors.q ? true : undefined}
            aria-describedby={errors.q ? 'archive-q-err' : undefined}
          />
        </label>
        {errors.q ? (
          <p id="archive-q-err" className="mt-1 text-sm text-danger">
            {errors.q.join(' ')}
          </p>
        ) : null}
      </div>
      {canSeeDrafts ? (
        <label className="text-sm font-medium">
          Status
          <select className={select} value={value.status ?? ''} onChange={(e) => set('status', e.target.value)}>
            <option value="">any</option>
            <option value="draft">draft</option>
            <option value="published">published</option>
          </select>
        </label>
      ) : null}
      <label className="text-sm font-medium">
        Fibre
        <select className={select} value={value.fibre ?? ''} onChange={(e) => set('fibre', e.target.value)}>
          <option value="">any</option>
          {vocab?.fibres.map((t) => (
            <option key={t.term}>{t.term}</option>
          ))}
        </select>
      </label>
      <label className="text-sm font-medium">
        Technique
        <select className={select} value={value.technique ?? ''} onChange={(e) => set('technique', e.target.value)}>
          <option value="">any</option>
          {vocab?.techniques.map((t) => (
            <option key={t.term}>{t.term}</option>
          ))}
        </select>
      </label>
      <label className="text-sm font-medium">
        Dyestuff
        <select className={select} value={value.dyestuff ?? ''} onChange={(e) => set('dyestuff', e.target.value)}>
          <option value="">any</option>
          {vocab?.dyestuffs.map((d) => (
            <option key={d.name}>{d.name}</option>
          ))}
        </select>
      </label>
      {canSeeDeleted ? (
        <label className="text-sm flex items-center gap-2 sm:col-span-3 lg:col-span-6">
          <input
            type="checkbox"
            checked={value.deleted === 'only'}
            onChange={(e) => set('deleted', e.target.checked ? 'only' : '')}
          />
          Show deleted pieces only
        </label>
      ) : null}
    </form>
  );
}
