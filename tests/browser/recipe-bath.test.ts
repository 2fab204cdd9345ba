import { mkdirSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { BatchEvent, MordantBatch, RecipeStep, User, sequelize } from '../../server/models/index.ts';
import { withTrialCode } from '../../server/services/trials/code.ts';
import { createTrial } from '../../server/services/trials/trials.ts';
import { signInAs } from '../support/browser.ts';
import { useBrowserSuite } from '../support/browser-suite.ts';
import { testEnv } from '../support/env.ts';

const suite = useBrowserSuite();
// Screens for looking at, under the throwaway data directory.
const shots = testEnv.screensDir;

describe('a dyer draws from a bath in the recipe editor', () => {
  it('picks MB-xx by its code, saves the draw once, sees an overdraw refused beside the field and the scaling warning', async () => {
    mkdirSync(shots, { recursive: true });
    const dyer = await User.findOne({ where: { email: 'dyer@demo.test' }, rejectOnEmpty: true });
    const code = `MB-${Math.floor(100 + Math.random() * 899)}${Date.now() % 1000}`;
    const bath = await MordantBatch.create({
      code,
      kind: 'mordant-bath',
      name: 'Alum bath for the editor',
      ingredients: [],
      volumeMl: 1000,
      thickenerGPerL: null,
      ph: null,
      madeOn: '2024-05-01',
      madeById: dyer.id,
      checkBy: null,
      parentId: null,
      notes: null,
    });
    const trial = await withTrialCode((transaction) =>
      createTrial({ actor: dyer, transaction, input: { dryMassG: 250 } }),
    );
    await sequelize.transaction((transaction) =>
      RecipeStep.create(
        {
          trialId: trial.id,
          position: 1,
          operation: 'mordant-bath',
          ingredients: [],
          liquorRatio: 30,
          temperatureC: null,
          minutes: null,
          ph: null,
          paste: null,
          batchId: null,
          batchVolumeMl: null,
          notes: null,
        },
        { transaction },
      ),
    );

    const page = await suite.browser.context.newPage();
    await page.setViewportSize({ width: 1280, height: 900 });
    await signInAs(page, suite.server.url, 'dyer@demo.test');
    await page.goto(`${suite.server.url}/trials/${trial.id}`);
    await page.getByRole('button', { name: 'Edit recipe' }).click();
    const picker = page.getByLabel('Drawn from bath');
    await picker.locator('option', { hasText: code }).waitFor({ state: 'attached' });
    // The options name the bath by its code, never an internal number.
    const label = (await picker.locator('option', { hasText: code }).textContent())!;
    expect(label).toBe(`${code} — Alum bath for the editor (1000 mL left)`);
    await picker.selectOption({ label });
    await page.getByLabel('Volume drawn').fill('300');
    await page.screenshot({ path: `${shots}/recipe-bath-picker-1280.png`, fullPage: true });
    await page.getByRole('button', { name: 'Save recipe' }).click();
    await page.getByText(`drawn from ${code}:`).waitFor();
    expect(await page.getByText(`drawn from ${code}:`).textContent()).toContain('300 mL');
    // One record: the step's draw is the bath's use event, entered once.
    const uses = await BatchEvent.findAll({ where: { batchId: bath.id, type: 'use' } });
    expect(uses.map((e) => [e.volumeMl, e.trialId])).toEqual([[300, trial.id]]);

    // More than the bath holds: refused with the ledger's words beside the field, nothing changed.
    await page.getByRole('button', { name: 'Edit recipe' }).click();
    await page.getByLabel('Volume drawn').fill('1200');
    await page.getByRole('button', { name: 'Save recipe' }).click();
    await page.getByText('Only 1000 mL are left; 1200 mL cannot be drawn.').waitFor();
    await page.setViewportSize({ width: 390, height: 844 });
    await page.screenshot({ path: `${shots}/recipe-bath-overdraw-390.png`, fullPage: true });
    await page.setViewportSize({ width: 1280, height: 900 });
    expect((await BatchEvent.findAll({ where: { batchId: bath.id, type: 'use' } })).map((e) => e.volumeMl)).toEqual([
      300,
    ]);
    await page.getByRole('button', { name: 'Cancel' }).click();

    // Scaled to 1000 g the step draws 1200 mL; the bath holds 700 mL now.
    await page.getByLabel('Scale to dry mass').fill('1000');
    await page
      .getByText(
        `Scaled, this recipe draws 1,200 mL from ${code}, which holds 700 mL now: make up or top up the bath first.`,
      )
      .waitFor();
    await page.screenshot({ path: `${shots}/recipe-bath-scaling-1280.png`, fullPage: true });
    await page.setViewportSize({ width: 390, height: 844 });
    await page.screenshot({ path: `${shots}/recipe-bath-scaling-390.png`, fullPage: true });
    await page.close();
  });
});
