import { afterAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { createApp } from '../../server/app.ts';
import { issueToken } from '../../server/auth/tokens.ts';
import { Photo, User, sequelize } from '../../server/models/index.ts';
import {
  makeAnalysis,
  makeBatch,
  makeDisplayPeriod,
  makePiece,
  makeSavedSearch,
  makeSeries,
  makeTrial,
} from '../../server/seed/factories.ts';
import { signedInAgent } from '../support/agents.ts';

const app = createApp();
afterAll(() => sequelize.close());
const run = `${Date.now() % 1_000_000}`;
const userId = async (role: string) =>
  (await User.findOne({ where: { email: `${role}@demo.test` }, rejectOnEmpty: true })).id;

async function barePhoto(pieceId: number) {
  return Photo.create({
    pieceId,
    trialId: null,
    sha256: 'f'.repeat(64),
    format: 'jpeg',
    bytes: 1,
    width: 10,
    height: 10,
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
}

/** How many SQL statements one GET /api/home makes. */
async function queriesFor(agent: Awaited<ReturnType<typeof signedInAgent>>) {
  let n = 0;
  const hook = () => void n++;
  sequelize.addHook('beforeQuery', 'count-home', hook);
  try {
    await agent.get('/api/home').expect(200);
  } finally {
    sequelize.removeHook('beforeQuery', 'count-home');
  }
  return n;
}

describe('GET /api/home', () => {
  it('asks a visitor to sign in (the public landing page needs no API)', async () => {
    await request(app).get('/api/home').expect(401);
  });

  it('gives a curator the drafts to publish and photos without a reference patch, newest first', async () => {
    const draft = await makePiece({ status: 'draft', title: `Home draft ${run}` });
    const published = await makePiece({ status: 'published', title: `Home published ${run}` });
    const photo = await barePhoto(published.id);
    const curator = await signedInAgent(app, 'curator');
    const home = (await curator.get('/api/home').expect(200)).body;
    expect(home.role).toBe('curator');
    expect(home.drafts.items[0]).toMatchObject({ id: draft.id, title: `Home draft ${run}` });
    expect(home.drafts.total).toBeGreaterThanOrEqual(1);
    expect(home.photosWithoutReference.items[0]).toMatchObject({
      id: photo.id,
      pieceId: published.id,
      thumbUrl: `/media/photos/${photo.id}/thumb`,
    });
  });

  it('gives a curator the pieces near their light allowance, most used first', async () => {
    // This calendar year, 50 lx × 8 h a day: 40 days are 16 000 lx·h, 10 days 4 000 lx·h (CIE 157:2004's annual
    // limits as recorded in shared/data/light-sensitivity.ts: 15 000 lx·h for high responsivity — weld —, 150 000
    // for medium — madder).
    const year = new Date().getUTCFullYear();
    const period = (pieceId: number, days: number) =>
      makeDisplayPeriod({
        pieceId,
        fromDate: `${year}-01-01`,
        toDate: `${year}-01-${String(days).padStart(2, '0')}`,
        lux: 50,
        hoursPerDay: 8,
      });
    const over = await makePiece({ title: `Home over ${run}`, dyestuffs: [{ name: 'weld', evidence: 'attributed' }] });
    await period(over.id, 20);
    await makeDisplayPeriod({
      pieceId: over.id,
      fromDate: `${year}-02-01`,
      toDate: `${year}-02-20`,
      lux: 50,
      hoursPerDay: 8,
    });
    const near = await makePiece({ title: `Home near ${run}`, dyestuffs: [{ name: 'weld', evidence: 'attributed' }] });
    await period(near.id, 31); // 12 400 of 15 000: 83 %
    const far = await makePiece({ title: `Home far ${run}`, dyestuffs: [{ name: 'madder', evidence: 'attributed' }] });
    await period(far.id, 31); // 12 400 of 150 000: 8 %
    const gone = await makePiece({ title: `Home gone ${run}`, dyestuffs: [{ name: 'weld', evidence: 'attributed' }] });
    await period(gone.id, 31);
    await gone.destroy();

    const curator = await signedInAgent(app, 'curator');
    const { lightAllowance } = (await curator.get('/api/home').expect(200)).body;
    const ids = lightAllowance.items.map((p: { id: number }) => p.id);
    expect(lightAllowance.total).toBeGreaterThanOrEqual(2);
    const mine = lightAllowance.items.filter((p: { id: number }) => [over.id, near.id].includes(p.id));
    expect(mine).toEqual([
      {
        id: over.id,
        accessionNumber: over.accessionNumber,
        title: `Home over ${run}`,
        categoryLabel: 'high responsivity',
        luxHours: 16_000,
        thisYearUsed: expect.closeTo(16_000 / 15_000, 9),
        totalUsed: expect.closeTo(16_000 / 15_000, 9),
      },
      expect.objectContaining({ id: near.id, luxHours: 12_400, thisYearUsed: expect.closeTo(12_400 / 15_000, 9) }),
    ]);
    expect(ids).not.toContain(far.id);
    expect(ids).not.toContain(gone.id);
  });

  it('makes the same few queries however many rows there are (no query per row)', async () => {
    const curator = await signedInAgent(app, 'curator');
    const before = await queriesFor(curator);
    for (let i = 0; i < 8; i++) {
      const piece = await makePiece({ status: 'draft' });
      await barePhoto(piece.id);
      await makeDisplayPeriod({ pieceId: piece.id, lux: 200, hoursPerDay: 10 });
    }
    expect(await queriesFor(curator)).toBe(before);
    const researcher = await signedInAgent(app, 'researcher');
    const researcherBefore = await queriesFor(researcher);
    for (let i = 0; i < 8; i++) await makeAnalysis({ pieceId: (await makePiece({})).id });
    expect(await queriesFor(researcher)).toBe(researcherBefore);
    const dyer = await signedInAgent(app, 'dyer');
    const dyerBefore = await queriesFor(dyer);
    const me = await userId('dyer');
    for (let i = 0; i < 5; i++) await makeTrial({ dyerId: me, status: 'in-progress' });
    expect(await queriesFor(dyer)).toBe(dyerBefore);
  });

  it('gives a researcher the recent analyses (newest first, theirs marked) and their saved searches', async () => {
    const me = await userId('researcher');
    const saved = await makeSavedSearch({ userId: me, name: `Home search ${run}`, query: 'dyestuff=madder' });
    const today = new Date().toISOString().slice(0, 10);
    const piece = await makePiece({ title: `Home analysed ${run}` });
    const older = await makeAnalysis({ pieceId: piece.id, method: 'XRF', analysedOn: '2001-01-01' });
    const newest = await makeAnalysis({
      pieceId: piece.id,
      method: 'HPLC-DAD',
      analysedOn: today,
      laboratory: 'Invented conservation lab',
      findings: [{ substance: 'alizarin', confidence: 'confirmed' }],
      createdById: me,
    });
    const gone = await makePiece({});
    const ofGone = await makeAnalysis({ pieceId: gone.id, analysedOn: today });
    await gone.destroy();
    const researcher = await signedInAgent(app, 'researcher');
    const home = (await researcher.get('/api/home').expect(200)).body;
    expect(home.role).toBe('researcher');
    expect(home.recentAnalyses.items[0]).toEqual({
      id: newest.id,
      pieceId: piece.id,
      accessionNumber: piece.accessionNumber,
      title: `Home analysed ${run}`,
      method: 'HPLC-DAD',
      analysedOn: today,
      laboratory: 'Invented conservation lab',
      findings: 1,
      mine: true,
    });
    const ids = home.recentAnalyses.items.map((a: { id: number }) => a.id);
    expect(ids).not.toContain(ofGone.id);
    expect(ids).not.toContain(older.id);
    // The demo's seven analyses and the two of this test's piece still in the archive.
    expect(home.recentAnalyses.total).toBeGreaterThanOrEqual(9);
    expect(home.savedSearches.items[0]).toMatchObject({ id: saved.id, href: '/search?dyestuff=madder' });
  });

  it('gives a dyer their trials in progress, baths due a check and planned series', async () => {
    const me = await userId('dyer');
    const trial = await makeTrial({ dyerId: me, status: 'in-progress', code: `H-${run}`.slice(0, 16) });
    const others = await makeTrial({ dyerId: null, status: 'in-progress' });
    const bath = await makeBatch({ code: `HB-${run}`.slice(0, 20), madeById: me, checkBy: '2000-01-01' });
    const notDue = await makeBatch({ code: `HN-${run}`.slice(0, 20), madeById: me, checkBy: '2999-01-01' });
    const series = await makeSeries({
      code: `HS-${run}`.slice(0, 20),
      title: 'Home series',
      factors: [{ name: 'tannin', levels: ['0', '10'] }],
      cells: [{ tannin: '0' }, { tannin: '10' }],
      ownerId: me,
    });
    const dyer = await signedInAgent(app, 'dyer');
    const home = (await dyer.get('/api/home').expect(200)).body;
    expect(home.role).toBe('dyer');
    expect(home.trialsInProgress.items[0]).toMatchObject({ id: trial.id, status: 'in-progress' });
    expect(home.trialsInProgress.items.some((t: { id: number }) => t.id === others.id)).toBe(false);
    const baths = home.bathsDue.items.map((b: { id: number }) => b.id);
    expect(baths).toContain(bath.id);
    expect(baths).not.toContain(notDue.id);
    expect(home.plannedSeries.items.find((s: { id: number }) => s.id === series.id)).toMatchObject({
      cells: 2,
      planned: 2,
      inProgress: 0,
    });
  });

  it('gives an admin the team by role, pending invitations, fixity and the job queue', async () => {
    const email = `home-invite-${run}@demo-home.test`;
    await issueToken({ purpose: 'invitation', email, role: 'researcher' });
    const admin = await signedInAgent(app, 'admin');
    const home = (await admin.get('/api/home').expect(200)).body;
    expect(home.role).toBe('admin');
    expect(home.team.members.map((m: { role: string }) => m.role)).toEqual(['admin', 'curator', 'researcher', 'dyer']);
    expect(home.team.members.find((m: { role: string }) => m.role === 'dyer').active).toBeGreaterThanOrEqual(2);
    expect(home.pendingInvitations.total).toBeGreaterThanOrEqual(1);
    expect(home.fixity.state).toMatch(/never|queued|running|done|failed/);
    expect(home.jobs).toMatchObject({
      queued: expect.any(Number),
      running: expect.any(Number),
      failed: expect.any(Number),
    });
  });
});
