import { mkdtemp, rm, writeFile } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { makePiece } from '../../server/seed/factories.ts';
import { signInAs } from '../support/browser.ts';
import { useBrowserSuite } from '../support/browser-suite.ts';
import { testEnv } from '../support/env.ts';
import { reportPdf } from '../support/report-pdf.ts';

const suite = useBrowserSuite();
let dir: string;
beforeAll(async () => {
  dir = await mkdtemp(path.join(os.tmpdir(), 'tinctoria-report-'));
});
afterAll(() => rm(dir, { recursive: true, force: true }));

/** Nothing wider than the window at 390 px; a picture at 390 and 1280 px when SCREENSHOT_DIR is set. */
async function checkWidths(page: Page, name: string) {
  for (const width of [390, 1280]) {
    await page.setViewportSize({ width, height: 900 });
    const overflow = await page.evaluate(
      () => document.documentElement.scrollWidth - document.documentElement.clientWidth,
    );
    expect(overflow, `${name} at ${width} px`).toBeLessThanOrEqual(0);
    if (testEnv.screenshotDir)
      await page.screenshot({ path: `${testEnv.screenshotDir}/${name}-${width}.png`, fullPage: true });
  }
}

describe('the records behind a piece, in Chromium', () => {
  it('a researcher records an HPLC analysis and "madder (identified)" links to it; a curator logs a display and sees the allowance used', async () => {
    const piece = await makePiece({
      status: 'published',
      title: 'Records browser piece',
      dyestuffs: [{ name: 'madder', evidence: 'attributed' }],
    });
    const page = await suite.browser.context.newPage();
    await page.setViewportSize({ width: 1280, height: 900 });
    await signInAs(page, suite.server.url, 'researcher@demo.test');
    await page.goto(`${suite.server.url}/archive/${piece.id}`);
    await page.getByRole('heading', { name: 'Analyses' }).waitFor();
    await page.getByRole('button', { name: 'Record an analysis' }).click();
    // Empty: the messages say what is missing, beside the fields.
    await page.getByLabel('Date analysed').fill('');
    await page.getByRole('button', { name: 'Save analysis' }).click();
    await page.getByText('Choose a method').waitFor();
    // Keyboard: the first field in error has the focus.
    expect(await page.evaluate(() => document.activeElement?.tagName)).toBe('SELECT');
    await page.getByLabel('Method').selectOption('HPLC-DAD');
    await page.getByLabel('Date analysed').fill('2024-05-02');
    await page.getByRole('button', { name: 'Save analysis' }).click();
    await page.getByText('Describe the sample or site, or choose a region of a photo').waitFor();
    await page.getByLabel('Sample or site, described').fill('red ground, loose warp thread');
    await page.getByLabel('Laboratory').fill('Test bench');
    await page.getByLabel('Colorant or element 1').fill('alizarin');
    await page.getByLabel('Confidence 1').selectOption('confirmed');
    await page.getByRole('button', { name: 'Add a finding' }).click();
    await page.getByLabel('Colorant or element 2').fill('purpurin');
    await page.getByLabel('Confidence 2').selectOption('probable');
    await page.getByLabel('madder', { exact: true }).check();
    const file = path.join(dir, 'hplc-report.pdf');
    await writeFile(file, await reportPdf());
    await page.getByLabel('Report (PDF)').setInputFiles(file);
    await page.getByRole('button', { name: 'Save analysis' }).click();

    const link = page.getByRole('link', { name: 'madder (identified)' });
    await link.waitFor();
    const href = await link.getAttribute('href');
    expect(href).toMatch(/^#analysis-\d+$/);
    const card = page.locator(href!);
    await card.getByRole('heading', { name: /HPLC-DAD/ }).waitFor();
    await card.getByText('The record behind:').waitFor();
    await card.getByRole('cell', { name: 'alizarin' }).waitFor();
    await card.getByText(/Suggests: madder \(confirmed, from alizarin, purpurin\)/).waitFor();
    await card.getByRole('link', { name: /Report \(PDF/ }).waitFor();
    await link.click();
    expect(await page.evaluate(() => location.hash)).toBe(href);
    await checkWidths(page, 'piece-analyses');

    // The curator logs a display this year: 10 days × 50 lux × 8 h = 4 000 lx·h of madder's 150 000 (3 %).
    const year = new Date().getFullYear();
    await page.setViewportSize({ width: 1280, height: 900 });
    await signInAs(page, suite.server.url, 'curator@demo.test');
    await page.goto(`${suite.server.url}/archive/${piece.id}`);
    await page.getByRole('heading', { name: 'Light exposure' }).waitFor();
    await page.getByRole('button', { name: 'Log a display' }).click();
    await page.getByLabel('From', { exact: true }).fill(`${year}-01-05`);
    await page.getByLabel('To', { exact: true }).fill(`${year}-01-14`);
    await page.getByLabel(/Illuminance/).fill('50');
    await page.getByLabel(/Hours lit a day/).fill('8');
    await page.getByRole('button', { name: 'Save display' }).click();
    const meter = page.getByRole('meter', { name: `Allowance used in ${year}` });
    await expect.poll(() => meter.getAttribute('aria-valuetext')).toBe('4 000 lx·h of 150 000 lx·h (3 %)');

    // A long bright display is warned about before it is saved, and recorded only when confirmed.
    await page.getByRole('button', { name: 'Log a display' }).click();
    await page.getByLabel('From', { exact: true }).fill(`${year}-02-01`);
    await page.getByLabel('To', { exact: true }).fill(`${year}-11-30`);
    await page.getByLabel(/Illuminance/).fill('100');
    await page.getByLabel(/Hours lit a day/).fill('8');
    await page.getByRole('button', { name: 'Save display' }).click();
    await page.getByText(/over its annual light allowance/).waitFor();
    expect(await meter.getAttribute('aria-valuetext')).toBe('4 000 lx·h of 150 000 lx·h (3 %)');
    await checkWidths(page, 'piece-light-warning');
    await page.getByRole('button', { name: 'Record it anyway' }).click();
    await page.getByRole('button', { name: 'Log a display' }).waitFor();
    // 1 Feb–30 Nov: 303 days (304 in a leap year) × 100 lux × 8 h; with January's 4 000: 246 400 lx·h, 164 %.
    const days = (Date.UTC(year, 10, 30) - Date.UTC(year, 1, 1)) / 86_400_000 + 1;
    const total = 4_000 + days * 800;
    const words = (n: number) => n.toLocaleString('en-GB').replace(/,/g, ' ');
    await expect
      .poll(() => meter.getAttribute('aria-valuetext'))
      .toBe(`${words(total)} lx·h of 150 000 lx·h (${Math.round((total / 150_000) * 100)} %)`);
    await page.close();
  });
});
