import { mkdirSync } from 'node:fs';
import { rm } from 'node:fs/promises';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sequelize, type Photo } from '../../server/models/index.ts';
import { makePiece } from '../../server/seed/factories.ts';
import { launchBrowser, signInAs } from '../support/browser.ts';
import { ingested, makePhotoWithMaster } from '../support/photos.ts';
import { startServer } from '../support/server.ts';
import { testEnv } from '../support/env.ts';

let server: Awaited<ReturnType<typeof startServer>>;
let browser: Awaited<ReturnType<typeof launchBrowser>>;
let pieceId: number;
let tiled: Photo;
let lost: Photo;

beforeAll(async () => {
  const piece = await makePiece({ status: 'published', title: 'Wiring check piece' });
  pieceId = piece.id;
  ({ photo: tiled } = await makePhotoWithMaster(piece.id, { width: 900, height: 600 }));
  const made = await makePhotoWithMaster(piece.id, { width: 300, height: 200, ingest: false });
  lost = made.photo;
  // A missing master makes its real ingest job fail, as a lost file would.
  await rm(made.file);
  await ingested(lost.id);
  server = await startServer();
  browser = await launchBrowser();
}, 120_000);
afterAll(async () => {
  await browser?.close();
  await server?.close();
  await sequelize.close();
});

async function asRole(email: string) {
  const context = browser.context;
  await context.clearCookies();
  const page = await context.newPage();
  await signInAs(page, server.url, email);
  return page;
}

describe('the piece page joins deep zoom, jobs, IIIF and export; the shell offers what each role may do', () => {
  it('curator: zoom link for tiled photos, failed processing with its reason and a retry, manifest and export links, Import in the menu', async () => {
    const page = await asRole('curator@demo.test');
    await page.goto(`${server.url}/archive/${pieceId}`);
    const failed = page.locator('[data-testid="ingest-status"][data-stage="failed"]');
    await failed.waitFor();
    const zoom = page.getByRole('link', { name: /Zoom in/ });
    // The zoom link waits for the photo's job list, which may answer after the photos themselves.
    await zoom.first().waitFor();
    expect(await zoom.count()).toBe(1);
    expect(await zoom.getAttribute('href')).toBe(`/photos/${tiled.id}/zoom`);

    expect(await failed.count()).toBe(1);
    expect(await failed.textContent()).toMatch(/Failed: The master file of photo \d+ is missing/);
    mkdirSync(testEnv.screensDir, { recursive: true });
    for (const width of [1280, 768, 390]) {
      await page.setViewportSize({ width, height: 900 });
      await failed.screenshot({ path: `${testEnv.screensDir}/ingest-failed-${width}.png` });
    }
    await page.setViewportSize({ width: 1280, height: 900 });
    await failed.getByRole('button', { name: 'Retry' }).click();
    await page.locator('[data-testid="ingest-status"][data-stage="queued"]').waitFor();

    expect(await page.getByTestId('iiif-manifest-link').getAttribute('href')).toBe(`/iiif/${pieceId}/manifest.json`);
    const dc = await page.getByRole('link', { name: 'Dublin Core (JSON-LD)' }).getAttribute('href');
    const answer = await page.request.get(`${server.url}${dc}`);
    expect(answer.status()).toBe(200);
    expect(await page.getByRole('link', { name: /Masters \(ZIP/ }).getAttribute('href')).toBe(
      `/api/pieces/${pieceId}/masters.zip`,
    );
    const manifest = await page.request.get(`${server.url}/iiif/${pieceId}/manifest.json`);
    expect(manifest.status()).toBe(200);

    const main = page.getByRole('navigation', { name: 'Main' });
    await main.getByRole('link', { name: 'Import' }).click();
    await page.waitForURL((u) => u.pathname === '/import');
    expect(await page.getByRole('navigation', { name: 'Administration' }).count()).toBe(0);
    await page.goto(`${server.url}/archive`);
    expect(await page.getByRole('link', { name: 'Export pieces (CSV)' }).getAttribute('href')).toBe(
      '/api/export/pieces.csv',
    );
    await page.close();
  });

  it('dyer: the manifest and the palettes and trials CSVs but no catalogue exports, no retry and no Import; a trial page links its sample card', async () => {
    const page = await asRole('dyer@demo.test');
    await page.goto(`${server.url}/archive/${pieceId}`);
    await page.getByTestId('iiif-manifest-link').waitFor();
    expect(await page.getByRole('link', { name: 'Dublin Core (JSON-LD)' }).count()).toBe(0);
    await page.locator('[data-testid="ingest-status"]').first().waitFor();
    expect(await page.getByRole('button', { name: 'Retry' }).count()).toBe(0);
    expect(await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Import' }).count()).toBe(0);
    await page.goto(`${server.url}/trials`);
    await page.getByRole('heading', { name: 'Trials' }).waitFor();
    // Whoever reads trials may export them.
    const trialsCsv = await page.getByRole('link', { name: 'Export trials (CSV)' }).getAttribute('href');
    expect(trialsCsv).toBe('/api/export/trials.csv');
    expect((await page.request.get(`${server.url}${trialsCsv}`)).status()).toBe(200);
    await page.goto(`${server.url}/archive/${pieceId}`);
    const palettes = await page.getByRole('link', { name: 'Palettes (CSV)' }).getAttribute('href');
    expect(palettes).toBe(`/api/pieces/${pieceId}/palettes.csv`);
    expect((await page.request.get(`${server.url}${palettes}`)).headers()['content-type']).toMatch(/text\/csv/);
    const first = (await (await page.request.get(`${server.url}/api/trials?pageSize=1`)).json()).items[0];
    await page.goto(`${server.url}/trials/${first.id}`);
    const card = await page.getByRole('link', { name: 'Sample card (PDF)' }).getAttribute('href');
    expect(card).toBe(`/api/trials/${first.id}/card.pdf`);
    expect((await page.request.get(`${server.url}${card}`)).headers()['content-type']).toBe('application/pdf');
    await page.close();
  });

  it('admin: Team, Fixity, Tolerances and (outside production) Outbox in the administration links, each opening its page', async () => {
    const page = await asRole('admin@demo.test');
    const admin = page.getByRole('navigation', { name: 'Administration' });
    await admin.waitFor();
    expect(await admin.getByRole('link').allTextContents()).toEqual(['Team', 'Fixity', 'Tolerances', 'Outbox']);
    await admin.getByRole('link', { name: 'Fixity' }).click();
    await page.getByRole('heading', { name: 'Fixity', exact: true, level: 1 }).waitFor();
    await admin.getByRole('link', { name: 'Outbox' }).click();
    await page.waitForURL((u) => u.pathname === '/outbox');
    await page.getByRole('heading', { level: 1 }).waitFor();
    await page.close();
  });
});
