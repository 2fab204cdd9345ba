import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { MordantBatch, Piece, Trial, TrialSeries } from '../../server/models/index.ts';
import { signInAs } from '../support/browser.ts';
import { useBrowserSuite } from '../support/browser-suite.ts';
import { testEnv } from '../support/env.ts';

const suite = useBrowserSuite();
const PHONE = { width: 390, height: 844 };

/** Opens a page as the user would and waits until its content (not the loading line) is in. */
async function open(page: Page, path: string) {
  await page.goto(`${suite.server.url}${path}`, { waitUntil: 'networkidle' });
  await page.locator('main h1').first().waitFor();
  const heading = await page.locator('main h1').first().textContent();
  expect(heading, path).not.toMatch(/^(Not found|Not allowed|Something went wrong|Sign in to open this page)$/);
}

// Set SCREENSHOT_DIR to keep a picture of each page at phone, tablet and desktop width for looking at by eye.
async function picture(page: Page, name: string) {
  const dir = testEnv.screenshotDir;
  if (!dir) return;
  for (const width of [390, 768, 1280]) {
    await page.setViewportSize({ width, height: width === 390 ? 844 : 900 });
    await page.screenshot({ path: `${dir}/${name}-${width}.png`, fullPage: true });
  }
  await page.setViewportSize(PHONE);
}

// The header's "name · role" line is left out on a phone, and signInAs waits for it: sign in wide, then narrow the window.
async function signInOnPhone(page: Page, email: string) {
  await page.setViewportSize({ width: 1280, height: 900 });
  await signInAs(page, suite.server.url, email);
  await page.setViewportSize(PHONE);
}

async function pictureAsIs(page: Page, name: string) {
  if (testEnv.screenshotDir) await page.screenshot({ path: `${testEnv.screenshotDir}/${name}.png` });
}

const scrollWidth = (page: Page) => page.evaluate(() => document.documentElement.scrollWidth);

describe('every main page at 390 × 844', () => {
  it('scrolls no page sideways, for each role that can open it', async () => {
    const piece = await Piece.findOne({ where: { accessionNumber: '1931.4.12' }, rejectOnEmpty: true });
    const trial = await Trial.findOne({ where: { code: 'T-2024-001' }, rejectOnEmpty: true });
    const bath = await MordantBatch.findOne({ where: { code: 'MB-07' }, rejectOnEmpty: true });
    const series = await TrialSeries.findOne({ where: { code: 'WS-2024-01' }, rejectOnEmpty: true });
    const publicPages = [
      '/',
      '/archive',
      `/archive/${piece.id}`,
      '/search?hex=a53a2d',
      '/search?q=madder',
      '/reference',
      '/sign-in',
    ];
    const signedIn = [
      `/archive/${piece.id}/side-by-side`,
      '/trials',
      `/trials/${trial.id}`,
      '/baths',
      `/baths/${bath.id}`,
      '/series',
      `/series/${series.id}`,
    ];
    const byRole: Array<[string | null, string[]]> = [
      [null, publicPages],
      ['dyer@demo.test', [...signedIn, `/archive/${piece.id}`, '/search?hex=a53a2d']],
      ['researcher@demo.test', ['/archive', `/archive/${piece.id}`, '/search?q=madder', `/trials/${trial.id}`]],
      ['curator@demo.test', ['/import', '/archive', `/archive/${piece.id}`]],
      ['admin@demo.test', ['/team', '/archive', '/admin/imaging-tolerances']],
    ];
    const page = await suite.browser.context.newPage();
    await page.setViewportSize(PHONE);
    const wide: string[] = [];
    for (const [email, paths] of byRole) {
      if (email) await signInOnPhone(page, email);
      for (const path of paths) {
        await open(page, path);
        const w = await scrollWidth(page);
        if (w > PHONE.width) wide.push(`${email ?? 'visitor'} ${path}: ${w}px`);
        await picture(page, `${email?.split('@')[0] ?? 'visitor'}${path.replace(/[/?=&]+/g, '_')}`);
      }
    }
    expect(wide).toEqual([]);
  }, 300_000);

  it('folds the main navigation behind a menu button', async () => {
    const page = await suite.browser.context.newPage();
    await signInOnPhone(page, 'admin@demo.test');
    const nav = page.getByRole('navigation', { name: 'Main' });
    const menu = page.getByRole('button', { name: 'Menu' });
    await expect(nav.isVisible()).resolves.toBe(false);
    await expect(menu.getAttribute('aria-expanded')).resolves.toBe('false');
    await menu.click();
    await nav.waitFor();
    // The admin's pages come into the same menu, so the header row stays within the phone's width.
    await pictureAsIs(page, 'menu-open-390');
    const items = await nav.getByRole('link').allTextContents();
    expect(items).toEqual([
      'Archive',
      'Find',
      'Trials',
      'Baths',
      'Series',
      'Reference',
      'Import',
      'Team',
      'Fixity',
      'Tolerances',
      'Outbox',
    ]);
    expect(await scrollWidth(page)).toBeLessThanOrEqual(PHONE.width);
    await nav.getByRole('link', { name: 'Baths' }).click();
    await page.waitForURL((u) => u.pathname === '/baths');
    await expect(nav.isVisible()).resolves.toBe(false);
    await expect(page.getByRole('button', { name: 'Menu' }).getAttribute('aria-expanded')).resolves.toBe('false');

    // From tablet width up the areas are a row of links again, with no menu button.
    await page.setViewportSize({ width: 768, height: 900 });
    await expect(nav.isVisible()).resolves.toBe(true);
    await expect(page.getByRole('button', { name: 'Menu' }).isVisible()).resolves.toBe(false);
  }, 60_000);

  it('shows search results before the facets, which open from a collapsed panel', async () => {
    const page = await suite.browser.context.newPage();
    await page.setViewportSize(PHONE);
    await open(page, '/search?hex=a53a2d');
    await expect.poll(() => page.getByTestId('result-count').textContent()).toMatch(/within ΔE00 5/);
    const facets = page.getByRole('region', { name: 'Facets' });
    await expect(facets.isVisible()).resolves.toBe(false);
    const toggle = page
      .getByTestId('narrow-panel')
      .getByRole('button', { name: /Narrow by shade and facets \(1 chosen\)/ });
    await toggle.click();
    await facets.waitFor();
    await expect(toggle.getAttribute('aria-expanded')).resolves.toBe('true');
    await facets.scrollIntoViewIfNeeded();
    await pictureAsIs(page, 'search-facets-open-390');
    const results = await page.getByRole('table', { name: 'Shade matches' }).boundingBox();
    const facetBox = await facets.boundingBox();
    expect(facetBox!.y).toBeGreaterThan(results!.y + results!.height);
    expect(await scrollWidth(page)).toBeLessThanOrEqual(PHONE.width);
  }, 60_000);

  it('stacks the trial recipe on a phone, each quantity with its label and the cautions kept', async () => {
    const trial = await Trial.findOne({ where: { code: 'T-2024-001' }, rejectOnEmpty: true });
    const page = await suite.browser.context.newPage();
    await signInOnPhone(page, 'dyer@demo.test');
    await open(page, `/trials/${trial.id}`);
    const recipe = page.getByRole('region', { name: 'Recipe' });
    await recipe.getByTestId('recipe-step').first().waitFor();
    await expect(recipe.locator('thead').isVisible()).resolves.toBe(false);
    const labels = await recipe
      .locator('td[data-label="Grams"]')
      .first()
      .evaluate((td) => getComputedStyle(td, '::before').content);
    expect(labels).toBe('"Grams"');
    const table = await recipe.locator('table').boundingBox();
    expect(table!.width).toBeLessThanOrEqual(PHONE.width);
    expect(await scrollWidth(page)).toBeLessThanOrEqual(PHONE.width);
  }, 60_000);
});
