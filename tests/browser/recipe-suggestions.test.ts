import { describe, expect, it } from 'vitest';
import { Piece, RecipeStep, Trial } from '../../server/models/index.ts';
import { signInAs } from '../support/browser.ts';
import { useBrowserSuite } from '../support/browser-suite.ts';

// Issue 20: from a colour on a historical piece to a planned trial in two clicks, "Suggest a recipe" then "Try this".
// The demo's madder ladder (5–40 % owf on tannin and alum, server/seed/demo.ts) gives the red its suggestion.
const suite = useBrowserSuite();
const DEMO_PIECE = '1931.4.12';
const MADDER_RED = '#a53a2d';

describe('recipe suggestions in the browser', () => {
  it('the dyer goes from a madder red on a demo piece to a planned trial from the madder ladder', async () => {
    const { server, browser } = suite;
    const piece = await Piece.findOne({ where: { accessionNumber: DEMO_PIECE }, rejectOnEmpty: true });
    const page = await browser.context.newPage();
    await page.setViewportSize({ width: 1280, height: 900 });
    await signInAs(page, server.url, 'dyer@demo.test');
    await page.goto(`${server.url}/archive/${piece.id}`);
    const swatch = page.getByTestId('palette-colour').filter({ hasText: MADDER_RED }).first();
    await swatch.getByRole('link', { name: 'Suggest a recipe' }).click();

    await page.waitForURL((u) => u.pathname === '/suggest');
    await expect.poll(() => page.getByTestId('recipe-suggestion').count()).toBeGreaterThan(0);
    // The target is labelled with its viewing conditions (a palette colour: an image estimate, D65/2°).
    await expect.poll(() => page.getByTestId('viewing-conditions').first().textContent()).toMatch(/D65\/2°/);
    const ladder = page
      .getByTestId('recipe-suggestion')
      .filter({ hasText: 'Ladder of 4 trials' })
      .filter({ hasText: 'madder' })
      .first();
    await expect.poll(() => ladder.textContent()).toMatch(/Expected error/);
    expect(await ladder.textContent()).toMatch(/ΔE00 [\d.,]+ under D65\/2°/);
    // A caution before weighing anything.
    expect(await page.getByRole('note').textContent()).toMatch(/safety data sheet/);
    await page.screenshot({ path: '.data/test/suggestions-1280.png', fullPage: true });

    const before = await Trial.count();
    await ladder.getByRole('button', { name: 'Try this' }).click();
    await page.waitForURL((u) => /^\/trials\/\d+$/.test(u.pathname));
    const id = Number(new URL(page.url()).pathname.split('/').pop());
    const trial = await Trial.findByPk(id, { rejectOnEmpty: true });
    expect(await Trial.count()).toBe(before + 1);
    expect(trial).toMatchObject({ status: 'planned', pieceId: piece.id });
    expect(trial.targetPaletteColourId).not.toBeNull();
    expect(trial.notes).toMatch(/^Suggested recipe\. madder at/);
    const steps = await RecipeStep.findAll({ where: { trialId: id }, order: [['position', 'ASC']] });
    expect(steps.map((s) => s.operation)).toEqual(['tannin', 'mordant-bath', 'dye-bath']);
    expect(steps[2].ingredients[0].name).toBe('madder');
  });

  it('fits a phone: no sideways scroll at 390 and 768 px', async () => {
    const { server, browser } = suite;
    const piece = await Piece.findOne({ where: { accessionNumber: DEMO_PIECE }, rejectOnEmpty: true });
    const page = await browser.context.newPage();
    await signInAs(page, server.url, 'researcher@demo.test');
    for (const width of [390, 768]) {
      await page.setViewportSize({ width, height: 900 });
      await page.goto(`${server.url}/archive/${piece.id}`);
      await page
        .getByTestId('palette-colour')
        .filter({ hasText: MADDER_RED })
        .first()
        .getByRole('link', { name: 'Suggest a recipe' })
        .click();
      await expect.poll(() => page.getByTestId('recipe-suggestion').count()).toBeGreaterThan(0);
      // Researchers see the suggestions but do not start trials.
      expect(await page.getByRole('button', { name: 'Try this' }).count()).toBe(0);
      expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(width);
      await page.screenshot({ path: `.data/test/suggestions-${width}.png`, fullPage: true });
    }
  });
});
