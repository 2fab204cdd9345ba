import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { makeAnalysis, makeDisplayPeriod, makePiece } from '../../server/seed/factories.ts';
import { signInAs } from '../support/browser.ts';
import { useBrowserSuite } from '../support/browser-suite.ts';
import { testEnv } from '../support/env.ts';

// Issue 19: each role lands on its own work at /. Each demo role signs in, sees its sections, follows a link, and
// the page scrolls sideways neither at 1280, 768 nor 390 px.
const suite = useBrowserSuite();

const SECTIONS: Record<string, string[]> = {
  curator: ['home-drafts', 'home-photos', 'home-light', 'home-saved-searches'],
  researcher: ['home-analyses', 'home-saved-searches'],
  dyer: ['home-trials', 'home-baths', 'home-series', 'home-saved-searches'],
  admin: ['home-team', 'home-invitations', 'home-fixity', 'home-jobs', 'home-saved-searches'],
};

async function noOverflow(page: Page, role: string) {
  for (const width of [1280, 768, 390]) {
    await page.setViewportSize({ width, height: width === 390 ? 844 : 900 });
    await page.waitForTimeout(100);
    const scroll = await page.evaluate(() => document.documentElement.scrollWidth);
    expect(scroll, `${role} home at ${width} px`).toBeLessThanOrEqual(width);
    if (testEnv.screenshotDir)
      await page.screenshot({ path: `${testEnv.screenshotDir}/home-${role}-${width}.png`, fullPage: true });
  }
  await page.setViewportSize({ width: 1280, height: 900 });
}

async function homeAs(role: string) {
  const page = await suite.browser.context.newPage();
  await signInAs(page, suite.server.url, `${role}@demo.test`);
  await page.goto(suite.server.url, { waitUntil: 'networkidle' });
  await page.getByTestId(`home-${role}`).waitFor();
  for (const id of SECTIONS[role]) expect(await page.getByTestId(id).isVisible(), `${role}: ${id}`).toBe(true);
  await noOverflow(page, role);
  return page;
}

describe('a home page per role', () => {
  it('curator: drafts to publish (a draft opens its piece), photos without a reference patch, pieces near their light allowance', async () => {
    // Weld (high responsivity, 15 000 lx·h a year in shared/data/light-sensitivity.ts) at 2 000 lx, 24 h a day for 40
    // days of this year: 1 920 000 lx·h, 12 800 % of this year's allowance — far above what other test files leave in
    // the shared database, so this piece heads the list (most used first, a few shown).
    const year = new Date().getUTCFullYear();
    const lit = await makePiece({
      title: `Near its light allowance ${Date.now() % 100000}`,
      dyestuffs: [{ name: 'weld', evidence: 'attributed' }],
    });
    await makeDisplayPeriod({
      pieceId: lit.id,
      fromDate: `${year}-01-01`,
      toDate: `${year}-02-09`,
      lux: 2000,
      hoursPerDay: 24,
    });
    const page = await homeAs('curator');
    const drafts = page.getByTestId('home-drafts');
    expect(await drafts.locator('li').count()).toBeGreaterThan(0);
    const light = page.getByTestId('home-light').locator('li', { hasText: lit.accessionNumber });
    expect(await light.textContent()).toMatch(/12\D?800 % of this year/);
    await light.getByRole('link').click();
    await page.waitForURL(new RegExp(`/archive/${lit.id}#light-h$`));
    await page.getByRole('heading', { name: 'Light exposure' }).waitFor();
    await page.goto(suite.server.url, { waitUntil: 'networkidle' });
    await drafts.locator('li a').first().click();
    await page.waitForURL(/\/archive\/\d+$/);
    await page.locator('main h1').first().waitFor();
    await page.close();
  });

  it('researcher: recent analyses (one opens its piece), saved searches that open Find again; a search saved on Find appears', async () => {
    const analysed = await makePiece({ title: `Analysed ${Date.now() % 100000}` });
    const analysis = await makeAnalysis({
      pieceId: analysed.id,
      method: 'Raman',
      analysedOn: new Date().toISOString().slice(0, 10),
    });
    const page = await homeAs('researcher');
    const analyses = page.getByTestId('home-analyses');
    await analyses.getByRole('link', { name: `Raman of ${analysed.accessionNumber} ${analysed.title}` }).click();
    await page.waitForURL(new RegExp(`/archive/${analysed.id}#analysis-${analysis.id}$`));
    await page.waitForURL(/\/archive\/\d+#analysis-\d+$/);
    await page.getByRole('heading', { name: 'Analyses' }).waitFor();
    await page.goto(suite.server.url, { waitUntil: 'networkidle' });
    await page.getByTestId('home-saved-searches').getByRole('link', { name: 'Madder on cotton' }).click();
    await page.waitForURL(/\/search\?dyestuff=madder&fibre=cotton$/);
    await page.getByTestId('result-count').filter({ hasText: /piece/ }).waitFor();
    // Save the search in the address bar under a name; it is listed on Find and on the home page.
    const name = `Browser ${Date.now() % 100000}`;
    const panel = page.getByTestId('saved-searches');
    await panel.getByLabel('Save this search as').fill(name);
    await panel.getByRole('button', { name: 'Save search' }).click();
    await panel.getByRole('link', { name }).waitFor();
    // Saving with no name says so beside the field.
    await panel.getByRole('button', { name: 'Save search' }).click();
    await panel.getByText(/Name the search/).waitFor();
    await page.goto(suite.server.url, { waitUntil: 'networkidle' });
    await page.getByTestId('home-saved-searches').getByRole('link', { name }).waitFor();
    await page.close();
  });

  it('dyer: trials in progress (a trial opens), baths due a check, planned series', async () => {
    const page = await homeAs('dyer');
    const trials = page.getByTestId('home-trials');
    expect(await trials.locator('li').count()).toBeGreaterThan(0);
    await trials.locator('li a').first().click();
    await page.waitForURL(/\/trials\/\d+$/);
    await page.locator('main h1').first().waitFor();
    await page.close();
  });

  it('admin: team, pending invitations, fixity and job queue; the team link opens the team page', async () => {
    const page = await homeAs('admin');
    expect(await page.getByTestId('home-team').textContent()).toMatch(/active/);
    await page.getByTestId('home-team').getByRole('link', { name: 'Manage the team' }).click();
    await page.waitForURL(/\/team$/);
    await page.close();
  });

  it('a visitor keeps the introduction (no role sections)', async () => {
    const page = await suite.browser.context.newPage();
    await page.context().clearCookies();
    await page.goto(suite.server.url, { waitUntil: 'networkidle' });
    await page.getByRole('link', { name: 'Archive' }).first().waitFor();
    expect(await page.locator('[data-testid^="home-"]').count()).toBe(0);
    await page.close();
  });
});
