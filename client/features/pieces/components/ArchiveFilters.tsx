import type { ListParams } from '../api';
import { useVocabularies } from '../../vocabularies/api';

type Props = { value: ListParams; onChange: (next: ListParams) => void; canSeeDrafts: boolean; canSeeDeleted: boolean };

const select = 'mt-1 block w-full rounded-md border border-rule-strong bg-sheet px-2 py-2 text-sm';

/** Filters of the archive list; every change goes back to page 1. */
export function ArchiveFilters({ value, onChange, canSeeDrafts, canSeeDeleted }: Props) {
  const vocab = useVocabularies().data;
  const set = (k: keyof ListParams, v: string) => onChange({ ...value, [k]: v || undefined, page: 1 });
  return (
    <form role="search" className="grid gap-3 sm:grid-cols-3 lg:grid-cols-6 items-end" onSubmit={(e) => e.preventDefault()}>
      <label className="text-sm font-medium sm:col-span-3 lg:col-span-2">
        Accession number or title
        <input type="search" className={select} value={value.q ?? ''} onChange={(e) => set('q', e.target.value)} placeholder="e.g. 1931.4 or resist" />
      </label>
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
          {vocab?.fibres.map((t) => <option key={t.term}>{t.term}</option>)}
        </select>
      </label>
      <label className="text-sm font-medium">
        Technique
        <select className={select} value={value.technique ?? ''} onChange={(e) => set('technique', e.target.value)}>
          <option value="">any</option>
          {vocab?.techniques.map((t) => <option key={t.term}>{t.term}</option>)}
        </select>
      </label>
      <label className="text-sm font-medium">
        Dyestuff
        <select className={select} value={value.dyestuff ?? ''} onChange={(e) => set('dyestuff', e.target.value)}>
          <option value="">any</option>
          {vocab?.dyestuffs.map((d) => <option key={d.name}>{d.name}</option>)}
        </select>
      </label>
      {canSeeDeleted ? (
        <label className="text-sm flex items-center gap-2 sm:col-span-3 lg:col-span-6">
          <input type="checkbox" checked={value.deleted === 'only'} onChange={(e) => set('deleted', e.target.checked ? 'only' : '')} />
          Show deleted pieces only
        </label>
      ) : null}
    </form>
  );
}
