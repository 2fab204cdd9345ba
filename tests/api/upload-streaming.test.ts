import { afterAll, afterEach, beforeAll, describe, expect, it, vi } from 'vitest';
import { existsSync } from 'node:fs';
import { readdir, readFile } from 'node:fs/promises';
import path from 'node:path';
import express from 'express';
import request from 'supertest';
import { createApp } from '../../server/app.ts';
import { errorHandler } from '../../server/http/errors.ts';
import { receiveUpload, uploadBudget } from '../../server/http/upload.ts';
import { resolveInsideUploads, uploadsDir } from '../../server/media/paths.ts';
import { Photo, sequelize } from '../../server/models/index.ts';
import { makePiece } from '../../server/seed/factories.ts';
import { ORIGIN, signedInAgent } from '../support/agents.ts';
import { clothJpeg } from '../support/images.ts';

const app = createApp();
let jpeg: Buffer;
const limits = { ...uploadBudget };
beforeAll(async () => {
  jpeg = await clothJpeg({ seed: 41 });
});
afterEach(() => {
  uploadBudget.maxRequestBytes = limits.maxRequestBytes;
  uploadBudget.maxProcessBytes = limits.maxProcessBytes;
  uploadBudget.maxConcurrent = limits.maxConcurrent;
});
afterAll(() => sequelize.close());

/** Upload temp files left in uploads/tmp. */
const tempUploads = async () =>
  (await readdir(path.join(uploadsDir(), 'tmp')).catch(() => [] as string[])).filter((n) => n.startsWith('upload-'));

describe('uploads stream to disk', () => {
  it("writes an upload's bytes to a temp file (no buffer in memory) and removes it once answered", async () => {
    const seen: Array<{ path: string; buffer: unknown; bytes: Buffer }> = [];
    const probe = express();
    probe.post(
      '/u',
      receiveUpload({ field: 'file', maxFiles: 1, maxBytes: 1024 * 1024, maxFields: 1, tooLarge: () => 'too large' }),
      async (req, res) => {
        const file = req.file!;
        seen.push({ path: file.path, buffer: file.buffer, bytes: await readFile(file.path) });
        res.json({ ok: true });
      },
    );
    probe.use(errorHandler);
    await request(probe).post('/u').attach('file', jpeg, 'a.jpg').expect(200);
    expect(seen).toHaveLength(1);
    expect(seen[0].buffer).toBeUndefined();
    expect(seen[0].bytes.equals(jpeg)).toBe(true);
    expect(path.relative(uploadsDir(), seen[0].path)).toMatch(/^tmp\/upload-[0-9a-f]+\.part$/);
    // Removed when the answer has been sent.
    await vi.waitFor(() => expect(existsSync(seen[0].path)).toBe(false));

    // A file over the limit: 413, and its partial temp file is gone too.
    const big = Buffer.alloc(2 * 1024 * 1024, 7);
    const refused = await request(probe).post('/u').attach('file', big, 'b.bin').expect(413);
    expect(refused.body.error.code).toBe('too_large');
    await vi.waitFor(async () => expect(await tempUploads()).toEqual([]));
  });

  it('stores a photo from its temp file: the master is the uploaded bytes, renamed into place, and no temp file stays', async () => {
    const curator = await signedInAgent(app, 'curator');
    const piece = await makePiece();
    const res = await curator
      .post(`/api/pieces/${piece.id}/photos`)
      .set('Origin', ORIGIN)
      .attach('photo', jpeg, 'streamed.jpg')
      .expect(201);
    expect(await tempUploads()).toEqual([]);
    const photo = await Photo.findByPk(res.body.photos[0].id);
    const master = await readFile(resolveInsideUploads(photo!.derivatives.master!.path));
    expect(master.equals(jpeg)).toBe(true);
    expect(photo!.bytes).toBe(jpeg.length);

    // A refused file (not an image) leaves nothing behind either.
    await curator
      .post(`/api/pieces/${piece.id}/photos`)
      .set('Origin', ORIGIN)
      .attach('photo', Buffer.from('not an image at all'), 'x.jpg')
      .expect(415);
    expect(await tempUploads()).toEqual([]);
  });

  it('answers 413 when the whole request is over the per-request limit', async () => {
    uploadBudget.maxRequestBytes = jpeg.length + 1024;
    const curator = await signedInAgent(app, 'curator');
    const piece = await makePiece();
    const res = await curator
      .post(`/api/pieces/${piece.id}/photos`)
      .set('Origin', ORIGIN)
      .attach('photo', jpeg, 'one.jpg')
      .attach('photo', jpeg, 'two.jpg')
      .expect(413);
    expect(res.body.error).toMatchObject({ code: 'too_large', message: expect.stringMatching(/in all/) });
    expect(await Photo.count({ where: { pieceId: piece.id } })).toBe(0);
    await vi.waitFor(async () => expect(await tempUploads()).toEqual([]));
  });

  it('answers 503 with Retry-After when the process is already receiving as many uploads as it may', async () => {
    uploadBudget.maxConcurrent = 1;
    const curator = await signedInAgent(app, 'curator');
    const piece = await makePiece();
    const release = uploadBudget.admit(1000)!; // another upload in progress
    try {
      const res = await curator
        .post(`/api/pieces/${piece.id}/photos`)
        .set('Origin', ORIGIN)
        .attach('photo', jpeg, 'busy.jpg')
        .expect(503);
      expect(res.headers['retry-after']).toBe('5');
      expect(res.body.error).toMatchObject({ code: 'uploads_busy', message: expect.stringMatching(/try again/) });
    } finally {
      release();
    }
    // By bytes too: a second upload whose declared size would pass the process limit waits its turn.
    uploadBudget.maxConcurrent = 8;
    uploadBudget.maxProcessBytes = jpeg.length + 2000;
    const held = uploadBudget.admit(jpeg.length)!;
    try {
      await curator
        .post(`/api/pieces/${piece.id}/photos`)
        .set('Origin', ORIGIN)
        .attach('photo', jpeg, 'busy.jpg')
        .expect(503);
    } finally {
      held();
    }
    await curator
      .post(`/api/pieces/${piece.id}/photos`)
      .set('Origin', ORIGIN)
      .attach('photo', jpeg, 'ok.jpg')
      .expect(201);
    expect(uploadBudget.requests).toBe(0);
    expect(uploadBudget.bytes).toBe(0);
  });
});
