import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launchBrowser } from '../support/browser.ts';
import { startServer } from '../support/server.ts';
import { sequelize, type Photo } from '../../server/models/index.ts';
import { makePiece } from '../../server/seed/factories.ts';
import { makePhotoWithMaster } from '../support/photos.ts';

let server: Awaited<ReturnType<typeof startServer>>;
let browser: Awaited<ReturnType<typeof launchBrowser>>;
let photo: Photo;

beforeAll(async () => {
  const piece = await makePiece({ status: 'published', title: 'Deep-zoom browser piece' });
  ({ photo } = await makePhotoWithMaster(piece.id, {
    width: 2400,
    height: 1600,
    regions: [{ x: 200, y: 300, w: 500, h: 400, label: 'madder pink ground' }],
  }));
  server = await startServer();
  browser = await launchBrowser();
}, 120_000);
afterAll(async () => {
  await browser?.close();
  await server?.close();
  await sequelize.close();
});

// A level-0 tile URL names its region and size; at scale factor 1 the region's width equals the size's width.
const TILE = /\/iiif\/photos\/\d+\/(\d+),(\d+),(\d+),(\d+)\/(\d+),(\d+)\/0\/default\.jpg$/;

describe('deep-zoom viewer in Chromium', () => {
  it('opens a published photo from its IIIF tiles, draws its region, and zooms to full-resolution tiles', async () => {
    const page = await browser.context.newPage();
    const tiles: Array<{ scale: number }> = [];
    const failed: string[] = [];
    page.on('response', (r) => {
      const m = TILE.exec(new URL(r.url()).pathname);
      if (m && r.status() === 200) tiles.push({ scale: Number(m[3]) / Number(m[5]) });
      // A visitor's /api/auth/me answers 401 by design; every other request must succeed.
      if (r.status() >= 400 && !r.url().endsWith('/api/auth/me')) failed.push(`${r.status()} ${r.url()}`);
    });
    const errors: string[] = [];
    page.on('pageerror', (e) => errors.push(e.message));
    await page.goto(`${server.url}/photos/${photo.id}/zoom`);
    const level = page.getByTestId('zoom-level');
    await expect.poll(() => level.getAttribute('data-zoom'), { timeout: 20_000 }).not.toBe('');
    const start = Number(await level.getAttribute('data-zoom'));
    await page.locator('[data-region="madder pink ground"]').waitFor({ state: 'attached' });
    await expect.poll(() => tiles.length, { timeout: 20_000 }).toBeGreaterThan(0);
    // Whole photo in view: only reduced tiles (scale factor > 1) are needed.
    expect(tiles.every((t) => t.scale > 1)).toBe(true);

    // OpenSeadragon stops at 2 screen pixels per image pixel (maxZoomPixelRatio), about × 3.9 here.
    for (let i = 0; i < 5; i++) await page.getByRole('button', { name: 'Zoom in' }).click();
    await expect
      .poll(async () => Number(await level.getAttribute('data-zoom')), { timeout: 20_000 })
      .toBeGreaterThan(start * 2);
    await expect.poll(() => tiles.some((t) => t.scale === 1), { timeout: 20_000 }).toBe(true);
    expect(failed).toEqual([]);
    expect(errors).toEqual([]);

    // The keyboard reaches the controls.
    await page.getByRole('button', { name: 'Whole photo' }).focus();
    await page.keyboard.press('Enter');
    await expect
      .poll(async () => Number(await level.getAttribute('data-zoom')), { timeout: 20_000 })
      .toBeLessThan(start * 1.5);
    await page.close();
  }, 90_000);
});
