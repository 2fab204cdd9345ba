import { deltaE00Raw } from './ciede2000.ts';
import { shadeBox } from './shade-bounds.ts';
import { selectTop } from './top.ts';

/**
 * In-memory shade index over palette colours. Colours sit in flat typed arrays
 * sorted by an L*, a*, b* grid (cells of CELL units, counting-sorted), so the
 * conservative box of shade-bounds.ts turns into a few hundred contiguous runs.
 * Every candidate in the box gets an exact CIEDE2000; each piece keeps its best
 * colour (smallest ΔE00, then largest share), and only the page asked for is
 * ranked (a bounded heap), so a query with 17 000 matching pieces does not sort
 * them all. New colours go to a small unsorted tail that is scanned linearly
 * and folded into the grid when it grows; removed colours are tombstoned.
 */
export type ShadeRow = { id: number; photoId: number; L: number; a: number; b: number; hex: string; share: number };
export type ShadeMatch = { pieceId: number; photoId: number; colourId: number; L: number; a: number; b: number; hex: string; share: number; deltaE00: number };
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

const CELL = 2;
const L_MIN = 0;
const NL = 50;
const AB_MIN = -128;
const NAB = 128;
const NCELLS = NL * NAB * NAB;
const TAIL_LIMIT = 20_000;
// The ellipsoid test is done in floating point; this slack keeps points on its surface.
const ELLIPSOID_SLACK = 1 + 1e-9;
// The ΔE00 lower bound r·√e2 is shrunk by a hair for floating-point rounding before it is trusted to skip a colour.
const LB_SHRINK = 1 - 1e-9;

/** Distance from v to grid cell i of n cells starting at min (0 inside it); the clamped edge cells reach to ±∞. */
function gap(v: number, min: number, i: number, n: number) {
  const lo = min + i * CELL;
  if (v < lo) return i === 0 ? 0 : lo - v;
  if (v > lo + CELL) return i === n - 1 ? 0 : v - lo - CELL;
  return 0;
}

const clampIdx = (v: number, n: number) => (v < 0 ? 0 : v >= n ? n - 1 : v);
const lIdx = (L: number) => clampIdx(Math.floor((L - L_MIN) / CELL), NL);
const abIdx = (x: number) => clampIdx(Math.floor((x - AB_MIN) / CELL), NAB);
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
    Object.assign(this, { L: next.L, A: next.A, B: next.B, C: next.C, share: next.share, photo: next.photo, id: next.id, rgb: next.rgb, alive: next.alive });
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
      this.id[j] = src.id[i];
      this.rgb[j] = src.rgb[i];
      this.alive[j] = src.alive[i];
    }
  }
  push(r: ShadeRow) {
    this.grow(this.n + 1);
    const j = this.n++;
    this.L[j] = r.L;
    this.A[j] = r.a;
    this.B[j] = r.b;
    this.C[j] = Math.hypot(r.a, r.b);
    this.share[j] = r.share;
    this.photo[j] = r.photoId;
    this.id[j] = r.id;
    this.rgb[j] = hexToInt(r.hex);
    this.alive[j] = 1;
  }
}

export class ShadeIndex {
  private main = new Columns(0);
  private start = new Int32Array(NCELLS + 1);
  private tail = new Columns(0);
  private dead = 0;
  private photoPiece = new Int32Array(1024);
  /** Per piece id, its lowest photo id (0: none); rebuilt on first use after a photo changes. */
  private firstPhoto: Int32Array | null = null;
  private pieceStamp = new Int32Array(1024);
  private pieceBest = new Int32Array(1024);
  private pieceDe = new Float64Array(1024);
  private gen = 0;

  get size() {
    return this.main.n + this.tail.n - this.dead;
  }

  /** Replace every colour and the photo → piece map (start-up). */
  load(rows: Iterable<ShadeRow>, photos: Iterable<{ id: number; pieceId: number | null }>) {
    this.photoPiece = new Int32Array(1024);
    for (const p of photos) this.setPhoto(p.id, p.pieceId);
    const all = new Columns(1024);
    for (const r of rows) all.push(r);
    this.main = new Columns(0);
    this.tail = all;
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
    for (const p of pieceIds) if (p > 0 && p < this.firstPhoto.length && this.firstPhoto[p]) out.set(p, this.firstPhoto[p]);
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
    for (const r of rows) this.tail.push(r);
    if (this.tail.n > TAIL_LIMIT || this.dead > Math.max(TAIL_LIMIT, this.main.n / 10)) this.compact();
  }

  /** Fold the tail into the grid and drop tombstones: a counting sort by cell. */
  private compact() {
    const cellOf = (c: Columns, j: number) => (lIdx(c.L[j]) * NAB + abIdx(c.A[j])) * NAB + abIdx(c.B[j]);
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
    this.tail = new Columns(0);
    this.dead = 0;
  }

  private ensurePieces(pieceId: number) {
    if (pieceId < this.pieceStamp.length) return;
    const n = Math.max(pieceId + 1, this.pieceStamp.length * 2);
    const grow = <T extends Int32Array | Float64Array>(a: T, make: (n: number) => T) => {
      const b = make(n);
      b.set(a);
      return b;
    };
    this.pieceStamp = grow(this.pieceStamp, (k) => new Int32Array(k));
    this.pieceBest = grow(this.pieceBest, (k) => new Int32Array(k));
    this.pieceDe = grow(this.pieceDe, (k) => new Float64Array(k));
  }

  /** Pieces with a colour within maxDeltaE of the query, best colour each, ranked by ΔE00 then share; `total` counts all of them. */
  query(q: ShadeQuery): { total: number; items: ShadeMatch[]; candidates: number } {
    const { L: qL, a: qa, b: qb, maxDeltaE: r } = q;
    const qC = Math.hypot(qa, qb);
    const box = q.scanAll ? { hwL: Infinity, hwAB: Infinity } : shadeBox(q, r);
    const gen = ++this.gen;
    const stamp = this.pieceStamp;
    const bestSlot = this.pieceBest;
    const bestDe = this.pieceDe;
    const photoPiece = this.photoPiece;
    const allow = q.allow ?? null;
    const touched: number[] = [];
    let candidates = 0;

    // The ellipsoid of shade-bounds.ts (inside the box): (ΔL/hwL)² + ((Δa²+Δb²)/hwAB²) ≤ 1 for every match.
    const invL2 = q.scanAll ? 0 : 1 / (box.hwL * box.hwL);
    const invAB2 = q.scanAll ? 0 : 1 / (box.hwAB * box.hwAB);
    const scan = (c: Columns, from: number, to: number, tailFlag: number) => {
      const { L, A, B, C, alive, photo, share } = c;
      for (let j = from; j < to; j++) {
        const dL = L[j] - qL;
        const da = A[j] - qa;
        const db = B[j] - qb;
        const e2 = dL * dL * invL2 + (da * da + db * db) * invAB2;
        if (e2 > ELLIPSOID_SLACK) continue;
        if (!alive[j]) continue;
        const ph = photo[j];
        const pid = ph < photoPiece.length ? photoPiece[ph] : 0;
        if (pid <= 0 || (allow !== null && !allow[pid])) continue;
        // Per-piece early exit: ΔE00 ≥ r·√e2 (shade-bounds.ts), so a colour that cannot beat the piece's best is skipped.
        if (stamp[pid] === gen && r * Math.sqrt(e2) * LB_SHRINK > bestDe[pid]) continue;
        candidates++;
        const de = deltaE00Raw(qL, qa, qb, qC, L[j], A[j], B[j], C[j]);
        if (de > r) continue;
        const slot = tailFlag | j;
        if (stamp[pid] !== gen) {
          stamp[pid] = gen;
          bestDe[pid] = de;
          bestSlot[pid] = slot;
          touched.push(pid);
        } else if (de < bestDe[pid] || (de === bestDe[pid] && share[j] > this.shareOf(bestSlot[pid]))) {
          bestDe[pid] = de;
          bestSlot[pid] = slot;
        }
      }
    };

    const l0 = lIdx(qL - box.hwL);
    const l1 = lIdx(qL + box.hwL);
    const a0 = abIdx(qa - box.hwAB);
    const a1 = abIdx(qa + box.hwAB);
    const b0 = abIdx(qb - box.hwAB);
    const b1 = abIdx(qb + box.hwAB);
    if (q.scanAll) scan(this.main, 0, this.main.n, 0);
    else
      for (let li = l0; li <= l1; li++) {
        // Skip whole cells by their point nearest the query: what the ellipsoid leaves of a*b* after this L* slab.
        const gL = gap(qL, L_MIN, li, NL);
        const restL = ELLIPSOID_SLACK - gL * gL * invL2;
        if (restL < 0) continue;
        for (let ai = a0; ai <= a1; ai++) {
          const ga = gap(qa, AB_MIN, ai, NAB);
          const restAB = restL / invAB2 - ga * ga;
          if (restAB < 0) continue;
          // Cells whose b* span comes within √restAB of the query's b* (one contiguous run of the grid).
          const hb = Math.sqrt(restAB);
          const lo = Math.max(b0, abIdx(qb - hb));
          const hi = Math.min(b1, abIdx(qb + hb));
          if (lo > hi) continue;
          const base = (li * NAB + ai) * NAB;
          scan(this.main, this.start[base + lo], this.start[base + hi + 1], 0);
        }
      }
    scan(this.tail, 0, this.tail.n, TAIL_BIT);

    const need = (q.offset ?? 0) + q.limit;
    const better = (p: number, o: number) => compareMatch(bestDe[p], this.shareOf(bestSlot[p]), p, bestDe[o], this.shareOf(bestSlot[o]), o) < 0;
    const top = selectTop(touched, need, better);
    return { total: touched.length, items: top.slice(q.offset ?? 0).map((pid) => this.match(pid, bestSlot[pid], bestDe[pid])), candidates };
  }

  private shareOf(slot: number) {
    return slot & TAIL_BIT ? this.tail.share[slot & ~TAIL_BIT] : this.main.share[slot];
  }

  private match(pieceId: number, slot: number, de: number): ShadeMatch {
    const c = slot & TAIL_BIT ? this.tail : this.main;
    const j = slot & ~TAIL_BIT;
    return { pieceId, photoId: c.photo[j], colourId: c.id[j], L: c.L[j], a: c.A[j], b: c.B[j], hex: intToHex(c.rgb[j]), share: c.share[j], deltaE00: de };
  }

  /** Every live colour with its piece, for the brute-force check (tests and benchmark). */
  *entries(): Generator<ShadeMatch> {
    for (const c of [this.main, this.tail])
      for (let j = 0; j < c.n; j++) {
        if (!c.alive[j]) continue;
        const pid = c.photo[j] < this.photoPiece.length ? this.photoPiece[c.photo[j]] : 0;
        if (pid > 0) yield { pieceId: pid, photoId: c.photo[j], colourId: c.id[j], L: c.L[j], a: c.A[j], b: c.B[j], hex: intToHex(c.rgb[j]), share: c.share[j], deltaE00: NaN };
      }
  }
}

const TAIL_BIT = 1 << 30;

/** Ranking order: smaller ΔE00, then larger share, then lower piece id (stable across runs). */
export function compareMatch(deA: number, shareA: number, pidA: number, deB: number, shareB: number, pidB: number) {
  return deA - deB || shareB - shareA || pidA - pidB;
}
