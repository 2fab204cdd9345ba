import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import type { z } from 'zod';
import { createApp } from '../../server/app.ts';
import { sequelize } from '../../server/models/index.ts';
import { makePiece } from '../../server/seed/factories.ts';
import {
  dublinCoreSchema,
  pieceDetailResponse,
  pieceHistoryResponse,
  pieceListResponse,
  pieceResponse,
} from '../../shared/schemas/piece.ts';
import { pieceTrialsResponse, trialSavedAnswer } from '../../shared/schemas/trial.ts';
import {
  palettesResponse,
  photoResponse,
  photoUploadResponse,
  referencePatchResponse,
  regionListResponse,
  regionSavedResponse,
} from '../../shared/schemas/photo.ts';
import { searchResponse, shadeResponse } from '../../shared/schemas/search.ts';
import { annotationPageSchema, imageInfoSchema, manifestSchema } from '../../shared/schemas/iiif.ts';
import { ORIGIN, signedInAgent } from '../support/agents.ts';
import { clothJpeg } from '../support/images.ts';
import { ingested } from '../support/photos.ts';
import { useTestMail } from '../support/mail.ts';

/**
 * The wire contract of the pieces, photos, search and IIIF routes (server/openapi/groups/): every
 * answer parses with its response schema from shared/schemas, on the demo data and on fresh rows.
 * A parse failure names the path and the field that differs.
 */
const app = createApp();
useTestMail();
afterAll(() => sequelize.close());

type Agent = Awaited<ReturnType<typeof signedInAgent>>;
let curator: Agent;
let admin: Agent;
let dyer: Agent;
beforeAll(async () => {
  [curator, admin, dyer] = await Promise.all([
    signedInAgent(app, 'curator'),
    signedInAgent(app, 'admin'),
    signedInAgent(app, 'dyer'),
  ]);
});

function fits<S extends z.ZodType>(schema: S, body: unknown): z.infer<S> {
  const result = schema.safeParse(body);
  if (!result.success)
    throw new Error(`answer does not fit its schema: ${JSON.stringify(result.error.issues.slice(0, 5), null, 1)}`);
  return result.data;
}

const run = `${Date.now() % 1_000_000}`;

describe('pieces answer as shared/schemas/piece.ts says', () => {
  it('lists and shows every demo piece as a visitor and as a curator', async () => {
    const visitorList = fits(pieceListResponse, (await request(app).get('/api/pieces').expect(200)).body);
    expect(visitorList.pageSize).toBe(25);
    const list = fits(
      pieceListResponse,
      (await curator.get('/api/pieces?pageSize=100&sort=updatedAt&dir=desc').expect(200)).body,
    );
    expect(list.items.length).toBeGreaterThan(0);
    for (const row of list.items.slice(0, 40))
      fits(pieceDetailResponse, (await curator.get(`/api/pieces/${row.id}`).expect(200)).body);
    for (const row of visitorList.items.slice(0, 10))
      fits(pieceDetailResponse, (await request(app).get(`/api/pieces/${row.id}`).expect(200)).body);
    fits(pieceListResponse, (await curator.get('/api/pieces?deleted=only').expect(200)).body);
  });

  it('creates, changes, deletes, restores and tells the history of a piece; exports its Dublin Core record', async () => {
    const body = {
      accessionNumber: `2098.${run}.1`,
      objectName: 'fragment',
      title: 'Contract piece',
      dateEdtf: '1780~',
      fibres: ['cotton'],
      dyestuffs: [{ name: 'madder', evidence: 'attributed' }],
      heightMm: 120.5,
    };
    const created = fits(
      pieceResponse,
      (await curator.post('/api/pieces').set('Origin', ORIGIN).send(body).expect(201)).body,
    );
    const id = created.piece.id;
    fits(
      pieceResponse,
      (
        await curator
          .patch(`/api/pieces/${id}`)
          .set('Origin', ORIGIN)
          .send({ title: 'Contract piece, renamed' })
          .expect(200)
      ).body,
    );
    fits(dublinCoreSchema, JSON.parse((await curator.get(`/api/pieces/${id}/dublin-core.jsonld`).expect(200)).text));
    await curator.delete(`/api/pieces/${id}`).set('Origin', ORIGIN).expect(204);
    const restored = fits(
      pieceResponse,
      (await admin.post(`/api/pieces/${id}/restore`).set('Origin', ORIGIN).expect(200)).body,
    );
    expect(restored.piece.deletedAt).toBeNull();
    const history = fits(pieceHistoryResponse, (await curator.get(`/api/pieces/${id}/history`).expect(200)).body);
    expect(history.items.length).toBeGreaterThanOrEqual(3);
  });

  it("lists a piece's trials and attaches a new one", async () => {
    const piece = await makePiece({ status: 'published' });
    fits(
      trialSavedAnswer,
      (await dyer.post(`/api/pieces/${piece.id}/trials`).set('Origin', ORIGIN).send({ dryMassG: 12 }).expect(201)).body,
    );
    const list = fits(pieceTrialsResponse, (await dyer.get(`/api/pieces/${piece.id}/trials`).expect(200)).body);
    expect(list.items).toHaveLength(1);
    expect(list.pageSize).toBe(100);
  });
});

describe('photos answer as shared/schemas/photo.ts says', () => {
  it('uploads, shows, changes a photo, its regions, reference patch and palette', async () => {
    const piece = await makePiece();
    const up = fits(
      photoUploadResponse,
      (
        await curator
          .post(`/api/pieces/${piece.id}/photos`)
          .set('Origin', ORIGIN)
          .attach('photo', await clothJpeg({ seed: 700_000 + (Number(run) % 1000), gps: true }), 'contract.jpg')
          .expect(201)
      ).body,
    );
    const photo = up.photos[0];
    fits(photoResponse, (await curator.get(`/api/photos/${photo.id}`).expect(200)).body);
    fits(photoResponse, (await admin.get(`/api/photos/${photo.id}`).expect(200)).body);
    fits(photoResponse, (await dyer.get(`/api/photos/${photo.id}`).expect(200)).body);
    fits(
      photoResponse,
      (
        await curator
          .patch(`/api/photos/${photo.id}`)
          .set('Origin', ORIGIN)
          .send({ caption: 'contract', view: 'detail' })
          .expect(200)
      ).body,
    );
    const added = fits(
      regionSavedResponse,
      (
        await curator
          .post(`/api/photos/${photo.id}/regions`)
          .set('Origin', ORIGIN)
          .send({ x: 10, y: 10, w: 50, h: 40, purpose: 'colour-area', label: 'red' })
          .expect(201)
      ).body,
    );
    fits(regionListResponse, (await curator.get(`/api/photos/${photo.id}/regions`).expect(200)).body);
    fits(
      regionSavedResponse,
      (
        await curator
          .patch(`/api/photos/${photo.id}/regions/${added.region.id}`)
          .set('Origin', ORIGIN)
          .send({ label: null })
          .expect(200)
      ).body,
    );
    const set = fits(
      referencePatchResponse,
      (
        await curator
          .put(`/api/photos/${photo.id}/reference-patch`)
          .set('Origin', ORIGIN)
          .send({ x: 0, y: 0, w: 8, h: 8 })
          .expect(200)
      ).body,
    );
    expect(set.referencePatch).toEqual({ x: 0, y: 0, w: 8, h: 8 });
    const colour = set.palettes[0].colours[0];
    fits(
      palettesResponse,
      (
        await curator
          .patch(`/api/photos/${photo.id}/palette/${colour.id}`)
          .set('Origin', ORIGIN)
          .send({ background: true })
          .expect(200)
      ).body,
    );
    fits(
      referencePatchResponse,
      (await curator.delete(`/api/photos/${photo.id}/reference-patch`).set('Origin', ORIGIN).expect(200)).body,
    );
    fits(
      palettesResponse,
      (await curator.delete(`/api/photos/${photo.id}/regions/${added.region.id}`).set('Origin', ORIGIN).expect(200))
        .body,
    );
    fits(pieceDetailResponse, (await curator.get(`/api/pieces/${piece.id}`).expect(200)).body);
  });
});

describe('search answers as shared/schemas/search.ts says', () => {
  it('text and shade search, for a visitor and for a curator', async () => {
    for (const agent of [request(app), curator] as const) {
      fits(searchResponse, (await agent.get('/api/search').expect(200)).body);
      const text = fits(searchResponse, (await agent.get('/api/search?q=madder&century=18').expect(200)).body);
      expect(text.pageSize).toBe(20);
      fits(searchResponse, (await agent.get('/api/search?q=indigo&fibre=cotton&page=2').expect(200)).body);
      fits(shadeResponse, (await agent.get('/api/search/shade?hex=9b2f2f&maxDeltaE=10').expect(200)).body);
      fits(shadeResponse, (await agent.get('/api/search/shade?L=40&a=20&b=-30&limit=5').expect(200)).body);
    }
  });
});

describe('IIIF answers as shared/schemas/iiif.ts says', () => {
  it('manifest, annotation page and info.json of a tiled photo', async () => {
    const piece = await makePiece({
      status: 'published',
      title: 'Contract manifest',
      description: 'For the contract test.',
      creditLine: 'Test credit',
      techniques: ['resist'],
    });
    const up = await curator
      .post(`/api/pieces/${piece.id}/photos`)
      .set('Origin', ORIGIN)
      .attach('photo', await clothJpeg({ seed: 800_000 + (Number(run) % 1000) }), 'tiles.jpg')
      .expect(201);
    const photoId: number = up.body.photos[0].id;
    await curator
      .post(`/api/photos/${photoId}/regions`)
      .set('Origin', ORIGIN)
      .send({ x: 5, y: 5, w: 30, h: 30, purpose: 'motif' })
      .expect(201);
    // Before its ingest the photo has no image to paint yet; after, the tiles' whole image with its service.
    const waiting = fits(
      manifestSchema,
      JSON.parse((await request(app).get(`/iiif/${piece.id}/manifest.json`).expect(200)).text),
    );
    expect(waiting.items).toHaveLength(0);
    await ingested(photoId);
    const manifest = fits(
      manifestSchema,
      JSON.parse((await request(app).get(`/iiif/${piece.id}/manifest.json`).expect(200)).text),
    );
    expect(manifest.items).toHaveLength(1);
    fits(
      annotationPageSchema,
      JSON.parse((await request(app).get(`/iiif/photos/${photoId}/annotations.json`).expect(200)).text),
    );
    fits(imageInfoSchema, JSON.parse((await request(app).get(`/iiif/photos/${photoId}/info.json`).expect(200)).text));
  }, 60_000);
});
