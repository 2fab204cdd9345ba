import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { User } from '../../server/models/index.ts';
import { makeMeasurement, makePiece } from '../../server/seed/factories.ts';
import { withTrialCode } from '../../server/services/trials/code.ts';
import { createTrial } from '../../server/services/trials/trials.ts';
import { signInAs } from '../support/browser.ts';
import { useBrowserSuite } from '../support/browser-suite.ts';
import { testEnv } from '../support/env.ts';
import check from '../reference/spectra-check.json' with { type: 'json' };

// A dyer pastes the swatch's spectrum on the trial page and, the original having been measured as
// a spectrum too, sees both curves and how the pair holds under each light — by keyboard only.
const suite = useBrowserSuite();
const rose = check.spectra.find((s) => s.case === 'rose')!;
const pairs = (values: number[], scale = 100) =>
  values.map((v, i) => `${400 + 10 * i}\t${(v * scale).toFixed(2)}`).join('\n');

async function picture(page: Page, name: string) {
  if (!testEnv.screenshotDir) return;
  for (const width of [1280, 390]) {
    await page.setViewportSize({ width, height: width === 390 ? 844 : 900 });
    await page.screenshot({ path: `${testEnv.screenshotDir}/${name}-${width}.png`, fullPage: true });
  }
  await page.setViewportSize({ width: 1280, height: 900 });
}

describe('spectral readings on the trial page', () => {
  it('takes a pasted spectrum, draws the curves and gives the metamerism table, keyboard only', async () => {
    const dyer = await User.findOne({ where: { email: 'dyer@demo.test' }, rejectOnEmpty: true });
    const piece = await makePiece({ title: 'Spectral test piece' });
    const target = await makeMeasurement({
      pieceId: piece.id,
      L: 60,
      a: 32,
      b: 28,
      label: 'rose ground',
      spectrum: rose,
    });
    const trial = await withTrialCode((transaction) =>
      createTrial({
        actor: dyer,
        transaction,
        input: { dryMassG: 20, pieceId: piece.id, targetMeasurementId: target.id },
      }),
    );
    const page = await suite.browser.context.newPage();
    await signInAs(page, suite.server.url, 'dyer@demo.test');
    await page.goto(`${suite.server.url}/trials/${trial.id}`);
    const area = page.getByLabel('Reflectance spectrum (optional, instead of L*a*b*)');

    // Too short a spectrum: the schema's message beside the field, which takes the focus.
    await area.fill(pairs(rose.values.slice(0, 12)));
    await area.focus();
    await page.keyboard.press('Tab'); // the CSV file input
    await page.getByRole('button', { name: 'Add reading' }).focus();
    await page.keyboard.press('Enter');
    await expect.poll(() => area.getAttribute('aria-invalid')).toBe('true');
    expect(await page.locator('form[aria-label="Add a reading"]').innerText()).toMatch(
      /31 to 39 values; these 12 end at 510 nm/,
    );
    expect(await page.evaluate(() => document.activeElement?.tagName)).toBe('TEXTAREA');

    // A reproduction a little bluer in the short waves: a metameric-looking pair.
    const sample = rose.values.map((v, i) => v * (1 + 0.12 * Math.sin(i / 3)));
    await area.fill(pairs(sample));
    await page.getByRole('button', { name: 'Add reading' }).focus();
    await page.keyboard.press('Enter');
    const summary = page.getByTestId('metamerism-summary');
    await summary.waitFor();
    expect(await summary.textContent()).toMatch(/daylight/);

    const table = page.getByRole('table', { name: /The pair under each illuminant/ });
    expect(await table.locator('tbody tr').count()).toBe(6);
    expect(await table.innerText()).toMatch(/worst/);
    const chart = page.getByRole('img', { name: 'Reflectance spectra of the original and the reproduction' });
    expect(await chart.innerHTML()).toMatch(/Wavelength \(nm\)[\s\S]*Reflectance \(%\)/);
    expect(await page.getByRole('img', { name: 'Reflectance spectra of the swatch readings' }).count()).toBe(1);

    // The values behind the curves open from the keyboard.
    const values = page.locator('summary', { hasText: 'Values' }).first();
    await values.focus();
    await page.keyboard.press('Enter');
    await page.getByRole('columnheader', { name: 'Wavelength (nm)' }).first().waitFor();

    // No sideways scrolling on a phone.
    await page.setViewportSize({ width: 390, height: 844 });
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
    await page.setViewportSize({ width: 1280, height: 900 });
    await picture(page, 'trial-spectral');
    await page.close();
  });
});

describe('fastness grades computed from readings', () => {
  it('shows the grade computed from before/after readings beside the assessor’s', async () => {
    const dyer = await User.findOne({ where: { email: 'dyer@demo.test' }, rejectOnEmpty: true });
    const trial = await withTrialCode((transaction) =>
      createTrial({ actor: dyer, transaction, input: { dryMassG: 10 } }),
    );
    const page = await suite.browser.context.newPage();
    await signInAs(page, suite.server.url, 'dyer@demo.test');
    await page.goto(`${suite.server.url}/trials/${trial.id}`);
    await page.getByRole('button', { name: 'Record grades' }).click();
    const grades = page.getByRole('form', { name: 'Fastness grades' });
    await grades.getByLabel('Washing: change in colour', { exact: true }).selectOption('3-4');
    // A neutral pair 3.4 apart: grade 3 by ISO 105-A05 (formula recalled from memory), at the
    // ISO 105-A02 nominal difference of grade 3 (tests/reference/fastness-scales.json).
    await grades.getByLabel('Before the test (washing, change in colour)').fill('60 0 0');
    await grades.getByLabel('After the test (washing, change in colour)').fill('56.6 0');
    await grades.getByRole('button', { name: 'Save grades' }).click();
    const after = grades.getByLabel('After the test (washing, change in colour)');
    await expect.poll(() => after.getAttribute('aria-invalid')).toBe('true');
    expect(await grades.innerText()).toMatch(/Enter b\* as a number from −200 to 200/);
    await after.fill('56.6 0 0');
    await grades.getByRole('button', { name: 'Save grades' }).click();
    await grades.waitFor({ state: 'detached' });
    const computed = page.getByTestId('computed-grade').first();
    await computed.waitFor();
    expect(await computed.textContent()).toMatch(/computed 3, 3\.00, ISO 105-A05/);
    expect(await page.getByRole('region', { name: 'Fastness' }).innerText()).toMatch(/change 3-4/);
    await page.close();
  });
});
