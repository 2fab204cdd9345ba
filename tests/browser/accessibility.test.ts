import AxeBuilder from '@axe-core/playwright';
import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { MordantBatch, Piece, Trial, TrialSeries } from '../../server/models/index.ts';
import { signInAs } from '../support/browser.ts';
import { useBrowserSuite } from '../support/browser-suite.ts';

const suite = useBrowserSuite();

// WCAG 2.1 level A and AA, as axe-core tags its rules (axe-core's rule descriptions, "wcag2a", "wcag2aa", "wcag21a", "wcag21aa").
const WCAG_21_AA = ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa'];
// What fails the suite: axe's two highest impact levels. Moderate and minor findings are printed, not failed.
const FAILING = new Set(['serious', 'critical']);

/** Opens a page as the user would and waits until its content (not the loading line) is in. */
async function open(page: Page, path: string) {
  await page.goto(`${suite.server.url}${path}`, { waitUntil: 'networkidle' });
  await page.locator('main h1').first().waitFor();
  const heading = await page.locator('main h1').first().textContent();
  expect(heading, path).not.toMatch(/^(Not found|Not allowed|Something went wrong|Sign in to open this page)$/);
  // Nothing still loading: the checks should see the page as it settles, not its placeholder.
  await expect.poll(() => page.getByText(/^Loading/).count(), { message: `${path} still loading` }).toBe(0);
}

/** The serious and critical WCAG 2.1 AA findings on the open page, one readable line per element. */
async function violations(page: Page, label: string): Promise<string[]> {
  const result = await new AxeBuilder({ page }).withTags(WCAG_21_AA).analyze();
  const lines: string[] = [];
  for (const v of result.violations) {
    const failing = FAILING.has(v.impact ?? '');
    for (const node of v.nodes) {
      const line = `${label}: ${v.id} (${v.impact}) ${node.target.join(' ')} — ${node.failureSummary?.replace(/\s+/g, ' ').trim()}`;
      if (failing) lines.push(line);
      else console.info(`[not failing] ${line}`);
    }
  }
  return lines;
}

async function check(page: Page, who: string, paths: string[]) {
  const found: string[] = [];
  for (const path of paths) {
    await open(page, path);
    found.push(...(await violations(page, `${who} ${path}`)));
  }
  return found;
}

async function demo() {
  const piece = await Piece.findOne({ where: { accessionNumber: '1931.4.12' }, rejectOnEmpty: true });
  const trial = await Trial.findOne({ where: { code: 'T-2024-001' }, rejectOnEmpty: true });
  const bath = await MordantBatch.findOne({ where: { code: 'MB-07' }, rejectOnEmpty: true });
  const series = await TrialSeries.findOne({ where: { code: 'WS-2024-01' }, rejectOnEmpty: true });
  return { piece: piece.id, trial: trial.id, bath: bath.id, series: series.id };
}

describe('every main page passes axe (WCAG 2.1 AA, serious and critical)', () => {
  it('for a signed-out visitor', async () => {
    const { piece } = await demo();
    const page = await suite.browser.context.newPage();
    const found = await check(page, 'visitor', [
      '/',
      '/sign-in',
      '/forgot-password',
      '/archive',
      `/archive/${piece}`,
      '/search',
      '/search?q=madder',
      '/search?hex=a53a2d',
      '/reference',
    ]);
    // A page that needs an account says so in its own words.
    await page.goto(`${suite.server.url}/trials`, { waitUntil: 'networkidle' });
    await page.getByRole('heading', { name: 'Sign in to open this page' }).waitFor();
    found.push(...(await violations(page, 'visitor /trials (sign-in needed)')));
    expect(found).toEqual([]);
  }, 300_000);

  it('for the dyer', async () => {
    const { piece, trial, bath, series } = await demo();
    const page = await suite.browser.context.newPage();
    await signInAs(page, suite.server.url, 'dyer@demo.test');
    const found = await check(page, 'dyer', [
      '/',
      '/trials',
      `/trials/${trial}`,
      '/trials/new',
      `/archive/${piece}/side-by-side`,
      '/baths',
      `/baths/${bath}`,
      '/series',
      `/series/${series}`,
      '/search?hex=a53a2d',
      '/reference',
    ]);
    expect(found).toEqual([]);
  }, 300_000);

  it('for the researcher', async () => {
    const { piece, trial } = await demo();
    const page = await suite.browser.context.newPage();
    await signInAs(page, suite.server.url, 'researcher@demo.test');
    const found = await check(page, 'researcher', [
      '/',
      '/archive',
      `/archive/${piece}`,
      '/search?q=madder',
      `/trials/${trial}`,
      '/reference',
    ]);
    expect(found).toEqual([]);
  }, 300_000);

  it('for the curator', async () => {
    const { piece } = await demo();
    const page = await suite.browser.context.newPage();
    await signInAs(page, suite.server.url, 'curator@demo.test');
    const found = await check(page, 'curator', [
      '/',
      '/archive',
      `/archive/${piece}`,
      `/archive/${piece}/edit`,
      '/archive/new',
      '/import',
      '/reference',
    ]);
    expect(found).toEqual([]);
  }, 300_000);

  it('for the admin', async () => {
    const page = await suite.browser.context.newPage();
    await signInAs(page, suite.server.url, 'admin@demo.test');
    const found = await check(page, 'admin', [
      '/',
      '/team',
      '/outbox',
      '/admin/fixity',
      '/admin/imaging-tolerances',
      '/reference',
      '/archive',
    ]);
    expect(found).toEqual([]);
  }, 300_000);

  it('with forms, messages and panels open', async () => {
    const { piece, trial } = await demo();
    const page = await suite.browser.context.newPage();
    const found: string[] = [];
    // Opens a page, presses a button that reveals something (the button then goes away), checks the page with it open.
    const opened = async (who: string, path: string, button: string | RegExp, shown: () => Promise<unknown>) => {
      await open(page, path);
      await page.getByRole('button', { name: button }).first().click();
      await shown();
      found.push(...(await violations(page, `${who} ${path} after "${button}"`)));
    };
    const invalid = () => page.locator('main [aria-invalid="true"]').first().waitFor();

    // Messages beside the fields.
    await opened('visitor', '/sign-in', 'Sign in', invalid);
    await signInAs(page, suite.server.url, 'curator@demo.test');
    await opened('curator', '/archive/new', 'Save draft', invalid);
    await opened('curator', `/archive/${piece}`, 'Show who changed what', () =>
      page.getByRole('button', { name: 'Show who changed what' }).waitFor({ state: 'detached' }),
    );

    // The dyer's editors on a trial of their own.
    await signInAs(page, suite.server.url, 'dyer@demo.test');
    for (const button of ['Edit details', 'Edit recipe', 'Add a substitution', 'Record grades'])
      await opened('dyer', `/trials/${trial}`, button, () =>
        page.getByRole('button', { name: button }).waitFor({ state: 'detached' }),
      );

    // A phone: the folded menu and the search's facet panel, open.
    await signInAs(page, suite.server.url, 'admin@demo.test');
    await page.setViewportSize({ width: 390, height: 844 });
    await opened('admin at 390 px', '/archive', 'Menu', () => page.getByRole('navigation', { name: 'Main' }).waitFor());
    await opened('admin at 390 px', '/search?hex=a53a2d', /Narrow by shade and facets/, () =>
      page.getByRole('region', { name: 'Facets' }).waitFor(),
    );
    expect(found).toEqual([]);
  }, 300_000);
});
