import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launchBrowser, signInAs } from '../support/browser.ts';
import { startServer } from '../support/server.ts';
import { MordantBatch, User, sequelize } from '../../server/models/index.ts';

let server: Awaited<ReturnType<typeof startServer>>;
let browser: Awaited<ReturnType<typeof launchBrowser>>;
let batch: MordantBatch;
beforeAll(async () => {
  server = await startServer();
  browser = await launchBrowser();
  const dyer = await User.findOne({ where: { email: 'dyer@demo.test' }, rejectOnEmpty: true });
  batch = await MordantBatch.create({
    code: `BR-${Date.now() % 1_000_000}`, kind: 'mordant-bath', name: 'Browser test alum bath', ingredients: [], volumeMl: 500, thickenerGPerL: null, ph: null,
    madeOn: '2024-05-01', madeById: dyer.id, checkBy: null, parentId: null, notes: null,
  });
});
afterAll(async () => {
  await browser?.close();
  await server?.close();
  await sequelize.close();
});

describe('the bath ledger in Chromium', () => {
  it('lets the dyer draw from a bath for a trial and shows the remaining volume drop', async () => {
    const page = await browser.context.newPage();
    await signInAs(page, server.url, 'dyer@demo.test');
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Baths' }).click();
    await page.getByRole('link', { name: batch.code }).first().click();
    const remaining = page.locator('dt:text-is("Remaining") + dd');
    await expect(remaining.textContent()).resolves.toBe('500 mL');

    await page.getByRole('tab', { name: 'Draw for a trial' }).click();
    await page.getByLabel('Volume drawn').fill('120');
    await page.getByLabel('Trial code').fill('T-2024-001');
    await page.getByLabel('Fibre mass').fill('50');
    await page.getByRole('button', { name: 'Record' }).click();
    await page.getByRole('status').filter({ hasText: 'recorded' }).waitFor();
    await expect(remaining.textContent()).resolves.toBe('380 mL');
    await expect(page.getByRole('table', { name: 'Ledger' }).textContent()).resolves.toContain('−120');

    // A draw larger than what is left is refused with the server's words, and nothing changes.
    await page.getByLabel('Volume drawn').fill('400');
    await page.getByRole('button', { name: 'Record' }).click();
    await expect(page.getByRole('alert').textContent()).resolves.toMatch(/Only 380 mL/);
    await expect(remaining.textContent()).resolves.toBe('380 mL');
  });
});
