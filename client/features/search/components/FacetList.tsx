import type { FacetCounts, FacetName } from '../../../../shared/schemas/search';

const TITLES: Record<FacetName, string> = {
  dyestuff: 'Dyestuff',
  historicalMordant: 'Historical mordant',
  modernMordant: 'Modern mordant (trials)',
  fibre: 'Fibre',
  technique: 'Technique',
  century: 'Century',
  place: 'Place',
  status: 'Status',
  identifiedBy: 'Identified by (analysis)',
};
const ORDER: FacetName[] = [
  'dyestuff',
  'historicalMordant',
  'identifiedBy',
  'modernMordant',
  'fibre',
  'technique',
  'century',
  'place',
  'status',
];

/** Facet checkboxes with their counts; counts already combine the text query and the other choices. */
export function FacetList({
  facets,
  chosen,
  onToggle,
  onClear,
}: {
  facets: FacetCounts | undefined;
  chosen: (facet: FacetName) => string[];
  onToggle: (facet: FacetName, value: string) => void;
  onClear: () => void;
}) {
  const any = ORDER.some((f) => chosen(f).length);
  return (
    <div aria-label="Facets" role="region">
      <div className="flex items-center justify-between mb-2">
        <h2 className="text-sm font-semibold uppercase tracking-wide text-ink-soft">Narrow by</h2>
        <button
          type="button"
          className="text-sm text-action hover:underline disabled:opacity-50"
          onClick={onClear}
          disabled={!any}
        >
          Clear all
        </button>
      </div>
      {ORDER.map((f) => {
        const values = facets?.[f] ?? [];
        const picked = chosen(f);
        if (!values.length && !picked.length) return null;
        return (
          <fieldset key={f} className="mb-4">
            <legend className="text-sm font-medium text-ink mb-1">{TITLES[f]}</legend>
            <ul className="space-y-0.5 max-h-48 overflow-y-auto">
              {values.slice(0, 30).map((v) => (
                <li key={v.value}>
                  <label className="flex items-center gap-2 text-sm cursor-pointer">
                    <input type="checkbox" checked={picked.includes(v.value)} onChange={() => onToggle(f, v.value)} />
                    <span className="flex-1">{v.label}</span>
                    <span className="num text-ink-faint">{v.count}</span>
                  </label>
                </li>
              ))}
            </ul>
          </fieldset>
        );
      })}
    </div>
  );
}
