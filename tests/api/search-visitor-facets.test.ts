import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app.ts';
import { Chemical, Piece, sequelize } from '../../server/models/index.ts';
import { makePiece, makeSubstitution, makeTrial } from '../../server/seed/factories.ts';
import { signedInAgent } from '../support/agents.ts';

const app = createApp();
// Words no other record uses, so every count below is ours alone.
const u = `v${Array.from({ length: 10 }, () => 'bcdfghjkmnpqrstvwxz'[Math.floor(Math.random() * 19)]).join('')}`;
const word = (w: string) => `${w}${u}`;
type Row = { value: string; count: number };
const countsOf = (rows: Row[]) => Object.fromEntries(rows.map((r) => [r.value, r.count]));

let published: Piece, modernName: string;

beforeAll(async () => {
  published = await makePiece({
    status: 'published',
    title: `${word('cornflower')} published handkerchief`,
    dyestuffs: [{ name: word('madder'), evidence: 'identified' }],
    historicalMordants: [{ name: word('alum'), evidence: 'identified' }],
    place: word('Weldfold'),
  });
  await makePiece({
    status: 'draft',
    title: `${word('cornflower')} draft handkerchief`,
    dyestuffs: [
      { name: word('madder'), evidence: 'identified' },
      { name: word('secretwoad'), evidence: 'attributed' },
    ],
    historicalMordants: [{ name: word('alum'), evidence: 'identified' }],
    place: word('Hiddenham'),
  });
  const chem = await Chemical.findOne({ where: { role: 'mordant' } });
  modernName = chem!.name;
  await sequelize.transaction(async (transaction) => {
    const t = await makeTrial(
      {
        code: `TV-${u.slice(-9)}`,
        pieceId: published.id,
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
        notes: null,
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
  });
});

afterAll(async () => {
  await sequelize.close();
});

describe('facet counts a visitor sees', () => {
  it('count only published pieces and leave out values that come from trials', async () => {
    const visitor = await request(app)
      .get('/api/search')
      .query({ q: word('cornflower') });
    expect(visitor.status).toBe(200);
    expect(visitor.body.total).toBe(1);
    const f = visitor.body.facets;
    // The draft's dyestuff and place neither appear nor add to a shared value's count.
    expect(countsOf(f.dyestuff)).toEqual({ [word('madder')]: 1 });
    expect(countsOf(f.historicalMordant)).toEqual({ [word('alum')]: 1 });
    expect(countsOf(f.place)).toEqual({ [word('Weldfold')]: 1 });
    expect(countsOf(f.status)).toEqual({ published: 1 });
    // Modern mordants are read from trials: nothing for a role that may not read trials.
    expect(f.modernMordant).toEqual([]);
    // Nor can a visitor probe for them with a filter.
    const probe = await request(app)
      .get('/api/search')
      .query({ q: word('cornflower'), modernMordant: modernName });
    expect([probe.body.total, probe.body.facets.dyestuff]).toEqual([0, []]);
    const eitherKind = await request(app)
      .get('/api/search')
      .query({ q: word('cornflower'), mordant: modernName });
    expect(eitherKind.body.total).toBe(0);
  });

  it('count drafts and trial-derived values for signed-in roles that may read them', async () => {
    const researcher = await (
      await signedInAgent(app, 'researcher')
    )
      .get('/api/search')
      .query({ q: word('cornflower') });
    const f = researcher.body.facets;
    expect(researcher.body.total).toBe(2);
    expect(countsOf(f.dyestuff)).toEqual({ [word('madder')]: 2, [word('secretwoad')]: 1 });
    expect(countsOf(f.status)).toEqual({ published: 1, draft: 1 });
    expect(countsOf(f.modernMordant)).toEqual({ [modernName]: 1 });
    const filtered = await (
      await signedInAgent(app, 'dyer')
    )
      .get('/api/search')
      .query({ q: word('cornflower'), modernMordant: modernName });
    expect(filtered.body.items.map((i: { id: number }) => i.id)).toEqual([published.id]);
  });
});
