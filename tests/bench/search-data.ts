import { createHash } from 'node:crypto';
import { sequelize } from '../../server/models/index.ts';
import { accessionKey, accessionSortKey } from '../../shared/accession.ts';
import { labToHex } from '../../shared/search/lab.ts';

/** Synthetic archive for the search benchmark: deterministic, bulk-inserted with multi-row INSERTs. */
let seed = 20240917;
export const rnd = () => (seed = (Math.imul(seed, 1103515245) + 12345) >>> 0) / 4294967296;
const gauss = () => Math.sqrt(-2 * Math.log(1 - rnd())) * Math.cos(2 * Math.PI * rnd());

// A realistic vocabulary: trade words plus thousands of made-up words, drawn with Zipf-like (skewed) frequencies.
const TRADE = (
  'madder indigo weld cochineal logwood quercitron fustic sumac oak-gall alum iron tin chrome copper mordant resist block roller pencilled ' +
  'chintz calico furnishing dress panel border ground sprig trellis floral stripe check pomegranate vine pheasant tree-of-life red pink ' +
  'purple brown black blue green yellow buff drab olive lilac puce nankeen faded repaired hem selvedge repeat lining glazed'
).split(' ');
const SYL = [
  'ka',
  'lo',
  'mer',
  'tin',
  'va',
  'dre',
  'sol',
  'pa',
  'ri',
  'gon',
  'el',
  'fu',
  'ste',
  'ban',
  'cro',
  'wy',
  'the',
  'nor',
  'qui',
  'zel',
];
export const VOCAB: string[] = [...TRADE];
for (let i = 0; VOCAB.length < 6000; i++)
  VOCAB.push(SYL[i % 20] + SYL[Math.floor(i / 20) % 20] + SYL[Math.floor(i / 400) % 20] + (i >= 8000 ? 'n' : ''));
const CUM: number[] = [];
{
  let t = 0;
  for (let r = 1; r <= VOCAB.length; r++) CUM.push((t += 1 / r ** 1.07));
}
export const zipfWord = () => {
  const x = rnd() * CUM[CUM.length - 1];
  let lo = 0;
  let hi = CUM.length - 1;
  while (lo < hi) {
    const m = (lo + hi) >> 1;
    if (CUM[m] < x) lo = m + 1;
    else hi = m;
  }
  return VOCAB[lo];
};
const words = (n: number) => Array.from({ length: n }, zipfWord).join(' ');
const pick = <T>(xs: T[]) => xs[Math.floor(rnd() * xs.length)];

const DYES = ['madder', 'indigo', 'weld', 'cochineal', 'logwood', 'quercitron', 'fustic', 'sumac'];
const MORDANTS = [
  'aluminium acetate (basic)',
  'iron(II) acetate',
  'potash alum',
  'tin(II) chloride',
  'potassium dichromate',
  'copper(II) sulfate',
];
const TECH = [
  'block printing',
  'mordant printing',
  'pencilling',
  'resist',
  'roller printing',
  'overdyeing',
  'vat dyeing',
];
const PLACES = [
  'Calderwick',
  'Calderwick print works',
  'coastal workshop',
  'unknown',
  'river valley mill',
  'market town',
];

// Numbers go in as literals (escaping a million of them through the ORM was most of the load time).
const lit = (v: unknown) => (typeof v === 'number' ? String(v) : sequelize.escape(v as string));

/** Multi-row INSERTs of ~1 MB on one connection, in one transaction, with key checks off (throwaway bench data only). */
async function insertRows(table: string, cols: string[], rows: unknown[][], chunk = 5000) {
  await sequelize.transaction(async (transaction) => {
    await sequelize.query('SET SESSION foreign_key_checks = 0, unique_checks = 0', { transaction });
    for (let i = 0; i < rows.length; i += chunk) {
      const values = rows
        .slice(i, i + chunk)
        .map((r) => `(${r.map(lit).join(',')})`)
        .join(',');
      await sequelize.query(`INSERT INTO ${table} (${cols.join(',')}) VALUES ${values}`, { transaction });
    }
    await sequelize.query('SET SESSION foreign_key_checks = 1, unique_checks = 1', { transaction });
  });
}

/** Pieces (all published) each with one photo; returns the photo ids in piece order. */
export async function insertPieces(n: number) {
  const now = new Date();
  const pieces: unknown[][] = [];
  for (let i = 0; i < n; i++) {
    const y = 1650 + Math.floor(rnd() * 250);
    pieces.push([
      `B.${i + 1}`,
      accessionKey(`B.${i + 1}`),
      accessionSortKey(`B.${i + 1}`),
      pick(['furnishing fabric', 'dress fabric', 'panel', 'fragment', 'sample book page']),
      `${words(3)} ${pick(TRADE)}`,
      words(25 + Math.floor(rnd() * 35)),
      `Given ${words(4)}`,
      pick(PLACES),
      JSON.stringify([pick(['cotton', 'linen', 'silk', 'wool'])]),
      JSON.stringify([pick(TECH), pick(TECH)]),
      JSON.stringify([{ name: pick(DYES), evidence: 'attributed' }]),
      JSON.stringify([{ name: pick(MORDANTS), evidence: 'attributed' }]),
      y,
      y + Math.floor(rnd() * 30),
      'published',
      now,
      now,
    ]);
  }
  await insertRows(
    'pieces',
    [
      'accessionNumber',
      'accessionKey',
      'accessionSort',
      'objectName',
      'title',
      'description',
      'provenance',
      'place',
      'fibres',
      'techniques',
      'dyestuffs',
      'historicalMordants',
      'earliestYear',
      'latestYear',
      'status',
      'createdAt',
      'updatedAt',
    ],
    pieces,
    2000,
  );
  const ids = (await sequelize.query('SELECT id FROM pieces ORDER BY id', { type: 'SELECT' })) as Array<{ id: number }>;
  const photos = ids.map((p) => [
    p.id,
    createHash('sha256').update(`bench-${p.id}`).digest('hex'),
    'jpeg',
    1,
    1,
    1,
    '{}',
    '{}',
    now,
    now,
  ]);
  await insertRows(
    'photos',
    ['pieceId', 'sha256', 'format', 'bytes', 'width', 'height', 'exif', 'derivatives', 'createdAt', 'updatedAt'],
    photos,
  );
  return (
    (await sequelize.query('SELECT id FROM photos ORDER BY id', { type: 'SELECT' })) as Array<{ id: number }>
  ).map((p) => p.id);
}

// Common dye shades an archive of printed cottons bunches around (CIELAB D65, approximate, from memory of typical
// madder/indigo/weld colours). Each shade is spread as a real archive spreads it: dye strength, mordant, fibre,
// fading and photography move a "madder red" over tens of ΔE, so the spreads are wide and the shades overlap.
// With these, a ΔE00 5 query at a common shade matches about 17 000 of 166 667 pieces, the figure in the issue.
export const CLUSTERS = [
  { name: 'madder red', L: 42, a: 45, b: 28, sd: [10, 12, 11], w: 0.17 },
  { name: 'madder pink', L: 64, a: 28, b: 12, sd: [9, 9, 7], w: 0.09 },
  { name: 'madder purple', L: 34, a: 16, b: -6, sd: [8, 7, 7], w: 0.06 },
  { name: 'indigo blue', L: 33, a: -2, b: -28, sd: [11, 6, 11], w: 0.17 },
  { name: 'pale indigo', L: 60, a: -6, b: -18, sd: [9, 4, 7], w: 0.07 },
  { name: 'weld yellow', L: 74, a: 3, b: 55, sd: [8, 7, 12], w: 0.07 },
  { name: 'indigo-over-weld green', L: 45, a: -22, b: 18, sd: [9, 8, 9], w: 0.05 },
  { name: 'iron black and grey', L: 28, a: 2, b: 4, sd: [10, 3, 4], w: 0.06 },
  { name: 'chocolate brown', L: 32, a: 14, b: 18, sd: [8, 6, 7], w: 0.08 },
  { name: 'ground off-white', L: 86, a: 1, b: 9, sd: [5, 2, 4], w: 0.1 },
];
// Uniform over the L* 0–100, a* and b* ±100 box.
export const uniformColour = () => ({ L: rnd() * 100, a: rnd() * 200 - 100, b: rnd() * 200 - 100 });

export function clusteredColour() {
  let x = rnd();
  for (const c of CLUSTERS) {
    if ((x -= c.w) < 0) return { L: c.L + gauss() * c.sd[0], a: c.a + gauss() * c.sd[1], b: c.b + gauss() * c.sd[2] };
  }
  return uniformColour();
}

/** Replace every palette row: `perPhoto` colours on each photo, shares summing to 1. */
export async function insertPalettes(
  photoIds: number[],
  perPhoto: number,
  make: () => { L: number; a: number; b: number },
) {
  await sequelize.query('DELETE FROM palette_colours');
  const now = new Date();
  const rows: unknown[][] = [];
  const flush = async () => {
    await insertRows(
      'palette_colours',
      [
        'photoId',
        'variant',
        'rank',
        'L',
        'a',
        'b',
        'hex',
        'share',
        'spread',
        'name',
        'background',
        'source',
        'createdAt',
        'updatedAt',
      ],
      rows.splice(0),
      8000,
    );
  };
  for (const ph of photoIds) {
    const w = Array.from({ length: perPhoto }, () => rnd() + 0.05);
    const sum = w.reduce((s, x) => s + x, 0);
    for (let k = 0; k < perPhoto; k++) {
      const lab = make();
      rows.push([
        ph,
        'raw',
        k + 1,
        lab.L,
        lab.a,
        lab.b,
        labToHex(lab),
        w[k] / sum,
        1,
        'bench',
        0,
        'image-estimate',
        now,
        now,
      ]);
    }
    if (rows.length >= 100_000) await flush();
  }
  await flush();
}
