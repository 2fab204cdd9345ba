import { describe, expect, it } from 'vitest';
import request from 'supertest';
import type { z } from 'zod';
import { createApp } from '../../server/app.ts';
import { Job, Photo, User } from '../../server/models/index.ts';
import { issueToken } from '../../server/auth/tokens.ts';
import { enqueue } from '../../server/jobs/queue.ts';
import { runOnce } from '../../server/jobs/worker.ts';
import { makePiece } from '../../server/seed/factories.ts';
import { resetLinkSchema, resetRequestedSchema, sessionSchema } from '../../shared/schemas/auth.ts';
import { healthSchema } from '../../shared/schemas/health.ts';
import { acceptedResponse, invitationResponse } from '../../shared/schemas/invitations.ts';
import {
  memberResponse,
  pendingInvitationListSchema,
  pendingInvitationResponse,
  teamPageSchema,
} from '../../shared/schemas/team.ts';
import { outboxPageSchema } from '../../shared/schemas/outbox.ts';
import { jobListResponse, jobResponse } from '../../shared/schemas/jobs.ts';
import { fixityLatestSchema } from '../../shared/schemas/fixity.ts';
import { importPreviewSchema, importResultSchema } from '../../shared/schemas/piece-import.ts';
import { ORIGIN, signedInAgent } from '../support/agents.ts';
import { tokenFrom, useTestMail, waitForMail } from '../support/mail.ts';

// The answers of the auth, team, invitations, jobs, outbox, admin-fixity, health and import routes parse with the
// response schemas their OpenAPI contracts name (server/openapi/groups/), and carry no field the schema leaves out
// (zod drops unknown keys, so a parsed answer equal to the sent one has none).
useTestMail();
const app = createApp();

function expectShape<S extends z.ZodType>(schema: S, body: unknown) {
  const parsed = schema.safeParse(body);
  if (!parsed.success)
    throw new Error(
      `answer does not match its schema: ${JSON.stringify(parsed.error.issues)}\n${JSON.stringify(body)}`,
    );
  expect(parsed.data).toEqual(body);
}
const unique = (what: string) =>
  `${what}-${Date.now().toString(36)}-${Math.random().toString(36).slice(2, 6)}@contract.test`;

describe('wire contract of the a2 route groups', () => {
  it('health', async () => {
    expectShape(healthSchema, (await request(app).get('/api/health').expect(200)).body);
  });

  it('auth: login, me, password reset', async () => {
    const agent = request.agent(app);
    expectShape(
      sessionSchema,
      (
        await agent
          .post('/api/auth/login')
          .set('Origin', ORIGIN)
          .send({ email: 'curator@demo.test', password: 'tinctoria-demo' })
          .expect(200)
      ).body,
    );
    expectShape(sessionSchema, (await agent.get('/api/auth/me').expect(200)).body);
    expectShape(
      resetRequestedSchema,
      (
        await request(app)
          .post('/api/auth/password-reset')
          .set('Origin', ORIGIN)
          .send({ email: unique('nobody') })
          .expect(202)
      ).body,
    );
    const user = await User.findOne({ where: { email: 'researcher@demo.test' } });
    const { token, record } = await issueToken({ purpose: 'password-reset', email: user!.email, userId: user!.id });
    expectShape(resetLinkSchema, (await request(app).get(`/api/auth/password-reset/${token}`).expect(200)).body);
    await record.destroy();
  });

  it('invitations and the team', async () => {
    const admin = await signedInAgent(app, 'admin');
    const email = unique('join');
    expectShape(
      invitationResponse,
      (await admin.post('/api/invitations').set('Origin', ORIGIN).send({ email, role: 'dyer' }).expect(201)).body,
    );
    const token = tokenFrom(await waitForMail(email), 'join');
    expectShape(invitationResponse, (await request(app).get(`/api/invitations/${token}`).expect(200)).body);

    const pending = (await admin.get('/api/team/invitations').expect(200)).body;
    expectShape(pendingInvitationListSchema, pending);
    const mine = pending.items.find((i: { email: string }) => i.email === email);
    const resent = (await admin.post(`/api/team/invitations/${mine.id}/resend`).set('Origin', ORIGIN).expect(201)).body;
    expectShape(pendingInvitationResponse, resent);
    const newToken = tokenFrom(await waitForMail(email), 'join');

    const accepted = (
      await request(app)
        .post(`/api/invitations/${newToken}/accept`)
        .set('Origin', ORIGIN)
        .send({ name: 'Contract Tester', password: 'a-long-new-password' })
        .expect(201)
    ).body;
    expectShape(acceptedResponse, accepted);
    expectShape(teamPageSchema, (await admin.get('/api/team?pageSize=200').expect(200)).body);
    expectShape(
      memberResponse,
      (
        await admin
          .patch(`/api/team/${accepted.user.id}`)
          .set('Origin', ORIGIN)
          .send({ role: 'researcher' })
          .expect(200)
      ).body,
    );
  });

  it('outbox', async () => {
    const admin = await signedInAgent(app, 'admin');
    const body = (await admin.get('/api/outbox?pageSize=5').expect(200)).body;
    expect(body.items.length).toBeGreaterThan(0);
    expectShape(outboxPageSchema, body);
  });

  it('jobs and fixity', async () => {
    const admin = await signedInAgent(app, 'admin');
    const piece = await makePiece({ status: 'draft' });
    const photo = await Photo.create({
      pieceId: piece.id,
      trialId: null,
      sha256: 'c'.repeat(64),
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
    const job = await enqueue({
      type: 'ingest-photo',
      payload: { photoId: photo.id },
      subject: { type: 'photo', id: photo.id },
    });
    await Job.update(
      { state: 'failed', error: 'contract', attempts: 3, finishedAt: new Date() },
      { where: { id: job.id } },
    );
    try {
      expectShape(jobListResponse, (await admin.get(`/api/jobs?photoId=${photo.id}`).expect(200)).body);
      expectShape(jobListResponse, (await admin.get('/api/jobs?pageSize=5').expect(200)).body);
      expectShape(jobResponse, (await admin.get(`/api/jobs/${job.id}`).expect(200)).body);
      expectShape(jobResponse, (await admin.post(`/api/jobs/${job.id}/retry`).set('Origin', ORIGIN).expect(200)).body);
    } finally {
      await Job.destroy({ where: { id: job.id } });
      await photo.destroy();
      await piece.destroy({ force: true });
    }

    const started = await admin.post('/api/admin/fixity').set('Origin', ORIGIN);
    expect([200, 202]).toContain(started.status);
    expectShape(jobResponse, started.body);
    expectShape(fixityLatestSchema, (await admin.get('/api/admin/fixity/latest').expect(200)).body);
    // Run the check, so the latest answer carries a report.
    await Job.update({ runAfter: new Date('2000-01-01T00:00:00Z') }, { where: { id: started.body.job.id } });
    await runOnce({ types: ['fixity-check'] });
    const latest = (await admin.get('/api/admin/fixity/latest').expect(200)).body;
    expect(latest.report).not.toBeNull();
    expectShape(fixityLatestSchema, latest);
  });

  it('import: preview and import', async () => {
    const curator = await signedInAgent(app, 'curator');
    const accession = `CT.${Date.now().toString(36).toUpperCase()}`;
    const csv = Buffer.from(
      `accessionNumber,objectName,title,earliestYear\n${accession},panel,Contract import,\n${accession}.2,panel,,not-a-year\n`,
    );
    const send = (dryRun: boolean) =>
      curator
        .post(`/api/import/pieces${dryRun ? '?dryRun=true' : ''}`)
        .set('Origin', ORIGIN)
        .attach('file', csv, { filename: 'p.csv', contentType: 'text/csv' });
    const preview = (await send(true).expect(200)).body;
    expect(preview.invalid).toBe(1);
    expectShape(importPreviewSchema, preview);
    const good = Buffer.from(`accessionNumber,objectName,title\n${accession},panel,Contract import\n`);
    const done = (
      await curator
        .post('/api/import/pieces')
        .set('Origin', ORIGIN)
        .attach('file', good, { filename: 'p.csv', contentType: 'text/csv' })
        .expect(201)
    ).body;
    expectShape(importResultSchema, done);
  });
});
