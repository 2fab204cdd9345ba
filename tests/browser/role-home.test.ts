import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { signInAs } from '../support/browser.ts';
import { useBrowserSuite } from '../support/browser-suite.ts';
import { testEnv } from '../support/env.ts';

// Issue 19: each role lands on its own work at /. Each demo role signs in, sees its sections, follows a link, and
// the page scrolls sideways neither at 1280 nor at 390 px.
const suite = useBrowserSuite();

const SECTIONS: Record<string, string[]> = {
  curator: ['home-drafts', 'home-photos', 'home-light', 'home-saved-searches'],
  researcher: ['home-analyses', 'home-saved-searches'],
  dyer: ['home-trials', 'home-baths', 'home-series', 'home-saved-searches'],
  admin: ['home-team', 'home-invitations', 'home-fixity', 'home-jobs', 'home-saved-searches'],
};

async function noOverflow(page: Page, role: string) {
  for (const width of [1280, 390]) {
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
  it('curator: drafts to publish (a draft opens its piece), photos without a reference patch, light allowance not yet', async () => {
    const page = await homeAs('curator');
    const drafts = page.getByTestId('home-drafts');
    expect(await drafts.locator('li').count()).toBeGreaterThan(0);
    expect(await page.getByTestId('home-light').textContent()).toMatch(/Light exposure is not recorded/);
    await drafts.locator('li a').first().click();
    await page.waitForURL(/\/archive\/\d+$/);
    await page.locator('main h1').first().waitFor();
    await page.close();
  });

  it('researcher: analyses not yet, saved searches that open Find again; a search saved on Find appears', async () => {
    const page = await homeAs('researcher');
    expect(await page.getByTestId('home-analyses').textContent()).toMatch(/Analyses are not recorded/);
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
