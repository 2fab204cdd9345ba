import { describe, expect, it } from 'vitest';
import { useBrowserSuite } from '../support/browser-suite.ts';

const suite = useBrowserSuite();

describe('home page in Chromium', () => {
  it('shows the product name in the shipped fonts', async () => {
    const page = await suite.browser.context.newPage();
    const failed: string[] = [];
    page.on('requestfailed', (r) => failed.push(r.url()));
    await page.goto(suite.server.url, { waitUntil: 'networkidle' });
    await expect(page.getByRole('link', { name: 'Tinctoria home' }).textContent()).resolves.toContain('Tinctoria');
    await page.evaluate(() => document.fonts.ready);
    const fonts = await page.evaluate(() => ({
      serif: document.fonts.check('600 24px "Source Serif 4 Variable"'),
      sans: document.fonts.check('16px "Inter Variable"'),
      loaded: [...document.fonts].filter((f) => f.status === 'loaded').map((f) => f.family),
      headingFont: getComputedStyle(document.querySelector('h2')!).fontFamily,
    }));
    expect(fonts.serif).toBe(true);
    expect(fonts.sans).toBe(true);
    expect(fonts.loaded).toEqual(expect.arrayContaining(['Source Serif 4 Variable', 'Inter Variable']));
    expect(fonts.headingFont).toContain('Source Serif 4 Variable');
    // The health line answers from the server: the database is reachable.
    await expect.poll(() => page.getByText(/^Version \S+ · database up$/).isVisible()).toBe(true);
    expect(failed).toEqual([]);
  });
});
