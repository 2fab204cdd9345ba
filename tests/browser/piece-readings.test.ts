import { describe, expect, it } from 'vitest';
import { User } from '../../server/models/index.ts';
import { makePiece } from '../../server/seed/factories.ts';
import { withTrialCode } from '../../server/services/trials/code.ts';
import { createTrial } from '../../server/services/trials/trials.ts';
import { signInAs } from '../support/browser.ts';
import { useBrowserSuite } from '../support/browser-suite.ts';
import { testEnv } from '../support/env.ts';
import check from '../reference/spectra-check.json' with { type: 'json' };
import { ColourMeasurement } from '../../server/models/index.ts';

// A researcher pastes the original's spectrum on the piece page (issue 17, point 2); the dyer's trial aimed at it
// then gives the metamerism table from the UI alone. Keyboard only, no sideways scrolling at 1280, 768 and 390 px.
const suite = useBrowserSuite();
const rose = check.spectra.find((s) => s.case === 'rose')!;
const pairs = (values: number[]) => values.map((v, i) => `${400 + 10 * i}, ${(v * 100).toFixed(2)}`).join('\n');

describe('readings of the original on the piece page', () => {
  it('takes a pasted spectrum with its place and conditions, lists it, draws it, and a trial aimed at it compares under each light', async () => {
    const piece = await makePiece({ title: `Spectral original ${Date.now().toString(36)}` });
    const page = await suite.browser.context.newPage();
    await page.setViewportSize({ width: 1280, height: 900 });
    await signInAs(page, suite.server.url, 'researcher@demo.test');
    await page.goto(`${suite.server.url}/archive/${piece.id}`);
    const form = page.locator('form[aria-label="Add a reading of the original"]');
    await form.waitFor();
    const area = form.getByLabel('Reflectance spectrum (optional, instead of L*a*b*)');

    // A too-short spectrum: the message beside the field, which takes the focus.
    await area.fill(pairs(rose.values.slice(0, 12)));
    await form.getByRole('button', { name: 'Add reading of the original' }).focus();
    await page.keyboard.press('Enter');
    await expect.poll(() => area.getAttribute('aria-invalid')).toBe('true');
    expect(await form.innerText()).toMatch(/31 to 39 values/);

    await form.getByLabel('Place on the piece').fill('rose ground');
    await area.fill(pairs(rose.values));
    await form.getByLabel('Illuminant').selectOption('LED-B3');
    await form.getByRole('button', { name: 'Add reading of the original' }).focus();
    await page.keyboard.press('Enter');
    const table = page.getByRole('table', { name: 'Readings of the original' });
    await table.getByText('rose ground').waitFor();
    expect(await table.innerText()).toMatch(/LED-B3\/10°[\s\S]*400–700 nm/);
    expect(await page.getByRole('img', { name: 'Reflectance spectra of the original' }).count()).toBe(1);
    for (const width of [1280, 768, 390]) {
      await page.setViewportSize({ width, height: 900 });
      if (testEnv.screenshotDir)
        await page.screenshot({ path: `${testEnv.screenshotDir}/piece-readings-${width}.png`, fullPage: true });
      const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
      expect(overflow).toBeLessThanOrEqual(1);
    }

    // The dyer's trial aims at it; a spectral result gives the table under every illuminant.
    const reading = await ColourMeasurement.findOne({ where: { pieceId: piece.id }, rejectOnEmpty: true });
    const dyer = await User.findOne({ where: { email: 'dyer@demo.test' }, rejectOnEmpty: true });
    const trial = await withTrialCode((transaction) =>
      createTrial({
        actor: dyer,
        transaction,
        input: { dryMassG: 20, pieceId: piece.id, targetMeasurementId: reading.id },
      }),
    );
    await page.setViewportSize({ width: 1280, height: 900 });
    await signInAs(page, suite.server.url, 'dyer@demo.test');
    await page.goto(`${suite.server.url}/trials/${trial.id}`);
    const sample = rose.values.map((v, i) => v * (1 + 0.12 * Math.sin(i / 3)));
    await page.getByLabel('Reflectance spectrum (optional, instead of L*a*b*)').fill(pairs(sample));
    await page.getByRole('button', { name: 'Add reading', exact: true }).focus();
    await page.keyboard.press('Enter');
    const metamerism = page.getByRole('table', { name: /The pair under each illuminant/ });
    await metamerism.waitFor();
    expect(await metamerism.locator('tbody tr').count()).toBe(6);
    expect(await metamerism.innerText()).toMatch(/LED-B3/);
    await page.close();
  });
});
