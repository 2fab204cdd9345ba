import { describe, expect, it } from 'vitest';
import { User } from '../../server/models/index.ts';
import { withTrialCode } from '../../server/services/trials/code.ts';
import { createTrial } from '../../server/services/trials/trials.ts';
import { signInAs } from '../support/browser.ts';
import { useBrowserSuite } from '../support/browser-suite.ts';

const suite = useBrowserSuite();

describe('the trial page shows its checks', () => {
  it('asks for a confirmation and a reason beside a historical-only chemical, shows who confirmed, the dry mass basis and the mordant range', async () => {
    const dyer = await User.findOne({ where: { email: 'dyer@demo.test' }, rejectOnEmpty: true });
    // 100 g oven-dry wool: 113.6 g air-dry at ASTM D1909's 13.6 % (recalled from memory).
    const trial = await withTrialCode((transaction) =>
      createTrial({ actor: dyer, transaction, input: { dryMassG: 100, fibre: 'wool', dryMassBasis: 'oven-dry' } }),
    );
    const page = await suite.browser.context.newPage();
    await signInAs(page, suite.server.url, 'dyer@demo.test');
    await page.goto(`${suite.server.url}/trials/${trial.id}`);
    await page.getByText('113.6 g').first().waitFor();
    expect(
      await page
        .getByText(/oven-dry/)
        .first()
        .textContent(),
    ).toBeTruthy();

    await page.getByRole('button', { name: 'Edit recipe' }).click();
    const step = page.getByRole('group', { name: 'Step 1' });
    await page.getByRole('button', { name: 'Add ingredient' }).click();
    await step
      .getByLabel('Step 1 ingredient 1', { exact: true })
      .selectOption({ label: 'lead(II) acetate (sugar of lead) — historical only' });
    await step.getByLabel('Step 1 ingredient 1 amount').fill('5');
    await page.getByRole('button', { name: 'Add ingredient' }).click();
    await step.getByLabel('Step 1 ingredient 2', { exact: true }).selectOption({ label: 'potash alum' });
    await step.getByLabel('Step 1 ingredient 2 amount').fill('12');
    await step.getByText('kept for historical recipes only').waitFor();
    await page.getByRole('button', { name: 'Save recipe' }).click();
    await step.getByText(/confirm its use in this modern trial/).waitFor();
    expect(await step.innerText()).toContain('Say why lead(II) acetate (sugar of lead) is used');

    await step.getByLabel(/I confirm step 1 uses/).check();
    await step.getByLabel(/^Reason/).fill('Reconstruction for the study, under extraction');
    await page.getByRole('button', { name: 'Save recipe' }).click();
    const confirmed = page.getByTestId('historical-use');
    await confirmed.waitFor();
    expect(await confirmed.textContent()).toMatch(
      /confirmed by Bryony Kettlewick .*Reconstruction for the study, under extraction/,
    );
    // Alum 12 % owf on wool beside the common-practice 8–15 % owf, with its aluminium per kg fibre.
    const range = page.getByTestId('mordant-range');
    await range.waitFor();
    expect(await range.textContent()).toMatch(
      /usual 8–15 % owf .*within the usual range.*g Al\/kg fibre.*common practice, recalled from memory/,
    );

    // A reducer with an acid in one step: warned in the editor as soon as both are chosen, and beside the saved step.
    // Saving again carries step 1's confirmation back, so it is not asked for twice.
    await page.getByRole('button', { name: 'Edit recipe' }).click();
    await page.getByRole('button', { name: 'Add step' }).click();
    const two = page.getByRole('group', { name: 'Step 2' });
    await two.getByRole('button', { name: 'Add ingredient' }).click();
    await two
      .getByLabel('Step 2 ingredient 1', { exact: true })
      .selectOption({ label: 'sodium dithionite (hydrosulfite)' });
    await two.getByLabel('Step 2 ingredient 1 amount').fill('2');
    await two.getByRole('button', { name: 'Add ingredient' }).click();
    await two.getByLabel('Step 2 ingredient 2', { exact: true }).selectOption({ label: 'acetic acid (vinegar, 5 %)' });
    await two.getByLabel('Step 2 ingredient 2 amount').fill('5');
    await two.getByTestId('mix-warnings').waitFor();
    expect(await two.getByTestId('mix-warnings').textContent()).toMatch(/sulfur dioxide.*EUH031/);
    await page.getByRole('button', { name: 'Save recipe' }).click();
    await page.getByRole('button', { name: 'Edit recipe' }).waitFor();
    const saved = page.getByTestId('recipe-step').nth(1);
    expect(await saved.innerText()).toMatch(/sulfur dioxide/);
    expect(await confirmed.textContent()).toMatch(/Reconstruction for the study/);
    await page.close();
  });
});
