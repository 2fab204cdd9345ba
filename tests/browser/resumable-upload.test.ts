import { createHash } from 'node:crypto';
import { mkdtemp, rm, writeFile } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Photo, User, sequelize } from '../../server/models/index.ts';
import { makePiece } from '../../server/seed/factories.ts';
import { launchBrowser, signInAs } from '../support/browser.ts';
import { startServer } from '../support/server.ts';

// Resumable uploads in the browser (issue 18): the upload box sends a photo with tus in 16 MB chunks; the connection
// drops after the first chunk (every later PATCH refused at the network level), the page is reloaded, the same file
// is chosen again, and the upload goes on from the server's offset instead of starting afresh.
let server: Awaited<ReturnType<typeof startServer>>;
let browser: Awaited<ReturnType<typeof launchBrowser>>;
let dir: string;
beforeAll(async () => {
  server = await startServer();
  browser = await launchBrowser();
  dir = await mkdtemp(path.join(os.tmpdir(), 'tinctoria-tus-'));
});
afterAll(async () => {
  await browser?.close();
  await server?.close();
  await rm(dir, { recursive: true, force: true });
  await sequelize.close();
});

const CHUNK = 16 * 1024 * 1024;

describe('a photo upload that survives a dropped connection and a page reload', () => {
  it('resumes from the offset after the reload and stores the master byte for byte', async () => {
    const curator = await User.findOne({ where: { email: 'curator@demo.test' }, rejectOnEmpty: true });
    const piece = await makePiece({ createdById: curator.id, title: `Resumed upload ${Date.now().toString(36)}` });
    // An uncompressed TIFF over one chunk (2600 × 2200 pixels, about 17–23 MB), with a mark of its own.
    const seed = Math.floor(Math.random() * 200);
    const tiff = await sharp({ create: { width: 2600, height: 2200, channels: 3, background: '#c9b48f' } })
      .composite([
        {
          input: { create: { width: 400, height: 300, channels: 3, background: { r: 120 + seed / 4, g: 40, b: 38 } } },
          left: 300 + seed,
          top: 400,
        },
      ])
      .tiff({ compression: 'none' })
      .toBuffer();
    expect(tiff.length).toBeGreaterThan(CHUNK);
    const file = path.join(dir, 'long-panel.tif');
    await writeFile(file, tiff);

    const page = await browser.context.newPage();
    await signInAs(page, server.url, 'curator@demo.test');
    const sent: Array<{ method: string; offset?: string }> = [];
    page.on('request', (r) => {
      if (new URL(r.url()).pathname.startsWith('/api/uploads'))
        sent.push({ method: r.method(), offset: r.headers()['upload-offset'] });
    });
    // The first chunk goes through; after it the connection "drops" for every PATCH.
    let patches = 0;
    await page.route('**/api/uploads/**', (route) => {
      if (route.request().method() === 'PATCH' && ++patches > 1) return route.abort('connectionreset');
      return route.continue();
    });
    await page.goto(`${server.url}/archive/${piece.id}`);
    await page.getByLabel('Photos to upload').setInputFiles(file);
    await page.waitForFunction(() => Object.keys(localStorage).some((k) => k.startsWith('tus::')));
    await expect.poll(() => patches, { timeout: 20_000 }).toBeGreaterThan(1);
    expect(sent.filter((r) => r.method === 'POST')).toHaveLength(1);

    // Reload while the connection is still "down", so the old page's retries cannot finish the upload in between.
    await page.reload();
    await page.unroute('**/api/uploads/**');
    sent.length = 0;
    await page.getByLabel('Photos to upload').setInputFiles(file);
    const item = page.getByTestId('upload-item');
    await item.getByText(/^Stored/).waitFor({ timeout: 60_000 });
    // No new upload was created: it asked for the offset and sent only what the server did not have.
    expect(sent.filter((r) => r.method === 'POST')).toHaveLength(0);
    expect(sent.find((r) => r.method === 'HEAD')).toBeTruthy();
    // The server keeps what arrived before the drop (the first chunk, and some of the second): at least a chunk.
    const resumedAt = Number(sent.find((r) => r.method === 'PATCH')?.offset);
    expect(resumedAt).toBeGreaterThanOrEqual(CHUNK);
    expect(resumedAt).toBeLessThan(tiff.length);

    const photo = await Photo.findOne({ where: { pieceId: piece.id }, rejectOnEmpty: true });
    expect(photo.sha256).toBe(createHash('sha256').update(tiff).digest('hex'));
    await page.getByTestId('photo-panel').waitFor();
    await page.close();
  }, 120_000);
});
