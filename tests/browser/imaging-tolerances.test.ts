import { describe, expect, it } from 'vitest';
import { createApp } from '../../server/app.ts';
import { AuditEvent } from '../../server/models/index.ts';
import { ORIGIN, signedInAgent } from '../support/agents.ts';
import { signInAs } from '../support/browser.ts';
import { useBrowserSuite } from '../support/browser-suite.ts';
import { testEnv } from '../support/env.ts';

// Issue 17, point 1: the imaging tolerance levels a chart's capture is graded against are the admin's to change,
// naming their source, from a screen of their own (PUT /api/photos/chart-tolerances); keyboard usable.
const suite = useBrowserSuite();

describe('the imaging tolerances screen', () => {
  it('lets the admin change a level and its source, with messages beside the fields', async () => {
    const admin = await signedInAgent(createApp(), 'admin');
    const before = (await admin.get('/api/photos/chart-tolerances').expect(200)).body;
    const page = await suite.browser.context.newPage();
    await page.setViewportSize({ width: 1280, height: 900 });
    await signInAs(page, suite.server.url, 'admin@demo.test');
    await page.getByRole('link', { name: 'Tolerances' }).first().click();
    const form = page.locator('form[aria-label="Imaging tolerance levels"]');
    await form.waitFor();
    expect(await page.getByLabel('Source of the levels').inputValue()).toBe(before.source);

    // Wrong: a mean that is not a number and no source; the first field in error takes the focus.
    const mean = page.getByLabel('Mean ΔE00 at most').first();
    await mean.fill('two');
    await page.getByLabel('Source of the levels').fill('');
    await page.getByRole('button', { name: 'Save levels' }).focus();
    await page.keyboard.press('Enter');
    await expect.poll(() => mean.getAttribute('aria-invalid')).toBe('true');
    expect(await form.innerText()).toMatch(/Enter the mean ΔE00 as a number/);
    expect(await form.innerText()).toMatch(/Name the source of the levels/);
    expect(await page.evaluate(() => (document.activeElement as HTMLInputElement | null)?.value)).toBe('two');

    // Right: a stricter first level and a fifth, with the house rule named as the source.
    await mean.fill('1.5');
    await page.getByRole('button', { name: 'Add a level' }).click();
    await page.getByLabel('Level 5: name').fill('study only');
    await page.getByLabel('Mean ΔE00 at most').nth(4).fill('12');
    await page
      .getByLabel('Source of the levels')
      .fill('House rule of the imaging studio, 2026 (invented for the test)');
    await page.getByRole('button', { name: 'Save levels' }).click();
    await page.getByText('Levels saved.').waitFor();
    const now = (await admin.get('/api/photos/chart-tolerances').expect(200)).body;
    expect(now.levels[0].meanDeltaE00).toBe(1.5);
    expect(now.levels[4]).toMatchObject({ name: 'study only', meanDeltaE00: 12 });
    expect(now.source).toMatch(/House rule/);
    expect(await AuditEvent.count({ where: { action: 'chart-tolerances-set' } })).toBeGreaterThan(0);

    for (const width of [1280, 768, 390]) {
      await page.setViewportSize({ width, height: 900 });
      if (testEnv.screenshotDir)
        await page.screenshot({ path: `${testEnv.screenshotDir}/imaging-tolerances-${width}.png`, fullPage: true });
      const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
      expect(overflow).toBeLessThanOrEqual(1);
    }
    await page.close();
    // Put the shipped levels back for the other suites.
    await admin.put('/api/photos/chart-tolerances').set('Origin', ORIGIN).send(before).expect(200);
  });

  it('is not offered to a curator', async () => {
    const page = await suite.browser.context.newPage();
    await signInAs(page, suite.server.url, 'curator@demo.test');
    await page.goto(`${suite.server.url}/admin/imaging-tolerances`);
    await page.waitForLoadState('networkidle');
    expect(await page.locator('form[aria-label="Imaging tolerance levels"]').count()).toBe(0);
    await page.close();
  });
});
