import { beforeAll, describe, expect, it } from 'vitest';
import sharp from 'sharp';
import { createApp } from '../../server/app.ts';
import { Job, Photo, User } from '../../server/models/index.ts';
import { makePiece } from '../../server/seed/factories.ts';
import { ORIGIN, signedInAgent } from '../support/agents.ts';
import { clothJpeg } from '../support/images.ts';
import { useTestMail } from '../support/mail.ts';

const app = createApp();
let curator: Awaited<ReturnType<typeof signedInAgent>>;
let dyer: Awaited<ReturnType<typeof signedInAgent>>;
useTestMail();
beforeAll(async () => {
  curator = await signedInAgent(app, 'curator');
  dyer = await signedInAgent(app, 'dyer');
});
// Seeds of their own: identical bytes would share one master with another suite's photo.
const seed = () => 100_000 + Math.floor(Math.random() * 1e6);

describe('an upload queues the ingest (previews, palette, deep-zoom tiles) of each new photo', () => {
  it('queues one ingest-photo job per piece photo, visible through the jobs API', async () => {
    const curatorUser = await User.findOne({ where: { email: 'curator@demo.test' }, rejectOnEmpty: true });
    const piece = await makePiece({ createdById: curatorUser.id });
    const res = await curator
      .post(`/api/pieces/${piece.id}/photos`)
      .set('Origin', ORIGIN)
      .attach('photo', await clothJpeg({ seed: seed() }), 'a.jpg')
      .attach('photo', await clothJpeg({ seed: seed() }), 'b.jpg')
      .expect(201);
    for (const photo of res.body.photos as { id: number }[]) {
      const jobs = (await curator.get(`/api/jobs?photoId=${photo.id}`).expect(200)).body.items;
      expect(jobs).toHaveLength(1);
      expect(jobs[0]).toMatchObject({ type: 'ingest-photo' });
      expect(['queued', 'running', 'done']).toContain(jobs[0].state);
      expect((await Photo.findByPk(photo.id))?.ingestStage).not.toBe('failed');
    }
  });

  it('queues the ingest of a trial swatch photo too', async () => {
    const curatorUser = await User.findOne({ where: { email: 'curator@demo.test' }, rejectOnEmpty: true });
    const piece = await makePiece({ createdById: curatorUser.id, status: 'published' });
    const trial = (
      await dyer.post(`/api/pieces/${piece.id}/trials`).set('Origin', ORIGIN).send({ dryMassG: 10 }).expect(201)
    ).body.trial;
    const swatch = await sharp({ create: { width: 200, height: 140, channels: 3, background: '#7a3b5c' } })
      .png()
      .toBuffer();
    const up = await dyer
      .post(`/api/trials/${trial.id}/photos`)
      .set('Origin', ORIGIN)
      .attach('photo', swatch, 'swatch.png')
      .expect(201);
    const jobs = await Job.findAll({
      where: { type: 'ingest-photo', subjectType: 'photo', subjectId: up.body.photo.id },
    });
    expect(jobs).toHaveLength(1);
  });
});
