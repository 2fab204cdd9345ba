import { deltaE00Kernel, K_A, K_B, K_C, K_L, K_OUT, kernelBlock } from './ciede2000.ts';
import { boundQuery, chromaHueTerms, lightnessTerms, lowerBound, type Terms, upperBound } from './box-bound.ts';
import { shadeBox } from './shade-bounds.ts';
import { selectTop } from './top.ts';

/**
 * In-memory shade index over palette colours. Colours sit in flat typed arrays
 * counting-sorted by a 1-unit L*, a*, b* grid. A query takes the conservative
 * box of shade-bounds.ts, walks its a*b* rectangles down to single columns and
 * then each column's L* cells, skipping whatever box-bound.ts proves is beyond
 * the radius. Each piece keeps its best colour (smallest ΔE00, then largest
 * share); only the page asked for is ranked exactly:
 * - a colour is scored (exact CIEDE2000) only if its piece has not matched yet,
 *   or if its lower bound could still beat the piece's best and reach the page;
 * - in a cell wholly within the radius (its upper bound says so), a colour of a
 *   piece not yet matched whose lower bound already keeps it off the page just
 *   counts, unscored.
 * So a query with 17 000 matching pieces neither scores every colour near it
 * nor sorts every match. Per-piece state is one interleaved typed array (the
 * scan's random accesses are the cost), and each colour carries its piece id.
 * New colours go to a small unsorted tail that is scanned linearly and folded
 * into the grid when it grows; removed colours are tombstoned.
 */
export type ShadeRow = { id: number; photoId: number; L: number; a: number; b: number; hex: string; share: number };
export type ShadeMatch = {
  pieceId: number;
  photoId: number;
  colourId: number;
  L: number;
  a: number;
  b: number;
  hex: string;
  share: number;
  deltaE00: number;
};
export type ShadeQuery = {
  L: number;
  a: number;
  b: number;
  maxDeltaE: number;
  limit: number;
  offset?: number;
  allow?: Uint8Array | null;
  /** Skip the prefilter and compute ΔE00 for every colour: the brute-force scan the benchmark compares against. */
  scanAll?: boolean;
};

// 1-unit cells: the smaller the cells, the fewer colours sit in cells straddling the region's edge (where every
// colour needs an exact ΔE00); the walk's bounds are per a*b* column and per L* slice, so small cells cost little.
const CELL_L = 1;
const CELL_AB = 1;
const L_MIN = 0;
const NL = 100;
const AB_MIN = -128;
const NAB = 256;
const NCELLS = NL * NAB * NAB;
const TAIL_LIMIT = 20_000;
// The ellipsoid test is done in floating point; this slack keeps points on its surface.
const ELLIPSOID_SLACK = 1 + 1e-9;
// The ΔE00 lower bound r·√e2 is shrunk by a hair for floating-point rounding before it is trusted to skip a colour.
const LB_SHRINK = 1 - 1e-9;

/** Distance from v to grid cells i0..i1 of n cells starting at min (0 inside them); the clamped edge cells reach to ±∞. */
function span(v: number, min: number, cell: number, i0: number, i1: number, n: number) {
  const lo = min + i0 * cell;
  const hi = min + (i1 + 1) * cell;
  if (v < lo) return i0 === 0 ? 0 : lo - v;
  if (v > hi) return i1 === n - 1 ? 0 : v - hi;
  return 0;
}

const clampIdx = (v: number, n: number) => (v < 0 ? 0 : v >= n ? n - 1 : v);
const lIdx = (L: number) => clampIdx(Math.floor((L - L_MIN) / CELL_L), NL);
const abIdx = (x: number) => clampIdx(Math.floor((x - AB_MIN) / CELL_AB), NAB);
const hexToInt = (hex: string) => parseInt(hex.replace('#', ''), 16) | 0;
const intToHex = (n: number) => `#${(n >>> 0).toString(16).padStart(6, '0')}`;

class Columns {
  n = 0;
  L: Float64Array;
  A: Float64Array;
  B: Float64Array;
  C: Float64Array;
  share: Float32Array;
  photo: Int32Array;
  /** The colour's piece (0: none), kept beside it so the scan makes no lookup through the photo. */
  piece: Int32Array;
  id: Int32Array;
  rgb: Int32Array;
  alive: Uint8Array;
  constructor(cap: number) {
    this.L = new Float64Array(cap);
    this.A = new Float64Array(cap);
    this.B = new Float64Array(cap);
    this.C = new Float64Array(cap);
    this.share = new Float32Array(cap);
    this.photo = new Int32Array(cap);
    this.piece = new Int32Array(cap);
    this.id = new Int32Array(cap);
    this.rgb = new Int32Array(cap);
    this.alive = new Uint8Array(cap);
  }
  get cap() {
    return this.L.length;
  }
  grow(min: number) {
    if (min <= this.cap) return;
    const next = new Columns(Math.max(min, this.cap * 2, 64));
    next.copyFrom(this, 0, 0, this.n);
    next.n = this.n;
    Object.assign(this, {
      L: next.L,
      A: next.A,
      B: next.B,
      C: next.C,
      share: next.share,
      photo: next.photo,
      piece: next.piece,
      id: next.id,
      rgb: next.rgb,
      alive: next.alive,
    });
  }
  copyFrom(src: Columns, from: number, to: number, count = 1) {
    for (let k = 0; k < count; k++) {
      const i = from + k;
      const j = to + k;
      this.L[j] = src.L[i];
      this.A[j] = src.A[i];
      this.B[j] = src.B[i];
      this.C[j] = src.C[i];
      this.share[j] = src.share[i];
      this.photo[j] = src.photo[i];
      this.piece[j] = src.piece[i];
      this.id[j] = src.id[i];
      this.rgb[j] = src.rgb[i];
      this.alive[j] = src.alive[i];
    }
  }
  push(r: ShadeRow, piece: number) {
    this.grow(this.n + 1);
    const j = this.n++;
    this.L[j] = r.L;
    this.A[j] = r.a;
    this.B[j] = r.b;
    this.C[j] = Math.sqrt(r.a * r.a + r.b * r.b);
    this.share[j] = r.share;
    this.photo[j] = r.photoId;
    this.piece[j] = piece;
    this.id[j] = r.id;
    this.rgb[j] = hexToInt(r.hex);
    this.alive[j] = 1;
  }
}

/** Colours gathered for a load (read.ts, `readShade`), straight into the index's columns: no object per colour. */
export class ShadeColours {
  /** @internal */
  readonly cols = new Columns(1 << 16);
  get size() {
    return this.cols.n;
  }
  add(id: number, photoId: number, L: number, a: number, b: number, hex: string, share: number) {
    // The same as Columns.push; the piece is filled in by ShadeIndex.load, once the photos are known.
    const c = this.cols;
    c.grow(c.n + 1);
    const j = c.n++;
    c.L[j] = L;
    c.A[j] = a;
    c.B[j] = b;
    c.C[j] = Math.sqrt(a * a + b * b);
    c.share[j] = share;
    c.photo[j] = photoId;
    c.id[j] = id;
    c.rgb[j] = hexToInt(hex);
    c.alive[j] = 1;
  }
  /** Keep only the colours for which `keep(j)` holds, in their order (in place: copying within one set of columns). */
  retain(keep: (j: number) => boolean) {
    const c = this.cols;
    let n = 0;
    for (let j = 0; j < c.n; j++) if (keep(j)) c.copyFrom(c, j, n++);
    c.n = n;
  }
}

export class ShadeIndex {
  private main = new Columns(0);
  /** Grid cell i holds main[start[i] .. start[i + 1]); cells run L* fastest, so a column's slices are one run. */
  private start = new Int32Array(NCELLS + 1);
  /** Summed-area table of colours per a*b* column (all L*): an empty rectangle of columns is skipped unvisited. */
  private colSum = new Int32Array((NAB + 1) * (NAB + 1));
  private tail = new Columns(0);
  private dead = 0;
  private photoPiece = new Int32Array(1024);
  /** Per piece id, its lowest photo id (0: none); rebuilt on first use after a photo changes. */
  private firstPhoto: Int32Array | null = null;
  /** Per piece id, side by side (one cache line per piece touched): the query generation that last matched it, and its best ΔE00 then. */
  private pieceState = new Float64Array(2048);
  private pieceBest = new Int32Array(1024);
  private matchedScratch = new Int32Array(0);
  /** The ΔE00 kernel's argument block (query colour, result), the current cell's lower bound and kth: typed slots, not
   * arguments, because floating-point arguments to a call that is not inlined are boxed on the heap. */
  private kernel = kernelBlock();
  private cellLb = new Float64Array(1);
  private kthSlot = new Float64Array(1);
  private gen = 0;
  /** Per L* slice: lower and upper bounds of the lightness term for the current query. */
  private lightScratch = new Float64Array(2 * NL);

  get size() {
    return this.main.n + this.tail.n - this.dead;
  }

  /** Replace every colour and the photo → piece map (start-up). */
  load(rows: Iterable<ShadeRow> | ShadeColours, photos: Iterable<{ id: number; pieceId: number | null }>) {
    this.main = new Columns(0);
    this.tail = new Columns(1024);
    this.photoPiece = new Int32Array(1024);
    for (const p of photos) this.setPhoto(p.id, p.pieceId);
    if (rows instanceof ShadeColours) {
      const c = rows.cols;
      for (let j = 0; j < c.n; j++) c.piece[j] = this.pieceOf(c.photo[j]);
      this.tail = c;
    } else for (const r of rows) this.tail.push(r, this.pieceOf(r.photoId));
    this.dead = 0;
    this.compact();
  }

  /** Which piece a photo belongs to (null/0: none, its colours are ignored). */
  setPhoto(photoId: number, pieceId: number | null) {
    if (photoId >= this.photoPiece.length) {
      const next = new Int32Array(Math.max(photoId + 1, this.photoPiece.length * 2));
      next.set(this.photoPiece);
      this.photoPiece = next;
    }
    this.photoPiece[photoId] = pieceId ?? 0;
    this.firstPhoto = null;
    this.ensurePieces(pieceId ?? 0);
    for (const c of [this.main, this.tail])
      for (let j = 0; j < c.n; j++) if (c.photo[j] === photoId) c.piece[j] = pieceId ?? 0;
  }

  private pieceOf(photoId: number) {
    return photoId < this.photoPiece.length ? this.photoPiece[photoId] : 0;
  }

  /** The first photo of each piece, for thumbnails. */
  firstPhotoOf(pieceIds: number[]): Map<number, number> {
    if (!this.firstPhoto) {
      let max = 0;
      for (let ph = 1; ph < this.photoPiece.length; ph++) if (this.photoPiece[ph] > max) max = this.photoPiece[ph];
      const first = new Int32Array(max + 1);
      for (let ph = 1; ph < this.photoPiece.length; ph++) {
        const p = this.photoPiece[ph];
        if (p > 0 && !first[p]) first[p] = ph;
      }
      this.firstPhoto = first;
    }
    const out = new Map<number, number>();
    for (const p of pieceIds)
      if (p > 0 && p < this.firstPhoto.length && this.firstPhoto[p]) out.set(p, this.firstPhoto[p]);
    return out;
  }

  /** Drop every colour of a photo (before re-adding its current palette). */
  removePhoto(photoId: number) {
    for (const c of [this.main, this.tail]) {
      for (let j = 0; j < c.n; j++) {
        if (c.photo[j] === photoId && c.alive[j]) {
          c.alive[j] = 0;
          this.dead++;
        }
      }
    }
  }

  add(rows: ShadeRow[]) {
    for (const r of rows) this.tail.push(r, this.pieceOf(r.photoId));
    if (this.tail.n > TAIL_LIMIT || this.dead > Math.max(TAIL_LIMIT, this.main.n / 10)) this.compact();
  }

  /** Fold the tail into the grid and drop tombstones: a counting sort by cell. */
  private compact() {
    const cellOf = (c: Columns, j: number) => (abIdx(c.A[j]) * NAB + abIdx(c.B[j])) * NL + lIdx(c.L[j]);
    const counts = new Int32Array(NCELLS + 1);
    let live = 0;
    for (const c of [this.main, this.tail])
      for (let j = 0; j < c.n; j++)
        if (c.alive[j]) {
          counts[cellOf(c, j) + 1]++;
          live++;
        }
    for (let i = 0; i < NCELLS; i++) counts[i + 1] += counts[i];
    const start = counts.slice();
    const next = new Columns(live);
    for (const c of [this.main, this.tail])
      for (let j = 0; j < c.n; j++) if (c.alive[j]) next.copyFrom(c, j, counts[cellOf(c, j)]++);
    next.n = live;
    this.main = next;
    this.start = start;
    const W = NAB + 1;
    const sum = new Int32Array(W * W);
    for (let ai = 0; ai < NAB; ai++)
      for (let bi = 0; bi < NAB; bi++) {
        const col = ai * NAB + bi;
        sum[(ai + 1) * W + bi + 1] =
          start[(col + 1) * NL] - start[col * NL] + sum[ai * W + bi + 1] + sum[(ai + 1) * W + bi] - sum[ai * W + bi];
      }
    this.colSum = sum;
    this.tail = new Columns(0);
    this.dead = 0;
  }

  private ensurePieces(pieceId: number) {
    if (pieceId < this.pieceBest.length) return;
    const n = Math.max(pieceId + 1, this.pieceBest.length * 2);
    const state = new Float64Array(2 * n);
    state.set(this.pieceState);
    this.pieceState = state;
    const best = new Int32Array(n);
    best.set(this.pieceBest);
    this.pieceBest = best;
  }

  /** Pieces with a colour within maxDeltaE of the query, best colour each, ranked by ΔE00 then share; `total` counts all of them. */
  // `matched` lists every matching piece id (for facet counts); it is a view of a buffer reused by the next query:
  // read it before any `await` or copy it (README.md, invariant 1).
  query(q: ShadeQuery): { total: number; items: ShadeMatch[]; candidates: number; matched: Int32Array } {
    const { L: qL, a: qa, b: qb, maxDeltaE: r } = q;
    const k = this.kernel;
    k[K_L] = qL;
    k[K_A] = qa;
    k[K_B] = qb;
    k[K_C] = Math.sqrt(qa * qa + qb * qb);
    const box = q.scanAll ? { hwL: Infinity, hwAB: Infinity } : shadeBox(q, r);
    const gen = ++this.gen;
    // state[2p] === gen: piece p has matched in this query, with best ΔE00 state[2p + 1] (colour bestSlot[p]).
    const state = this.pieceState;
    const bestSlot = this.pieceBest;
    const allow = q.allow ?? null;
    // The pieces matched so far, in a buffer reused across queries (a piece is added once: it has one per piece id).
    if (this.matchedScratch.length < bestSlot.length) this.matchedScratch = new Int32Array(bestSlot.length);
    const matchedIds = this.matchedScratch;
    let total = 0;
    let candidates = 0;
    // Only the first `need` pieces are ranked. `kth` is the largest ΔE00 in a max-heap holding, for `need` distinct
    // pieces, the ΔE00 each matched with first: every value is ≥ that piece's final best, so the need-th best ΔE00
    // of the final answer is ≤ kth. A colour of an already-matched piece whose lower bound exceeds kth can neither
    // put its piece on the page nor change a best shown there; it is not scored. Pieces not yet matched are always
    // scored: they count towards `total`.
    const need = (q.offset ?? 0) + q.limit;
    const heap = new Float64Array(Math.max(1, need));
    let heapN = 0;
    // kth lives in a typed slot (as does the ΔE00 admitted, k[K_OUT]): a captured variable holding a float is boxed on every write.
    const kthSlot = this.kthSlot;
    kthSlot[0] = Infinity;
    const admit = () => {
      const de = k[K_OUT];
      if (heapN < need) {
        let i = heapN++;
        while (i > 0) {
          const p = (i - 1) >> 1;
          if (heap[p] >= de) break;
          heap[i] = heap[p];
          i = p;
        }
        heap[i] = de;
        if (heapN === need) kthSlot[0] = heap[0];
      } else if (de < heap[0]) {
        let i = 0;
        for (;;) {
          const l = 2 * i + 1;
          if (l >= heapN) break;
          const c = l + 1 < heapN && heap[l + 1] > heap[l] ? l + 1 : l;
          if (heap[c] <= de) break;
          heap[i] = heap[c];
          i = c;
        }
        heap[i] = de;
        kthSlot[0] = heap[0];
      }
    };

    // The ellipsoid of shade-bounds.ts (inside the box): (ΔL/hwL)² + ((Δa²+Δb²)/hwAB²) ≤ 1 for every match.
    const invL2 = q.scanAll ? 0 : 1 / (box.hwL * box.hwL);
    const invAB2 = q.scanAll ? 0 : 1 / (box.hwAB * box.hwAB);
    // cellLb[0]: a lower bound on ΔE00 for every colour in the run (0 when unknown); `inside`: every colour in the
    // run is within the radius (its cell's upper bound says so).
    const cellLb = this.cellLb;
    const scan = (c: Columns, from: number, to: number, tailFlag: number, inside: boolean) => {
      const blockLb = cellLb[0];
      const { L, A, B, C, alive, piece, share } = c;
      for (let j = from; j < to; j++) {
        const dL = L[j] - qL;
        const da = A[j] - qa;
        const db = B[j] - qb;
        const e2 = dL * dL * invL2 + (da * da + db * db) * invAB2;
        if (e2 > ELLIPSOID_SLACK) continue;
        if (!alive[j]) continue;
        const pid = piece[j];
        if (pid <= 0 || (allow !== null && !allow[pid])) continue;
        // Per-piece early exit: ΔE00 ≥ r·√e2 (shade-bounds.ts), so a colour that cannot beat the piece's best, or
        // cannot reach the page (kth, above), is skipped.
        const slot = tailFlag | j;
        const lb = Math.max(blockLb, r * Math.sqrt(e2) * LB_SHRINK);
        const matched = state[2 * pid] === gen;
        if (matched) {
          if (lb > state[2 * pid + 1] || lb > kthSlot[0]) continue;
        } else if (inside && lb > kthSlot[0]) {
          // A match for certain that cannot reach the page: it counts, with its lower bound standing in for its
          // ΔE00 (that keeps it behind every piece on the page; a later exact colour may still replace it).
          state[2 * pid] = gen;
          state[2 * pid + 1] = lb;
          bestSlot[pid] = slot;
          matchedIds[total++] = pid;
          continue;
        }
        candidates++;
        deltaE00Kernel(k, L, A, B, C, j);
        const de = k[K_OUT];
        if (de > r) continue;
        if (!matched) {
          state[2 * pid] = gen;
          state[2 * pid + 1] = de;
          bestSlot[pid] = slot;
          matchedIds[total++] = pid;
          admit();
        } else if (de < state[2 * pid + 1] || (de === state[2 * pid + 1] && share[j] > this.shareOf(bestSlot[pid]))) {
          state[2 * pid + 1] = de;
          bestSlot[pid] = slot;
        }
      }
    };

    const nA = abIdx(qa + box.hwAB) - abIdx(qa - box.hwAB) + 1;
    const nB = abIdx(qb + box.hwAB) - abIdx(qb - box.hwAB) + 1;
    const nCells = (lIdx(qL + box.hwL) - lIdx(qL - box.hwL) + 1) * nA * nB;
    // A box with far more cells than there are colours (a wide radius on a small archive) is cheaper to scan whole.
    cellLb[0] = 0;
    if (q.scanAll || nCells > 4 * this.main.n) scan(this.main, 0, this.main.n, 0, false);
    else {
      // Walk the a*b* grid from the prefilter box down to single columns, dropping every rectangle that the
      // ellipsoid (cheap) or its ΔE00 lower bound (box-bound.ts, which follows the tolerance region's real shape)
      // puts beyond the radius; then each column's L* cells, with bounds from the column's chroma/hue terms plus
      // each slice's lightness terms (worked out once per query). The half holding the query goes first, so
      // close matches settle kth early. The grid's edge cells also hold everything clamped into them, so they get
      // no finer bound than the ellipsoid's.
      const bq = boundQuery(qL, qa, qb);
      const lLo = lIdx(qL - box.hwL);
      const lHi = lIdx(qL + box.hwL);
      const slices = centreOut(lIdx(qL), lLo, lHi);
      const light = this.lightScratch;
      const t: Terms = { lo: 0, hi: 0 };
      for (const li of slices) {
        if (li === 0 || li === NL - 1) {
          light[2 * li] = 0;
          light[2 * li + 1] = Infinity;
        } else {
          lightnessTerms(bq, L_MIN + li * CELL_L, L_MIN + (li + 1) * CELL_L, t);
          light[2 * li] = t.lo;
          light[2 * li + 1] = t.hi;
        }
      }
      const innerAB = (i: number) => i > 0 && i < NAB - 1;
      const { start, colSum } = this;
      const W = NAB + 1;
      const column = (ai: number, bi: number, abLo: number, abHi: number) => {
        const base = (ai * NAB + bi) * NL;
        if (start[base + lLo] === start[base + lHi + 1]) return;
        const ga = span(qa, AB_MIN, CELL_AB, ai, ai, NAB);
        const gb = span(qb, AB_MIN, CELL_AB, bi, bi, NAB);
        const restAB = (ga * ga + gb * gb) * invAB2;
        for (const li of slices) {
          const cell = base + li;
          if (start[cell] === start[cell + 1]) continue;
          const gL = span(qL, L_MIN, CELL_L, li, li, NL);
          if (gL * gL * invL2 + restAB > ELLIPSOID_SLACK) continue;
          const lb = lowerBound(light[2 * li], abLo);
          if (lb > r) continue;
          cellLb[0] = lb;
          scan(this.main, start[cell], start[cell + 1], 0, upperBound(light[2 * li + 1], abHi) <= r * LB_SHRINK);
        }
      };
      const visit = (a0: number, a1: number, b0: number, b1: number) => {
        if (
          colSum[(a1 + 1) * W + b1 + 1] - colSum[a0 * W + b1 + 1] - colSum[(a1 + 1) * W + b0] + colSum[a0 * W + b0] ===
          0
        )
          return;
        const ga = span(qa, AB_MIN, CELL_AB, a0, a1, NAB);
        const gb = span(qb, AB_MIN, CELL_AB, b0, b1, NAB);
        if ((ga * ga + gb * gb) * invAB2 > ELLIPSOID_SLACK) return;
        let abLo = 0;
        let abHi = Infinity;
        if (innerAB(a0) && innerAB(a1) && innerAB(b0) && innerAB(b1)) {
          chromaHueTerms(
            bq,
            AB_MIN + a0 * CELL_AB,
            AB_MIN + (a1 + 1) * CELL_AB,
            AB_MIN + b0 * CELL_AB,
            AB_MIN + (b1 + 1) * CELL_AB,
            t,
          );
          abLo = t.lo;
          abHi = t.hi;
          if (lowerBound(0, abLo) > r) return;
        }
        if (a0 === a1 && b0 === b1) column(a0, b0, abLo, abHi);
        else if (b1 - b0 >= a1 - a0) {
          const m = (b0 + b1) >> 1;
          const low = qb < AB_MIN + (m + 1) * CELL_AB;
          visit(a0, a1, low ? b0 : m + 1, low ? m : b1);
          visit(a0, a1, low ? m + 1 : b0, low ? b1 : m);
        } else {
          const m = (a0 + a1) >> 1;
          const low = qa < AB_MIN + (m + 1) * CELL_AB;
          visit(low ? a0 : m + 1, low ? m : a1, b0, b1);
          visit(low ? m + 1 : a0, low ? a1 : m, b0, b1);
        }
      };
      visit(abIdx(qa - box.hwAB), abIdx(qa + box.hwAB), abIdx(qb - box.hwAB), abIdx(qb + box.hwAB));
    }
    cellLb[0] = 0;
    scan(this.tail, 0, this.tail.n, TAIL_BIT, false);

    const bestDe = (p: number) => state[2 * p + 1];
    const better = (p: number, o: number) =>
      compareMatch(bestDe(p), this.shareOf(bestSlot[p]), p, bestDe(o), this.shareOf(bestSlot[o]), o) < 0;
    // The page holds only pieces whose best is ≤ kth (see above): rank those, not every match.
    const onPage: number[] = [];
    for (let i = 0; i < total; i++) if (bestDe(matchedIds[i]) <= kthSlot[0]) onPage.push(matchedIds[i]);
    const top = selectTop(onPage, need, better);
    return {
      total,
      items: top.slice(q.offset ?? 0).map((pid) => this.match(pid, bestSlot[pid], bestDe(pid))),
      candidates,
      matched: matchedIds.subarray(0, total),
    };
  }

  private shareOf(slot: number) {
    return slot & TAIL_BIT ? this.tail.share[slot & ~TAIL_BIT] : this.main.share[slot];
  }

  private match(pieceId: number, slot: number, de: number): ShadeMatch {
    const c = slot & TAIL_BIT ? this.tail : this.main;
    const j = slot & ~TAIL_BIT;
    return {
      pieceId,
      photoId: c.photo[j],
      colourId: c.id[j],
      L: c.L[j],
      a: c.A[j],
      b: c.B[j],
      hex: intToHex(c.rgb[j]),
      share: c.share[j],
      deltaE00: de,
    };
  }

  /** Every live colour with its piece, for the brute-force check (tests and benchmark). */
  *entries(): Generator<ShadeMatch> {
    for (const c of [this.main, this.tail])
      for (let j = 0; j < c.n; j++) {
        if (!c.alive[j]) continue;
        const pid = c.piece[j];
        if (pid > 0)
          yield {
            pieceId: pid,
            photoId: c.photo[j],
            colourId: c.id[j],
            L: c.L[j],
            a: c.A[j],
            b: c.B[j],
            hex: intToHex(c.rgb[j]),
            share: c.share[j],
            deltaE00: NaN,
          };
      }
  }
}

const TAIL_BIT = 1 << 30;

/** lo..hi in the order c, c−1, c+1, c−2, … (c clamped into the range). */
function centreOut(c: number, lo: number, hi: number): number[] {
  const m = Math.min(hi, Math.max(lo, c));
  const out = [m];
  for (let d = 1; m - d >= lo || m + d <= hi; d++) {
    if (m - d >= lo) out.push(m - d);
    if (m + d <= hi) out.push(m + d);
  }
  return out;
}

/** Ranking order: smaller ΔE00, then larger share, then lower piece id (stable across runs). */
export function compareMatch(deA: number, shareA: number, pidA: number, deB: number, shareB: number, pidB: number) {
  return deA - deB || shareB - shareA || pidA - pidB;
}
