import { describe, expect, it } from 'vitest';
import { Piece } from '../../server/models/index.ts';
import { signInAs } from '../support/browser.ts';
import { useBrowserSuite } from '../support/browser-suite.ts';
import { testEnv } from '../support/env.ts';

const suite = useBrowserSuite();

describe('a signed-out visitor meets no dead ends', () => {
  it('is offered only the areas a visitor can open', async () => {
    const page = await suite.browser.context.newPage();
    await page.goto(suite.server.url, { waitUntil: 'networkidle' });
    const nav = page.getByRole('navigation', { name: 'Main' });
    await expect(nav.getByRole('link').allTextContents()).resolves.toEqual(['Archive', 'Find', 'Reference']);
    // The start page's tiles follow the same rule.
    const tiles = await page.locator('main ul h2').allTextContents();
    expect(tiles).toEqual(['Archive', 'Find']);
  }, 60_000);

  it('is told a page needs signing in, and comes back to it after signing in', async () => {
    const page = await suite.browser.context.newPage();
    for (const path of ['/baths', '/series', '/trials']) {
      await page.goto(`${suite.server.url}${path}`);
      await page.getByRole('heading', { name: 'Sign in to open this page' }).waitFor();
      expect(new URL(page.url()).pathname).toBe(path);
    }
    if (testEnv.screenshotDir) {
      await page.setViewportSize({ width: 390, height: 844 });
      await page.screenshot({ path: `${testEnv.screenshotDir}/visitor-sign-in-needed-390.png` });
      await page.setViewportSize({ width: 1280, height: 900 });
    }
    await page.getByRole('link', { name: 'Sign in and come back here' }).click();
    await page.waitForURL(/\/sign-in\?next=%2Ftrials$/);
    await page.getByLabel('E-mail').fill('dyer@demo.test');
    await page.getByLabel('Password').fill('tinctoria-demo');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.waitForURL((u) => u.pathname === '/trials');
    // The list itself now, not the sign-in notice (which trials are on its first page depends on what earlier suites made).
    await page.getByRole('heading', { level: 1, name: 'Trials' }).waitFor();
    await page
      .getByRole('link', { name: /^T-\d{4}-\d{3}$/ })
      .first()
      .waitFor();
    await page.getByRole('button', { name: 'Sign out' }).click();
    // Signed out on a page that needs an account: the header offers sign-in and the page says why.
    await page.getByRole('banner').getByRole('link', { name: 'Sign in' }).waitFor();
  }, 60_000);

  it('sees a published piece with its photos but no link to the master files; a curator has them', async () => {
    const piece = await Piece.findOne({
      where: { accessionNumber: '1931.4.12', status: 'published' },
      rejectOnEmpty: true,
    });
    const page = await suite.browser.context.newPage();
    await page.goto(`${suite.server.url}/archive/${piece.id}`, { waitUntil: 'networkidle' });
    await page.getByTestId('photo-panel').first().waitFor();
    await expect(page.getByRole('link', { name: 'Master file' }).count()).resolves.toBe(0);
    await expect(page.getByRole('link', { name: 'Trials side by side' }).count()).resolves.toBe(0);
    // The header's sign-in link comes back to this piece.
    await page.getByRole('banner').getByRole('link', { name: 'Sign in' }).click();
    await page.waitForURL((u) => u.pathname === '/sign-in' && u.searchParams.get('next') === `/archive/${piece.id}`);

    await signInAs(page, suite.server.url, 'curator@demo.test');
    await page.goto(`${suite.server.url}/archive/${piece.id}`, { waitUntil: 'networkidle' });
    await page.getByTestId('photo-panel').first().waitFor();
    const master = page.getByRole('link', { name: 'Master file' }).first();
    const href = await master.getAttribute('href');
    expect(href).toMatch(/^\/media\/photos\/\d+\/master$/);
    const res = await page.request.get(`${suite.server.url}${href}`);
    expect(res.status()).toBe(200);
  }, 60_000);
});
