import { readFileSync } from 'node:fs';
import { afterAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { differenceCmc } from 'culori';
import { createApp } from '../../server/app.ts';
import { AppSetting, sequelize } from '../../server/models/index.ts';
import { VERDICT_BANDS_KEY } from '../../server/services/settings.ts';
import { ORIGIN, signedInAgent } from '../support/agents.ts';

const app = createApp();
afterAll(() => sequelize.close());

type Pair = {
  pair: number;
  L1: number;
  a1: number;
  b1: number;
  L2: number;
  a2: number;
  b2: number;
  dE00: number;
  decimals: number;
};
// Sharma, Wu & Dalal (2005), Color Res. Appl. 30(1):21–30, Table 1 (tests/reference/ciede2000-sharma2005.json).
const pairs = JSON.parse(
  readFileSync(new URL('../reference/ciede2000-sharma2005.json', import.meta.url), 'utf8'),
) as Pair[];

const difference = (reference: object, sample: object) =>
  request(app).post('/api/colour/difference').set('Origin', ORIGIN).send({ reference, sample });

describe('POST /api/colour/difference', () => {
  it.each(pairs.map((p) => [p.pair, p] as const))(
    'matches Sharma et al. (2005) pair %i in both orders',
    async (_n, p) => {
      const one = { L: p.L1, a: p.a1, b: p.b1 };
      const two = { L: p.L2, a: p.a2, b: p.b2 };
      const tolerance = 0.5 * 10 ** -p.decimals;
      const ab = await difference(one, two).expect(200);
      const ba = await difference(two, one).expect(200);
      expect(Math.abs(ab.body.deltaE00 - p.dE00)).toBeLessThanOrEqual(tolerance);
      expect(Math.abs(ba.body.deltaE00 - p.dE00)).toBeLessThanOrEqual(tolerance);
    },
  );

  it('gives CMC(2:1) and CMC(1:1) as culori 4.0.2 computes them, with the reference as the standard', async () => {
    // culori is an independent library; its CMC takes (l, c) and reads its first colour as the standard. Lab D65 = culori's 'lab65'.
    const cases = [
      [
        { L: 45, a: 48, b: 28 },
        { L: 47.5, a: 44, b: 31 },
      ],
      [
        { L: 30, a: 8, b: -35 },
        { L: 33, a: 5, b: -30 },
      ],
      [
        { L: 62, a: -20, b: 45 },
        { L: 60, a: -24, b: 40 },
      ],
    ] as const;
    for (const [reference, sample] of cases) {
      const res = await difference(reference, sample).expect(200);
      const std = { mode: 'lab65' as const, l: reference.L, a: reference.a, b: reference.b };
      const smp = { mode: 'lab65' as const, l: sample.L, a: sample.a, b: sample.b };
      expect(res.body.cmc21).toBeCloseTo(differenceCmc(2, 1)(std, smp), 6);
      expect(res.body.cmc11).toBeCloseTo(differenceCmc(1, 1)(std, smp), 6);
      // CMC is not symmetric: swapping standard and sample changes it.
      const swapped = await difference(sample, reference).expect(200);
      expect(swapped.body.cmc21).not.toBeCloseTo(res.body.cmc21, 6);
    }
  });

  it('explains the difference in words and gives the verdict from the default bands (common practice)', async () => {
    const res = await difference({ L: 45, a: 48, b: 28 }, { L: 52, a: 40, b: 28 }).expect(200);
    // h_ab 30.3° → 35.0°: a red whose hue angle grows turns yellower (CIE 15 components, sample minus standard).
    expect(res.body.words).toEqual(['lighter', 'duller', 'yellower']);
    expect(res.body.dL).toBeCloseTo(7, 9);
    expect(res.body.dH).toBeGreaterThan(0);
    expect(res.body.dL ** 2 + res.body.dC ** 2 + res.body.dH ** 2).toBeCloseTo(res.body.deltaEab ** 2, 9);
    expect(res.body.verdict).toBe('different');
    expect(res.body.bands).toEqual({ match: 1, close: 2, near: 4 });
    expect(res.body.bandsSource).toMatch(/common practice/);
  });

  it('refuses colours out of range with per-field details', async () => {
    const res = await difference({ L: 140, a: 0, b: 0 }, { L: 50, a: 'red', b: 0 }).expect(400);
    expect(Object.keys(res.body.error.details.fields)).toEqual(expect.arrayContaining(['reference.L', 'sample.a']));
  });

  it('lets only an admin change the verdict bands, which then decide the verdict', async () => {
    const dyer = await signedInAgent(app, 'dyer');
    const admin = await signedInAgent(app, 'admin');
    const body = { bands: { match: 0.5, close: 1.5, near: 3 }, source: 'studio tolerance agreed for this test' };
    await dyer.put('/api/colour/verdict-bands').set('Origin', ORIGIN).send(body).expect(403);
    await admin
      .put('/api/colour/verdict-bands')
      .set('Origin', ORIGIN)
      .send({ ...body, bands: { match: 2, close: 1, near: 3 } })
      .expect(400);
    try {
      await admin.put('/api/colour/verdict-bands').set('Origin', ORIGIN).send(body).expect(200);
      // A lightness step with ΔE00 between 0.5 and 1: "match" under the defaults, "close" under the admin's bands.
      const res = await difference({ L: 50, a: 0, b: 0 }, { L: 50.8, a: 0, b: 0 }).expect(200);
      expect(res.body.deltaE00).toBeGreaterThan(0.5);
      expect(res.body.deltaE00).toBeLessThanOrEqual(1);
      expect(res.body.verdict).toBe('close');
      expect(res.body.bandsSource).toBe(body.source);
    } finally {
      await AppSetting.destroy({ where: { key: VERDICT_BANDS_KEY } });
    }
  });
});
