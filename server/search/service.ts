import type { Actor } from '../policies/index.ts';
import { can } from '../policies/index.ts';
import type {
  FacetCounts,
  FacetName,
  SearchFilters,
  SearchItem,
  SearchQuery,
  SearchResponse,
  ShadeItem,
  ShadeQuery,
  ShadeResponse,
} from '../../shared/schemas/search.ts';
import { IMAGE_ESTIMATE_CONDITIONS } from '../../shared/colour/conditions.ts';
import { hexToLab, labToHex } from '../../shared/search/lab.ts';
import { audienceOf, cachedAnswer } from './answer-cache.ts';
import { searchEngine } from './engine.ts';
import { countMatched, FACETS, type FacetTable, facetTableFor, norm } from './facet-table.ts';
import { highlights } from './highlight.ts';
import { selectTop } from './top.ts';

/**
 * Text, facets and shade combined. Visitors only ever see published pieces;
 * signed-in users see drafts too; soft-deleted pieces are not in the index.
 * Trial text counts for its piece only for users who may read trials.
 */
// Pieces carry several of these at once: choosing two narrows (AND). The rest hold one value per piece
// (a century is one of a few): choosing two widens (OR), and their counts ignore their own choice.
const NARROWING = new Set<FacetName>([
  'dyestuff',
  'historicalMordant',
  'modernMordant',
  'fibre',
  'technique',
  'identifiedBy',
]);

type Selected = Partial<Record<FacetName, Set<string>>> & { mordant?: Set<string> };

function selected(f: SearchFilters): Selected {
  const s: Selected = {};
  const put = (k: FacetName | 'mordant', v?: Array<string | number>) => {
    if (v?.length) s[k] = new Set(v.map((x) => norm(String(x))));
  };
  put('dyestuff', f.dyestuff);
  put('historicalMordant', f.historicalMordant);
  put('modernMordant', f.modernMordant);
  put('fibre', f.fibre);
  put('technique', f.technique);
  put('century', f.century);
  put('place', f.place);
  put('status', f.status);
  put('identifiedBy', f.identifiedBy);
  put('mordant', f.mordant);
  return s;
}

const facetTable = (): FacetTable => facetTableFor(searchEngine.text, searchEngine.version);

/** The chosen facet values as interned codes: per facet, the codes wanted (-1 for a value no piece has). */
type Compiled = { facets: Array<{ fi: number; narrowing: boolean; want: number[] }>; mordant: Array<[number, number]> };
// Modern mordants come from trials, so for a role that may not read trials they neither count nor match.
function compile(sel: Selected, t: FacetTable, trials: boolean): Compiled {
  const code = (fi: number, v: string) => {
    const i = t.intern[fi].get(v);
    return i === undefined ? -1 : (fi << 24) | i;
  };
  const facets: Compiled['facets'] = [];
  FACETS.forEach((f, fi) => {
    const want = sel[f];
    if (want)
      facets.push({
        fi,
        narrowing: NARROWING.has(f),
        want: [...want].map((v) => (f === 'modernMordant' && !trials ? -1 : code(fi, v))),
      });
  });
  const h = FACETS.indexOf('historicalMordant');
  const m = FACETS.indexOf('modernMordant');
  const mordant = [...(sel.mordant ?? [])].map((v): [number, number] => [code(h, v), trials ? code(m, v) : -1]);
  return { facets, mordant };
}

// Plain functions, not closures made per call: passes() runs once per hit.
function holds(vals: Int32Array, from: number, to: number, v: number): boolean {
  if (v < 0) return false;
  for (let k = from; k < to; k++) if (vals[k] === v) return true;
  return false;
}

function passes(id: number, c: Compiled, t: FacetTable, skip = -1): boolean {
  const { vals } = t;
  const from = t.start[id];
  const to = t.start[id + 1];
  for (const { fi, narrowing, want } of c.facets) {
    if (fi === skip) continue;
    if (narrowing) {
      for (const w of want) if (!holds(vals, from, to, w)) return false;
    } else {
      let any = false;
      for (const w of want) if (holds(vals, from, to, w)) any = true;
      if (!any) return false;
    }
  }
  for (const [h, m] of c.mordant) if (!holds(vals, from, to, h) && !holds(vals, from, to, m)) return false;
  return true;
}

// Id lists reused across requests rather than allocated per query: a search runs synchronously from the
// text index to the response once the engine has settled, so no two requests share them at once.
let visibleBuf = new Int32Array(0);
let matchedBuf = new Int32Array(0);

/** Piece ids passing visibility and text (`textMatched`, for facet counts) and also every filter (`matched`). */
// Fills the module's reused buffers and the text index's scratch: the caller reads the answer before any `await` (README.md, invariant 1).
function candidates(actor: Actor, f: SearchFilters) {
  const t = facetTable();
  const trials = can(actor, 'trial:read');
  const hits = f.q ? searchEngine.text.search(f.q, trials) : null;
  const drafts = can(actor, 'piece:list-drafts');
  const source = hits ? hits.ids : t.all;
  const c = compile(selected(f), t, trials);
  const filtered = c.facets.length > 0 || c.mordant.length > 0;
  if (visibleBuf.length < source.length) {
    visibleBuf = new Int32Array(source.length + 1024);
    matchedBuf = new Int32Array(source.length + 1024);
  }
  const { exists, published } = t;
  let nv = 0;
  let nm = 0;
  for (let i = 0; i < source.length; i++) {
    const id = source[i];
    if (id >= exists.length || !exists[id] || !(drafts || published[id])) continue;
    visibleBuf[nv++] = id;
    if (filtered && passes(id, c, t)) matchedBuf[nm++] = id;
  }
  const textMatched = visibleBuf.subarray(0, nv);
  return { textMatched, matched: filtered ? matchedBuf.subarray(0, nm) : textMatched, hits, c, filtered, trials };
}

function facetCounts(
  textMatched: Int32Array,
  matched: Int32Array,
  c: Compiled,
  drafts: boolean,
  trials: boolean,
): FacetCounts {
  const t = facetTable();
  // A widening (OR) facet's own counts ignore its own choice.
  const ownRule = FACETS.map((f, fi) => !NARROWING.has(f) && c.facets.some((x) => x.fi === fi));
  let counts: Int32Array;
  // Usually every facet counts the pieces that pass every filter: one pass over their values.
  if (!ownRule.some(Boolean)) counts = countMatched(matched, t, drafts);
  else {
    counts = new Int32Array(t.base[FACETS.length]);
    const { start, vals, dense } = t;
    for (const id of textMatched) {
      const all = passes(id, c, t);
      for (let k = start[id], end = start[id + 1]; k < end; k++) {
        const fi = vals[k] >>> 24;
        if (ownRule[fi] ? !passes(id, c, t, fi) : !all) continue;
        counts[dense[k]]++;
      }
    }
  }
  const out = {} as FacetCounts;
  FACETS.forEach((f, fi) => {
    if (f === 'modernMordant' && !trials) {
      out[f] = [];
      return;
    }
    const rows: Array<{ value: string; label: string; count: number }> = [];
    t.keys[fi].forEach((key, i) => {
      const n = counts[t.base[fi] + i];
      if (n) rows.push({ value: f === 'century' ? key : t.labels[fi][i], label: t.labels[fi][i], count: n });
    });
    out[f] = rows
      .sort((x, y) =>
        f === 'century' ? Number(x.value) - Number(y.value) : y.count - x.count || x.label.localeCompare(y.label),
      )
      .slice(0, 100);
  });
  return out;
}

/**
 * A search's answer is a function of the indexes' state (`searchEngine.generation`), the query and what the actor may
 * see, so equal questions asked between two changes of the indexes share one answer (answer-cache.ts).
 */
export async function runSearch({ actor, input }: { actor: Actor; input: SearchQuery }): Promise<SearchResponse> {
  await searchEngine.settled();
  return cachedAnswer('search', audienceOf(actor), input, () => computeSearch(actor, input));
}

function computeSearch(actor: Actor, input: SearchQuery): SearchResponse {
  // From here to the answer: no `await`, the matches live in reused buffers (README.md, invariant 1).
  const { textMatched, matched, hits, c, trials } = candidates(actor, input);
  const rank = facetTable().accessionRank;
  const s = hits?.scores;
  // Rank only as far as the page asked for (bounded heap), not the whole match list.
  const before = s
    ? (x: number, y: number) => s[x] > s[y] || (s[x] === s[y] && x < y)
    : (x: number, y: number) => rank[x] < rank[y];
  const ids = selectTop(matched, input.page * input.pageSize, before).slice((input.page - 1) * input.pageSize);
  const page = ids.map((id) => searchEngine.text.byId[id]!);
  const photos = searchEngine.shade.firstPhotoOf(ids);
  const items: SearchItem[] = page.map((d) => {
    const hit = hits?.detail(d.id);
    return {
      id: d.id,
      accessionNumber: d.accessionNumber,
      title: d.title,
      objectName: d.objectName,
      place: d.place,
      dateText: d.dateText,
      status: d.status,
      dyestuffs: d.dyestuffs,
      photoId: photos.get(d.id) ?? null,
      score: hit ? Number(hit.score.toFixed(4)) : null,
      highlights: hit ? highlights(d, hit.terms, hit.fields) : [],
      viaTrials: hit?.viaTrials.filter(Boolean) ?? [],
    };
  });
  return {
    items,
    facets: facetCounts(textMatched, matched, c, can(actor, 'piece:list-drafts'), trials),
    total: matched.length,
    page: input.page,
    pageSize: input.pageSize,
  };
}

// Unfiltered shade queries reuse one allow-list per audience until a piece changes.
const allowCache = new Map<string, { version: number; allow: Uint8Array }>();

function allowList(actor: Actor, f: SearchFilters): Uint8Array {
  const filtered = Boolean(f.q) || Object.keys(selected(f)).length > 0;
  const audience = can(actor, 'piece:list-drafts') ? 'all' : 'published';
  const cached = allowCache.get(audience);
  if (!filtered && cached?.version === searchEngine.version) return cached.allow;
  const ids = candidates(actor, f).matched;
  let max = 0;
  for (const id of ids) if (id > max) max = id;
  const allow = new Uint8Array(max + 1);
  for (const id of ids) allow[id] = 1;
  if (!filtered) allowCache.set(audience, { version: searchEngine.version, allow });
  return allow;
}

export async function runShade({ actor, input }: { actor: Actor; input: ShadeQuery }): Promise<ShadeResponse> {
  await searchEngine.settled();
  return cachedAnswer('shade', audienceOf(actor), input, () => computeShade(actor, input));
}

function computeShade(actor: Actor, input: ShadeQuery): ShadeResponse {
  // From here to the answer: no `await`, the matches live in reused buffers (README.md, invariant 1).
  const lab = input.hex ? hexToLab(input.hex) : { L: input.L!, a: input.a!, b: input.b! };
  const offset = (input.page - 1) * input.limit;
  const res = searchEngine.shade.query({
    ...lab,
    maxDeltaE: input.maxDeltaE,
    limit: input.limit,
    offset,
    allow: allowList(actor, input),
  });
  const facets = shadeFacets(actor, input, lab, res.matched);
  const items: ShadeItem[] = res.items.map((m) => {
    const doc = searchEngine.text.pieces.get(m.pieceId)!;
    return {
      pieceId: m.pieceId,
      accessionNumber: doc.accessionNumber,
      title: doc.title,
      photoId: m.photoId,
      colour: {
        hex: m.hex,
        lab: { L: round(m.L, 2), a: round(m.a, 2), b: round(m.b, 2) },
        share: round(m.share, 4),
        source: 'image-estimate' as const,
        ...IMAGE_ESTIMATE_CONDITIONS,
      },
      deltaE00: round(m.deltaE00, 3),
    };
  });
  const hex = input.hex ? `#${input.hex.replace('#', '').toLowerCase()}` : labToHex(lab);
  return {
    items,
    facets,
    total: res.total,
    page: input.page,
    pageSize: input.limit,
    query: { ...lab, hex, maxDeltaE: input.maxDeltaE },
  };
}

/**
 * With a shade chosen, the facets count the shade's matches: pieces with a colour within the radius that
 * also pass the words and filters. A widening facet's own counts ignore its own choice, so when one is
 * chosen the shade is asked again with only the words applied, for the pieces those counts start from.
 */
function shadeFacets(
  actor: Actor,
  input: ShadeQuery,
  lab: { L: number; a: number; b: number },
  matchedView: Int32Array,
): FacetCounts {
  const t = facetTable();
  const trials = can(actor, 'trial:read');
  const c = compile(selected(input), t, trials);
  // Copied: the second shade query below reuses the buffer `matchedView` points into (README.md, invariant 1).
  const matched = Int32Array.from(matchedView);
  let textMatched = matched;
  if (c.facets.some((x) => !x.narrowing)) {
    const words = searchEngine.shade.query({
      ...lab,
      maxDeltaE: input.maxDeltaE,
      limit: 1,
      offset: 0,
      allow: allowList(actor, { q: input.q }),
    });
    textMatched = Int32Array.from(words.matched);
  }
  return facetCounts(textMatched, matched, c, can(actor, 'piece:list-drafts'), trials);
}

const round = (x: number, d: number) => Number(x.toFixed(d));
