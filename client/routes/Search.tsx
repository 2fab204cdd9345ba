import { useMemo, useRef, useState } from 'react';
import { useSearchParams } from 'react-router-dom';
import { searchFiltersSchema, shadeQuerySchema, type FacetName } from '../../shared/schemas/search';
import { errorsFor, useFormErrors } from '../lib/form';
import { Button } from '../components/Button';
import { Page } from '../components/Page';
import { ApiError } from '../lib/http';
import { shadeExportQuery, useSearch, useShade, type SearchParams } from '../features/search/api';
import { DownloadLink } from '../features/export/components/DownloadLink';
import { exportUrls } from '../features/export/urls';
import { AbPlot } from '../features/search/components/AbPlot';
import { ColourChooser, type ShadeChoice } from '../features/search/components/ColourChooser';
import { FacetList } from '../features/search/components/FacetList';
import { ShadeResults } from '../features/search/components/ShadeResults';
import { TextResults } from '../features/search/components/TextResults';
import { useMe } from '../features/auth';
import { SavedSearchPanel } from '../features/saved-searches';

const FACETS: FacetName[] = [
  'dyestuff',
  'historicalMordant',
  'modernMordant',
  'fibre',
  'technique',
  'century',
  'place',
  'status',
];
const SHADE = ['hex', 'L', 'a', 'b', 'maxDeltaE'];

/** Find: words, facets and shade together; every choice lives in the URL so it can be shared or linked. */
export function Search() {
  const [url, setUrl] = useSearchParams();
  const params: SearchParams = {};
  for (const k of new Set(url.keys())) params[k] = url.getAll(k).length > 1 ? url.getAll(k) : (url.get(k) ?? '');
  // Any shade field, even only a radius, is a shade query: an incomplete one is answered with what is missing.
  const hasShade = SHADE.some((k) => url.get(k));
  // With a shade chosen the shade answer carries the list and the facet counts; the words-only search is not needed.
  const text = useSearch(params, !hasShade);
  // The shade in the URL is checked with the shared schema first: a wrong one is not sent, and its messages sit under its fields.
  const urlKey = url.toString();
  const shadeInvalid = useMemo(() => {
    if (!hasShade) return null;
    return errorsFor(shadeQuerySchema, params);
    // eslint-disable-next-line react-hooks/exhaustive-deps -- params is rebuilt from the URL on every render
  }, [urlKey, hasShade]);
  const shade = useShade(params, hasShade && !shadeInvalid);
  const signedIn = Boolean(useMe().data);
  const [q, setQ] = useState(url.get('q') ?? '');
  const words = useFormErrors();
  // On a phone the shade and facet choices fold into a panel after the results; from md up they are a sidebar.
  const [narrowOpen, setNarrowOpen] = useState(false);
  const narrowRef = useRef<HTMLElement>(null);
  const chosenCount = FACETS.reduce((n, f) => n + url.getAll(f).length, 0) + (hasShade ? 1 : 0);

  const update = (fn: (u: URLSearchParams) => void) => {
    const next = new URLSearchParams(url);
    fn(next);
    next.delete('page');
    setUrl(next);
  };
  const chosen = (f: FacetName) => url.getAll(f);
  const toggle = (f: FacetName, v: string) =>
    update((u) => {
      const have = u.getAll(f);
      u.delete(f);
      for (const x of have.includes(v) ? have.filter((y) => y !== v) : [...have, v]) u.append(f, x);
    });
  const clearFacets = () => update((u) => FACETS.forEach((f) => u.delete(f)));
  const setShade = (c: ShadeChoice) =>
    update((u) => {
      SHADE.forEach((k) => u.delete(k));
      for (const [k, v] of Object.entries(c)) if (v !== undefined && v !== '') u.set(k, v);
    });
  const clearShade = () => update((u) => SHADE.forEach((k) => u.delete(k)));
  const page = Number(url.get('page') ?? 1);
  const goPage = (p: number) => {
    const next = new URLSearchParams(url);
    next.set('page', String(p));
    setUrl(next);
  };

  const shadeError = shadeInvalid
    ? new ApiError(400, 'invalid_input', 'Some fields are not valid.', { fields: shadeInvalid })
    : shade.error instanceof ApiError
      ? shade.error
      : null;
  const choice: ShadeChoice | null = hasShade
    ? {
        hex: url.get('hex') ?? undefined,
        L: url.get('L') ?? undefined,
        a: url.get('a') ?? undefined,
        b: url.get('b') ?? undefined,
        maxDeltaE: url.get('maxDeltaE') ?? '5',
      }
    : null;
  // A refused shade shows its errors and no results: the previous query's results would answer a different question.
  const shadeData = shadeError ? undefined : shade.data;
  const list = hasShade ? shadeData : text.data;
  const total = list?.total ?? 0;
  const pageSize = list?.pageSize ?? 20;
  const pages = Math.max(1, Math.ceil(total / pageSize));

  return (
    <Page
      title="Find"
      lead="Search the archive by words, by dyestuff and mordant, and by shade within a CIEDE2000 radius."
    >
      <form
        ref={words.formRef}
        noValidate
        role="search"
        className="mb-6"
        onSubmit={(e) => {
          e.preventDefault();
          // The words are checked with the search's shared schema (their length) before they reach the address bar.
          if (!words.check(searchFiltersSchema.pick({ q: true }), { q: q.trim() || undefined })) return;
          update((u) => (q.trim() ? u.set('q', q.trim()) : u.delete('q')));
        }}
      >
        <div className="flex gap-2">
          <label className="sr-only" htmlFor="search-q">
            Words
          </label>
          <input
            id="search-q"
            type="search"
            value={q}
            onChange={(e) => setQ(e.target.value)}
            placeholder="Accession number, title, dyestuff, mordant, place, trial code…"
            aria-invalid={words.errors.q ? true : undefined}
            aria-describedby={words.errors.q ? 'search-q-err' : undefined}
            className={`min-w-0 flex-1 rounded-md border bg-sheet px-3 py-2 ${words.errors.q ? 'border-danger' : 'border-rule-strong'}`}
          />
          <Button type="submit">Search</Button>
        </div>
        {words.errors.q ? (
          <p id="search-q-err" className="mt-1 text-sm text-danger">
            {words.errors.q.join(' ')}
          </p>
        ) : null}
      </form>
      <div className="grid gap-6 md:grid-cols-[16rem_1fr]">
        <aside
          ref={narrowRef}
          aria-label="Shade and facets"
          className="order-last md:order-none min-w-0"
          data-testid="narrow-panel"
        >
          <button
            type="button"
            className="md:hidden w-full rounded-md border border-rule-strong bg-sheet px-3 py-2 text-left text-sm font-medium"
            aria-expanded={narrowOpen}
            aria-controls="narrow-choices"
            onClick={() => setNarrowOpen((o) => !o)}
          >
            {narrowOpen ? '▾' : '▸'} Narrow by shade and facets{chosenCount ? ` (${chosenCount} chosen)` : ''}
          </button>
          <div id="narrow-choices" className={`${narrowOpen ? 'block' : 'hidden'} md:block mt-4 md:mt-0 space-y-6`}>
            <ColourChooser
              value={choice}
              errors={shadeError?.details?.fields}
              onSearch={setShade}
              onClear={clearShade}
            />
            <FacetList
              facets={hasShade ? shadeData?.facets : text.data?.facets}
              chosen={chosen}
              onToggle={toggle}
              onClear={clearFacets}
            />
            {signedIn ? <SavedSearchPanel query={urlKey} /> : null}
          </div>
        </aside>
        <section
          aria-live="polite"
          aria-busy={text.isFetching || shade.isFetching}
          className="min-w-0"
          data-testid="search-results"
        >
          <button
            type="button"
            className="md:hidden mb-3 text-sm text-action underline"
            onClick={() => {
              setNarrowOpen(true);
              narrowRef.current?.scrollIntoView({ block: 'start' });
            }}
          >
            Narrow by shade and facets{chosenCount ? ` (${chosenCount} chosen)` : ''} ↓
          </button>
          {/* Field errors sit under the shade's fields; only a refusal about no field is said here. */}
          {shadeError && !shadeError.details?.fields ? (
            <p className="text-danger text-sm mb-2">{shadeError.message}</p>
          ) : null}
          {text.error && !hasShade ? <p className="text-danger text-sm mb-2">{text.error.message}</p> : null}
          <p className="text-sm text-ink-soft mb-3" data-testid="result-count">
            {hasShade && shadeError
              ? 'No search: correct the shade.'
              : list
                ? `${total} ${total === 1 ? 'piece' : 'pieces'}${hasShade ? ` within ΔE00 ${shadeData?.query.maxDeltaE} of ${shadeData?.query.hex}` : ''}`
                : 'Searching…'}
          </p>
          {hasShade && shadeData ? (
            <div className="space-y-4">
              {shadeData.items.length ? <AbPlot items={shadeData.items} query={shadeData.query} /> : null}
              {shadeData.items.length ? (
                <DownloadLink
                  href={exportUrls.shadeCsv(shadeExportQuery(params))}
                  hint="Every match of this shade search, ranked by ΔE00, with L*a*b* (image estimate, D65/2°), hex and share"
                >
                  Export matches (CSV)
                </DownloadLink>
              ) : null}
              <ShadeResults items={shadeData.items} />
            </div>
          ) : !hasShade && text.data ? (
            <TextResults items={text.data.items} />
          ) : null}
          {pages > 1 ? (
            <nav aria-label="Pages" className="mt-4 flex items-center gap-3 text-sm">
              <Button variant="secondary" disabled={page <= 1} onClick={() => goPage(page - 1)}>
                Previous
              </Button>
              <span className="num">
                Page {page} of {pages}
              </span>
              <Button variant="secondary" disabled={page >= pages} onClick={() => goPage(page + 1)}>
                Next
              </Button>
            </nav>
          ) : null}
        </section>
      </div>
    </Page>
  );
}
