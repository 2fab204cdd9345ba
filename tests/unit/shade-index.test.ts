import { describe, expect, it } from 'vitest';
import { bruteForceShade } from '../../server/search/brute.ts';
import { deltaE00 } from '../../server/search/ciede2000.ts';
import { inShadeEllipsoid, shadeBox } from '../../server/search/shade-bounds.ts';
import { ShadeIndex, type ShadeRow } from '../../server/search/shade-index.ts';

let seed = 12345;
const rnd = () => (seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648;
const gauss = () => Math.sqrt(-2 * Math.log(1 - rnd())) * Math.cos(2 * Math.PI * rnd());

// Uniform colours, a madder-red and an indigo cluster, and a heap of near-neutral greys.
function colour(i: number) {
  const k = i % 4;
  if (k === 0) return { L: rnd() * 100, a: rnd() * 220 - 110, b: rnd() * 220 - 110 };
  if (k === 1) return { L: 42 + gauss() * 8, a: 45 + gauss() * 8, b: 25 + gauss() * 8 };
  if (k === 2) return { L: 30 + gauss() * 7, a: -3 + gauss() * 5, b: -35 + gauss() * 8 };
  return { L: rnd() * 100, a: gauss() * 1.5, b: gauss() * 1.5 };
}

function build(n: number, pieces: number) {
  const rows: ShadeRow[] = [];
  for (let i = 1; i <= n; i++)
    rows.push({
      id: i,
      photoId: 1 + (i % (pieces * 2)),
      ...colour(i),
      hex: '#808080',
      share: Math.round(rnd() * 100) / 100,
    });
  const photos = Array.from({ length: pieces * 2 }, (_, p) => ({ id: p + 1, pieceId: 1 + (p % pieces) }));
  const idx = new ShadeIndex();
  idx.load(rows, photos);
  return idx;
}

const same = (idx: ShadeIndex, q: { L: number; a: number; b: number; maxDeltaE: number; allow?: Uint8Array }) => {
  const want = bruteForceShade(idx.entries(), q);
  const got = idx.query({ ...q, limit: want.length + 5 });
  expect(got.total).toBe(want.length);
  expect(got.items.map((m) => [m.pieceId, m.deltaE00])).toEqual(want.map((m) => [m.pieceId, m.deltaE00]));
  // The benchmark's brute-force baseline (no prefilter, typed arrays) must agree too.
  const scan = idx.query({ ...q, limit: want.length + 5, scanAll: true });
  expect(scan.items.map((m) => m.pieceId)).toEqual(want.map((m) => m.pieceId));
  return want.length;
};

describe('shade prefilter box (shade-bounds.ts)', () => {
  it('never excludes a colour within the ΔE00 radius (box and inscribed ellipsoid): 40 000 pairs placed just inside the radius, biased to greys and blues', () => {
    let checked = 0;
    const missed: unknown[] = [];
    let naiveMissed = 0;
    let cornerInside = 0;
    for (let i = 0; i < 40_000; i++) {
      const q = i % 3 === 0 ? { L: rnd() * 100, a: gauss() * 3, b: gauss() * 3 } : colour(i);
      const r = [0.5, 1, 2, 5, 10, 20, 30][i % 7];
      // A random direction, pushed out until ΔE00 reaches the radius (bisection), then kept just inside.
      const dir = { L: gauss(), a: gauss() * 4, b: gauss() * 4 };
      let lo = 0;
      let hi = 400;
      for (let k = 0; k < 40; k++) {
        const t = (lo + hi) / 2;
        if (deltaE00(q, { L: q.L + dir.L * t, a: q.a + dir.a * t, b: q.b + dir.b * t }) <= r) lo = t;
        else hi = t;
      }
      const s = { L: q.L + dir.L * lo, a: q.a + dir.a * lo, b: q.b + dir.b * lo };
      if (deltaE00(q, s) > r) continue;
      const box = shadeBox(q, r);
      if (Math.abs(s.L - q.L) > box.hwL || Math.abs(s.a - q.a) > box.hwAB || Math.abs(s.b - q.b) > box.hwAB)
        missed.push({ q, s, r, box });
      if (!inShadeEllipsoid(box, s.L - q.L, s.a - q.a, s.b - q.b)) missed.push({ ellipsoid: true, q, s, r, box });
      if (inShadeEllipsoid(box, box.hwL, box.hwAB, box.hwAB)) cornerInside++;
      if (Math.abs(s.L - q.L) > r || Math.abs(s.a - q.a) > r || Math.abs(s.b - q.b) > r) naiveMissed++;
      checked++;
    }
    expect(missed).toEqual([]);
    // The ellipsoid really is tighter than the box: its corners lie outside.
    expect(cornerInside).toBe(0);
    // The same points defeat a naive ±r box, so this check has teeth.
    expect(naiveMissed / checked).toBeGreaterThan(0.3);
    expect(checked).toBeGreaterThan(30_000);
  }, 180_000);

  it('is far tighter than "everything" away from blue hues, and wider than a naive ±r box', () => {
    const red = shadeBox({ L: 45, a: 45, b: 25 }, 5);
    expect(red.hwAB).toBeLessThan(25);
    expect(red.hwAB).toBeGreaterThan(5);
    expect(shadeBox({ L: 50, a: 0, b: 0 }, 5).hwAB).toBeLessThan(7);
  });
});

describe('shade index = brute-force CIEDE2000 scan', () => {
  const idx = build(12_000, 1_500);

  it('on 150 random queries (uniform, clustered, grey, radius 0.5–30), same pieces in the same order with the same ΔE00', () => {
    let matches = 0;
    for (let i = 0; i < 150; i++) {
      const base = i % 2 ? colour(i) : { L: rnd() * 100, a: rnd() * 160 - 80, b: rnd() * 160 - 80 };
      matches += same(idx, { ...base, maxDeltaE: [0.5, 2, 5, 5, 10, 30][i % 6] });
    }
    expect(matches).toBeGreaterThan(1_000);
  }, 180_000);

  it('at colours lying exactly on the radius edge and at the a*b* origin', () => {
    const rows = [...idx.entries()].slice(0, 60);
    for (const c of rows) {
      const q = { L: c.L + 1.3, a: c.a - 2.1, b: c.b + 0.7 };
      same(idx, { ...q, maxDeltaE: deltaE00(q, c) });
    }
    for (const L of [0, 5, 25, 50, 75, 95, 100]) same(idx, { L, a: 0, b: 0, maxDeltaE: 4 });
  }, 180_000);

  it('honours an allow-list of pieces and pages through a bounded selection', () => {
    const allow = new Uint8Array(1501);
    for (let p = 1; p <= 1500; p += 3) allow[p] = 1;
    const q = { L: 42, a: 45, b: 25, maxDeltaE: 8 };
    same(idx, { ...q, allow });
    const all = bruteForceShade(idx.entries(), q);
    const page2 = idx.query({ ...q, limit: 25, offset: 25 });
    expect(page2.items.map((m) => m.pieceId)).toEqual(all.slice(25, 50).map((m) => m.pieceId));
  });

  it('follows removals, additions, photo moves and compaction', () => {
    const small = build(3_000, 300);
    small.removePhoto(5);
    small.add([{ id: 99_001, photoId: 5, L: 42, a: 45, b: 25, hex: '#9b2f2f', share: 0.9 }]);
    small.setPhoto(7, null);
    const q = { L: 42, a: 45, b: 25, maxDeltaE: 3 };
    same(small, q);
    expect(small.query({ ...q, limit: 1 }).items[0]).toMatchObject({ colourId: 99_001, deltaE00: 0 });
    const many: ShadeRow[] = Array.from({ length: 25_000 }, (_, i) => ({
      id: 100_000 + i,
      photoId: 11,
      ...colour(i),
      hex: '#808080',
      share: 0.1,
    }));
    small.add(many);
    same(small, q);
    same(small, { L: 30, a: -3, b: -35, maxDeltaE: 6 });
  });
});

describe('first photo of each piece (thumbnails)', () => {
  it('is the lowest photo id of the piece and follows photo changes', () => {
    const idx = new ShadeIndex();
    idx.load(
      [],
      [
        { id: 7, pieceId: 3 },
        { id: 4, pieceId: 3 },
        { id: 9, pieceId: 5 },
        { id: 2, pieceId: null },
      ],
    );
    expect([...idx.firstPhotoOf([3, 5, 6]).entries()]).toEqual([
      [3, 4],
      [5, 9],
    ]);
    idx.setPhoto(4, null);
    idx.setPhoto(1, 6);
    expect([...idx.firstPhotoOf([3, 5, 6]).entries()]).toEqual([
      [3, 7],
      [5, 9],
      [6, 1],
    ]);
  });
});
