import { afterAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { createApp } from '../../server/app.ts';
import { issueToken } from '../../server/auth/tokens.ts';
import { Photo, User, sequelize } from '../../server/models/index.ts';
import { makeBatch, makePiece, makeSavedSearch, makeSeries, makeTrial } from '../../server/seed/factories.ts';
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
    // Light exposure is not on this branch: a named empty state, not a made-up number.
    expect(home.lightAllowance).toEqual({ available: false, reason: expect.stringMatching(/Light exposure/) });
  });

  it('makes the same few queries however many rows there are (no query per row)', async () => {
    const curator = await signedInAgent(app, 'curator');
    const before = await queriesFor(curator);
    for (let i = 0; i < 8; i++) await barePhoto((await makePiece({ status: 'draft' })).id);
    expect(await queriesFor(curator)).toBe(before);
    const dyer = await signedInAgent(app, 'dyer');
    const dyerBefore = await queriesFor(dyer);
    const me = await userId('dyer');
    for (let i = 0; i < 5; i++) await makeTrial({ dyerId: me, status: 'in-progress' });
    expect(await queriesFor(dyer)).toBe(dyerBefore);
  });

  it('gives a researcher their saved searches and a named empty state for analyses', async () => {
    const me = await userId('researcher');
    const saved = await makeSavedSearch({ userId: me, name: `Home search ${run}`, query: 'dyestuff=madder' });
    const researcher = await signedInAgent(app, 'researcher');
    const home = (await researcher.get('/api/home').expect(200)).body;
    expect(home.role).toBe('researcher');
    expect(home.recentAnalyses.available).toBe(false);
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
