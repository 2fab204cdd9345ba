import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app.ts';
import { Chemical, PaletteColour, Photo, Piece, sequelize } from '../../server/models/index.ts';
import { makePiece, makeSubstitution, makeTrial, type PieceInput } from '../../server/seed/factories.ts';
import { deltaE00 } from '../../server/search/ciede2000.ts';
import { hexToLab } from '../../shared/search/lab.ts';
import { signedInAgent } from '../support/agents.ts';

const app = createApp();
// Words no other record uses, so counts are ours alone.
const u = `q${Array.from({ length: 10 }, () => 'bcdfghjkmnpqrstvwxz'[Math.floor(Math.random() * 19)]).join('')}`;
const word = (w: string) => `${w}${u}`;
const sha = () => Array.from({ length: 64 }, () => '0123456789abcdef'[Math.floor(Math.random() * 16)]).join('');

async function photoWith(pieceId: number, colours: Array<{ hex: string; share: number }>) {
  const photo = await Photo.create({
    pieceId,
    trialId: null,
    sha256: sha(),
    format: 'jpeg',
    bytes: 1,
    width: 1,
    height: 1,
    originalName: null,
    caption: null,
    capturedAt: null,
    exif: {},
    gps: null,
    derivatives: {},
    referencePatch: null,
    correction: null,
    createdById: null,
  });
  await PaletteColour.bulkCreate(
    colours.map((c, i) => ({
      photoId: photo.id,
      regionId: null,
      variant: 'raw' as const,
      rank: i + 1,
      ...hexToLab(c.hex),
      hex: c.hex,
      share: c.share,
      spread: 1,
      name: 'test',
      tradeName: null,
      background: false,
    })),
  );
  return photo;
}
const piece = (attrs: PieceInput) => makePiece({ status: 'published', ...attrs });

let madderA: Piece, madderB: Piece, weldC: Piece, draftD: Piece;

beforeAll(async () => {
  madderA = await piece({
    title: `Red ground ${word('pomegranate')} hanging`,
    description: `Printed in ${word('alizarin')} reds over strong alum.`,
    earliestYear: 1770,
    latestYear: 1785,
    dyestuffs: [{ name: word('madder'), evidence: 'identified' }],
    historicalMordants: [{ name: word('alum'), evidence: 'identified' }],
    techniques: [word('block')],
    place: word('Calderwick'),
  });
  madderB = await piece({
    title: `Chintz ${word('pomegranate')} border`,
    earliestYear: 1810,
    latestYear: 1820,
    dyestuffs: [
      { name: word('madder'), evidence: 'attributed' },
      { name: word('weld'), evidence: 'attributed' },
    ],
    historicalMordants: [{ name: word('iron'), evidence: 'attributed' }],
    techniques: [word('block')],
    place: word('Calderwick'),
  });
  weldC = await piece({
    title: `Yellow ${word('pomegranate')} sprig`,
    earliestYear: 1790,
    latestYear: 1799,
    dyestuffs: [{ name: word('weld'), evidence: 'identified' }],
    place: word('Harbour'),
  });
  draftD = await piece({
    title: `${word('unpublished')} ${word('pomegranate')} study`,
    status: 'draft',
    dyestuffs: [{ name: word('madder'), evidence: 'identified' }],
  });
  await photoWith(madderA.id, [
    { hex: '#9b2f2f', share: 0.6 },
    { hex: '#e8dcc0', share: 0.4 },
  ]);
  await photoWith(madderB.id, [
    { hex: '#a0342e', share: 0.2 },
    { hex: '#2f4f7f', share: 0.8 },
  ]);
  await photoWith(weldC.id, [{ hex: '#c9a83a', share: 1 }]);
  await photoWith(draftD.id, [{ hex: '#9b2f2f', share: 1 }]);
});
afterAll(async () => {
  await sequelize.close();
});

describe('GET /api/search (text and facets)', () => {
  it('finds by prefix, by a typo (fuzzy) and by accession number, with highlighted words', async () => {
    const byPrefix = await request(app)
      .get('/api/search')
      .query({ q: word('pomegranate').slice(0, -3) });
    expect(byPrefix.status).toBe(200);
    expect(byPrefix.body.items.map((i: { id: number }) => i.id).sort()).toEqual(
      [madderA.id, madderB.id, weldC.id].sort(),
    );
    const typo = word('alizarin').replace('aliz', 'alz');
    const fuzzy = await request(app).get('/api/search').query({ q: typo });
    expect(fuzzy.body.items.map((i: { id: number }) => i.id)).toEqual([madderA.id]);
    const hl = fuzzy.body.items[0].highlights.find((h: { field: string }) => h.field === 'description');
    const [s, e] = hl.marks[0];
    expect(hl.text.slice(s, e)).toBe(word('alizarin').toLowerCase());
    const acc = await request(app).get('/api/search').query({ q: madderB.accessionNumber });
    expect(acc.body.items[0].id).toBe(madderB.id);
  });

  it('counts facets over the text matches and narrows by them (visitor: published only)', async () => {
    const res = await request(app)
      .get('/api/search')
      .query({ q: word('pomegranate') });
    expect(res.body.total).toBe(3);
    const count = (facet: string, value: string) =>
      res.body.facets[facet].find((f: { value: string }) => f.value === value)?.count;
    expect(count('dyestuff', word('madder'))).toBe(2);
    expect(count('dyestuff', word('weld'))).toBe(2);
    expect(count('place', word('Calderwick'))).toBe(2);
    expect(count('century', '18')).toBe(2);
    expect(count('century', '19')).toBe(1);
    expect(res.body.facets.century.find((f: { value: string }) => f.value === '18').label).toBe(
      '18th century (1700–1799)',
    );
    expect(count('status', 'draft')).toBeUndefined();

    const narrowed = await request(app)
      .get('/api/search')
      .query({ q: word('pomegranate'), dyestuff: [word('madder'), word('weld')] });
    expect(narrowed.body.items.map((i: { id: number }) => i.id)).toEqual([madderB.id]);
    const century = await request(app)
      .get('/api/search')
      .query({ q: word('pomegranate'), century: ['18'], mordant: word('alum') });
    expect(century.body.items.map((i: { id: number }) => i.id)).toEqual([madderA.id]);
    // Choosing a century widens within centuries: the other century's count is still shown.
    const c18 = await request(app)
      .get('/api/search')
      .query({ q: word('pomegranate'), century: '18' });
    expect(c18.body.facets.century.find((f: { value: string }) => f.value === '19')?.count).toBe(1);
  });

  it('shows drafts to signed-in users only', async () => {
    const visitor = await request(app)
      .get('/api/search')
      .query({ q: word('unpublished') });
    expect(visitor.body.total).toBe(0);
    const researcher = await signedInAgent(app, 'researcher');
    const seen = await researcher.get('/api/search').query({ q: word('unpublished') });
    expect(seen.body.items.map((i: { id: number }) => i.id)).toEqual([draftD.id]);
    expect((await researcher.get('/api/search').query({ q: word('pomegranate'), status: 'draft' })).body.total).toBe(1);
  });

  it('follows creates, edits, deletes and trials without a restart; a rolled-back write never shows', async () => {
    const p = await piece({ title: `${word('quince')} coverlet` });
    expect(
      (
        await request(app)
          .get('/api/search')
          .query({ q: word('quince') })
      ).body.total,
    ).toBe(1);
    await p.update({ title: `${word('medlar')} coverlet` });
    expect(
      (
        await request(app)
          .get('/api/search')
          .query({ q: word('quince') })
      ).body.total,
    ).toBe(0);
    expect(
      (
        await request(app)
          .get('/api/search')
          .query({ q: word('medlar') })
      ).body.total,
    ).toBe(1);

    const chem = await Chemical.findOne({ where: { role: 'mordant' } });
    const trial = await sequelize.transaction(async (transaction) => {
      const t = await makeTrial(
        {
          code: `TS-${u.slice(-9)}`,
          pieceId: p.id,
          seriesId: null,
          cell: null,
          targetPaletteColourId: null,
          targetRegionId: null,
          targetMeasurementId: null,
          dyerId: null,
          fibre: null,
          weave: null,
          gsm: null,
          dryMassG: 10,
          fastness: null,
          notes: `Bath note ${word('verjuice')}`,
          startedOn: null,
        },
        transaction,
      );
      await makeSubstitution(
        {
          trialId: t.id,
          stepId: null,
          historicalChemicalId: null,
          historicalPractice: 'lead-based red liquor',
          historicalAmountG: null,
          modernChemicalId: chem!.id,
          modernPractice: null,
          modernAmountG: null,
          reason: 'toxicity',
          notes: null,
        },
        transaction,
      );
      return t;
    });
    const viaTrial = await (await signedInAgent(app, 'dyer')).get('/api/search').query({ q: word('verjuice') });
    expect(viaTrial.body.items.map((i: { id: number; viaTrials: string[] }) => [i.id, i.viaTrials])).toEqual([
      [p.id, [trial.code]],
    ]);
    expect(
      (
        await request(app)
          .get('/api/search')
          .query({ q: word('verjuice') })
      ).body.total,
    ).toBe(0);
    const modern = await (
      await signedInAgent(app, 'dyer')
    )
      .get('/api/search')
      .query({ q: word('medlar'), modernMordant: chem!.name });
    expect(modern.body.total).toBe(1);
    // Modern mordants come from trials, which visitors may not read: the filter finds nothing for them.
    expect(
      (
        await request(app)
          .get('/api/search')
          .query({ q: word('medlar'), modernMordant: chem!.name })
      ).body.total,
    ).toBe(0);

    await sequelize
      .transaction(async (transaction) => {
        await p.update({ title: `${word('sloe')} coverlet` }, { transaction });
        throw new Error('roll back');
      })
      .catch(() => {});
    expect(
      (
        await request(app)
          .get('/api/search')
          .query({ q: word('sloe') })
      ).body.total,
    ).toBe(0);

    await p.destroy();
    expect(
      (
        await request(app)
          .get('/api/search')
          .query({ q: word('medlar') })
      ).body.total,
    ).toBe(0);
    expect(
      (await (await signedInAgent(app, 'curator')).get('/api/search').query({ q: word('medlar') })).body.total,
    ).toBe(0);
  });

  it('is open to every role; drafts appear for signed-in roles only (role matrix)', async () => {
    const visitor = await request(app)
      .get('/api/search')
      .query({ q: word('pomegranate') });
    expect([visitor.status, visitor.body.total]).toEqual([200, 3]);
    for (const role of ['admin', 'curator', 'researcher', 'dyer'] as const) {
      const agent = await signedInAgent(app, role);
      const res = await agent.get('/api/search').query({ q: word('pomegranate') });
      expect([role, res.status, res.body.total]).toEqual([role, 200, 4]);
      const shade = await agent
        .get('/api/search/shade')
        .query({ hex: '9b2f2f', q: word('pomegranate'), maxDeltaE: 0.5 });
      expect([role, shade.status, shade.body.items.map((i: { pieceId: number }) => i.pieceId).sort()]).toEqual([
        role,
        200,
        [madderA.id, draftD.id].sort(),
      ]);
    }
  });

  it('answers 400 with per-field details for bad parameters', async () => {
    const res = await request(app)
      .get('/api/search')
      .query({ page: '0', century: 'x', q: 'a'.repeat(201) });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.details.fields).sort()).toEqual(['century.0', 'page', 'q']);
  });
});

describe('GET /api/search/shade', () => {
  it('ranks pieces by ΔE00 then share, equal to a brute-force CIEDE2000 over our colours, combined with text', async () => {
    const res = await request(app)
      .get('/api/search/shade')
      .query({ hex: '9b2f2f', maxDeltaE: 5, q: word('pomegranate') });
    expect(res.status).toBe(200);
    const q = hexToLab('#9b2f2f');
    // madderA holds #9b2f2f itself; madderB's #a0342e is ΔE00 ≈ 1.4 away (computed here by the same formula checked against Sharma 2005).
    expect(res.body.items.map((i: { pieceId: number }) => i.pieceId)).toEqual([madderA.id, madderB.id]);
    expect(res.body.items[0]).toMatchObject({
      accessionNumber: madderA.accessionNumber,
      colour: { hex: '#9b2f2f', share: 0.6, source: 'image-estimate', illuminant: 'D65', observer: '2' },
      deltaE00: 0,
    });
    expect(res.body.items[1].deltaE00).toBeCloseTo(deltaE00(q, hexToLab('#a0342e')), 3);
    expect(res.body.items[1].photoId).toEqual(expect.any(Number));
    const labQuery = await request(app)
      .get('/api/search/shade')
      .query({ ...q, maxDeltaE: 5, q: word('pomegranate') });
    expect(labQuery.body.items.map((i: { pieceId: number }) => i.pieceId)).toEqual([madderA.id, madderB.id]);
    const narrow = await request(app)
      .get('/api/search/shade')
      .query({ hex: '9b2f2f', maxDeltaE: 1, q: word('pomegranate') });
    expect(narrow.body.items.map((i: { pieceId: number }) => i.pieceId)).toEqual([madderA.id]);
    const facet = await request(app)
      .get('/api/search/shade')
      .query({ hex: '9b2f2f', q: word('pomegranate'), dyestuff: word('weld') });
    expect(facet.body.items.map((i: { pieceId: number }) => i.pieceId)).toEqual([madderB.id]);
  });

  it('hides draft pieces from visitors and follows palette edits and deletes', async () => {
    const visitor = await request(app).get('/api/search/shade').query({ hex: '9b2f2f', maxDeltaE: 0.5 });
    expect(visitor.body.items.map((i: { pieceId: number }) => i.pieceId)).not.toContain(draftD.id);
    const curator = await signedInAgent(app, 'curator');
    const seen = await curator.get('/api/search/shade').query({ hex: '9b2f2f', maxDeltaE: 0.5, limit: 200 });
    expect(seen.body.items.map((i: { pieceId: number }) => i.pieceId)).toEqual(
      expect.arrayContaining([madderA.id, draftD.id]),
    );

    const p = await piece({ title: `${word('damson')} swatch` });
    const photo = await photoWith(p.id, [{ hex: '#3d6b45', share: 1 }]);
    const find = () =>
      request(app)
        .get('/api/search/shade')
        .query({ hex: '3d6b45', maxDeltaE: 2, q: word('damson') });
    expect((await find()).body.total).toBe(1);
    await PaletteColour.update({ L: 80, a: 0, b: 0, hex: '#c6c6c6' }, { where: { photoId: photo.id } });
    expect((await find()).body.total).toBe(0);
    await PaletteColour.update({ ...hexToLab('#3d6b45'), hex: '#3d6b45' }, { where: { photoId: photo.id } });
    expect((await find()).body.total).toBe(1);
    await photo.update({ pieceId: null });
    expect((await find()).body.total).toBe(0);
  });

  it('counts the facets over the shade’s matches, with and without words, as a plain count does', async () => {
    type Row = { value: string; count: number };
    const ours = (rows: Row[]) => rows.filter((r) => r.value.endsWith(u.toLowerCase()) || r.value.endsWith(u));
    // A plain count over the pieces the shade returns, from what each was catalogued with in this file.
    const facts = new Map<number, { dyestuff: string[]; place: string[]; century: string[] }>([
      [madderA.id, { dyestuff: [word('madder')], place: [word('Calderwick')], century: ['18'] }],
      [madderB.id, { dyestuff: [word('madder'), word('weld')], place: [word('Calderwick')], century: ['19'] }],
      [weldC.id, { dyestuff: [word('weld')], place: [word('Harbour')], century: ['18'] }],
    ]);
    const plain = (ids: number[], facet: 'dyestuff' | 'place' | 'century') => {
      const n = new Map<string, number>();
      for (const id of ids)
        for (const v of facts.get(id)?.[facet] ?? []) n.set(v.toLowerCase(), (n.get(v.toLowerCase()) ?? 0) + 1);
      return [...n].map(([value, count]) => ({ value, count })).sort((x, y) => x.value.localeCompare(y.value));
    };
    const tidy = (rows: Row[]) =>
      rows
        .map(({ value, count }) => ({ value: value.toLowerCase(), count }))
        .sort((x, y) => x.value.localeCompare(y.value));

    // Words and shade: madderA and madderB match the red; weldC (yellow) matches the words only.
    const words = (
      await request(app)
        .get('/api/search')
        .query({ q: word('pomegranate') })
    ).body;
    const shade = (
      await request(app)
        .get('/api/search/shade')
        .query({ hex: '9b2f2f', maxDeltaE: 5, q: word('pomegranate'), limit: 200 })
    ).body;
    const ids = shade.items.map((i: { pieceId: number }) => i.pieceId);
    expect(ids.sort()).toEqual([madderA.id, madderB.id].sort());
    for (const f of ['dyestuff', 'place', 'century'] as const)
      expect(tidy(f === 'century' ? shade.facets[f] : ours(shade.facets[f])), f).toEqual(plain(ids, f));
    // The words alone count weld twice and Harbour once; with the shade, weld once and Harbour not at all.
    expect(words.facets.dyestuff.find((r: Row) => r.value === word('weld'))?.count).toBe(2);
    expect(shade.facets.dyestuff.find((r: Row) => r.value === word('weld'))?.count).toBe(1);
    expect(shade.facets.place.find((r: Row) => r.value === word('Harbour'))).toBeUndefined();

    // A widening facet chosen (place): its own counts ignore the choice but still follow the shade.
    const placed = (
      await request(app)
        .get('/api/search/shade')
        .query({ hex: '9b2f2f', maxDeltaE: 5, q: word('pomegranate'), place: word('Calderwick') })
    ).body;
    expect(tidy(ours(placed.facets.place))).toEqual(plain(ids, 'place'));
    // A yellow shade with the place chosen: weldC is in Harbour, so the result is empty, yet the place counts show Harbour 1.
    const yellow = (
      await request(app)
        .get('/api/search/shade')
        .query({ hex: 'c9a83a', maxDeltaE: 3, q: word('pomegranate'), place: word('Calderwick') })
    ).body;
    expect(yellow.total).toBe(0);
    expect(tidy(ours(yellow.facets.place))).toEqual([{ value: word('Harbour').toLowerCase(), count: 1 }]);

    // Shade without words: each of our facet counts equals the shade's total with that value chosen.
    const bare = (await request(app).get('/api/search/shade').query({ hex: '9b2f2f', maxDeltaE: 5 })).body;
    for (const row of ours(bare.facets.dyestuff)) {
      const chosen = (
        await request(app).get('/api/search/shade').query({ hex: '9b2f2f', maxDeltaE: 5, dyestuff: row.value })
      ).body;
      expect([row.value, chosen.total]).toEqual([row.value, row.count]);
    }
    expect(ours(bare.facets.dyestuff).length).toBeGreaterThan(0);
  });

  it('answers 400 with per-field details for bad parameters', async () => {
    const cases: Array<[Record<string, string>, string[]]> = [
      [{ hex: 'red' }, ['hex']],
      [{}, ['hex']],
      [{ hex: '9b2f2f', L: '40' }, ['hex']],
      [{ L: '40', a: '10' }, ['b']],
      [{ L: '140', a: '0', b: '0' }, ['L']],
      [{ hex: '9b2f2f', maxDeltaE: '0' }, ['maxDeltaE']],
      [{ hex: '9b2f2f', maxDeltaE: '31', limit: '500' }, ['limit', 'maxDeltaE']],
    ];
    for (const [query, fields] of cases) {
      const res = await request(app).get('/api/search/shade').query(query);
      expect(res.status, JSON.stringify(query)).toBe(400);
      expect(res.body.error.code).toBe('invalid_input');
      expect(Object.keys(res.body.error.details.fields).sort(), JSON.stringify(query)).toEqual(fields);
    }
  });
});
