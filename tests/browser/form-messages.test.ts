import { describe, expect, it } from 'vitest';
import type { Locator, Page } from 'playwright-core';
import { TrialSeries } from '../../server/models/index.ts';
import { makePiece } from '../../server/seed/factories.ts';
import { signInAs } from '../support/browser.ts';
import { useBrowserSuite } from '../support/browser-suite.ts';
import { makePhotoWithMaster } from '../support/photos.ts';

// zod's own English, which must never reach the page.
const RAW =
  /Invalid input|Invalid option|expected (string|number|boolean)|received|Too big|Too small|Unrecognized key|Enter The|NaN/;

const suite = useBrowserSuite();

/** The message under a field: the element its aria-describedby names, as Field and Select render it. */
async function messageOf(field: Locator) {
  await field.and(field.page().locator('[aria-invalid="true"]')).waitFor();
  const id = await field.getAttribute('aria-describedby');
  return field.page().locator(`[id="${id}"]`).textContent();
}
const isFocused = (field: Locator) => field.evaluate((el) => el === document.activeElement);
async function noRawText(page: Page) {
  expect(await page.locator('body').innerText()).not.toMatch(RAW);
}

describe('every named form, empty and wrong, in people’s words under the fields', () => {
  it('the new-trial form', async () => {
    const page = await suite.browser.context.newPage();
    await signInAs(page, suite.server.url, 'dyer@demo.test');
    await page.goto(`${suite.server.url}/trials/new`);
    const mass = page.getByLabel('Dry fibre mass');
    await page.getByRole('button', { name: 'Create trial' }).click();
    await expect(messageOf(mass)).resolves.toBe('Enter the dry fibre mass in g');
    await expect.poll(() => isFocused(mass)).toBe(true);
    await noRawText(page);

    await mass.fill('heavy');
    await page.getByLabel('Fabric weight').fill('-2');
    await page.getByLabel('Started on').fill('2024-03-12');
    await page.getByRole('button', { name: 'Create trial' }).click();
    await expect(messageOf(mass)).resolves.toBe('Enter the dry fibre mass as a number in g');
    await expect(messageOf(page.getByLabel('Fabric weight'))).resolves.toBe('The fabric weight must be more than 0');
    await expect.poll(() => isFocused(mass)).toBe(true);
    await noRawText(page);
    expect(page.url()).toMatch(/\/trials\/new$/);
  });

  it('the recipe form', async () => {
    const page = await suite.browser.context.newPage();
    await signInAs(page, suite.server.url, 'dyer@demo.test');
    await page.goto(`${suite.server.url}/trials/new`);
    await page.getByLabel('Dry fibre mass').fill('25');
    await page.getByRole('button', { name: 'Create trial' }).click();
    await page.getByRole('button', { name: 'Edit recipe' }).click();
    const step = page.getByRole('group', { name: 'Step 1' });
    await page.getByRole('button', { name: 'Add ingredient' }).click();
    await step.getByLabel(/^Time/).fill('-5');
    await step.getByLabel(/^pH/).fill('15');
    await page.getByRole('button', { name: 'Save recipe' }).click();
    await step.locator('[aria-invalid="true"]').first().waitFor();
    const text = await step.innerText();
    expect(text).toContain('The time must be 0 min or more');
    expect(text).toContain('pH is 0–14');
    expect(text).toContain('Choose an ingredient');
    expect(text).toContain('Enter the amount');
    await expect.poll(() => isFocused(step.getByLabel(/^Time/))).toBe(true);
    await expect(page.getByRole('alert').textContent()).resolves.toBe(
      'Some fields need attention; see the steps above.',
    );
    await noRawText(page);
  });

  it('the new-bath form, with the uptake as a percentage', async () => {
    const page = await suite.browser.context.newPage();
    await signInAs(page, suite.server.url, 'dyer@demo.test');
    await page.goto(`${suite.server.url}/baths`);
    await page.getByRole('button', { name: 'New bath' }).click();
    const form = page.getByRole('form', { name: 'New bath' });
    await form.getByRole('button', { name: 'Create bath' }).click();
    const code = form.getByLabel('Code');
    await expect(messageOf(code)).resolves.toBe('Give the batch a code such as MB-12');
    await expect(messageOf(form.getByLabel('Name'))).resolves.toBe('Name the batch');
    await expect(messageOf(form.getByLabel(/^Volume/))).resolves.toBe('Enter the volume in mL');
    await expect.poll(() => isFocused(code)).toBe(true);
    await noRawText(page);

    await code.fill('MB 12?');
    await form.getByLabel('Name').fill('Alum bath');
    await form.getByLabel(/^Volume/).fill('-3');
    await form.getByLabel(/^pH/).fill('15');
    const uptake = form.getByLabel(/^Uptake per use/);
    await uptake.fill('150');
    await form.getByRole('button', { name: 'Create bath' }).click();
    await expect(messageOf(code)).resolves.toBe('Letters, digits and dashes only');
    await expect(messageOf(form.getByLabel(/^Volume/))).resolves.toBe('The volume must be more than 0 mL');
    await expect(messageOf(form.getByLabel(/^pH/))).resolves.toBe('The pH must be 14 or less');
    await expect(messageOf(uptake)).resolves.toBe('Give the uptake per use as a percentage from 0 to 100');
    await expect.poll(() => isFocused(code)).toBe(true);
    await noRawText(page);

    // A percentage is taken as one: 12 % is stored and shown as 12 %.
    await code.fill(`PC-${Date.now() % 1_000_000}`);
    await form.getByLabel(/^Volume/).fill('1000');
    await form.getByLabel(/^pH/).fill('');
    await uptake.fill('12');
    await form.getByRole('button', { name: 'Create bath' }).click();
    await page.waitForURL(/\/baths\/\d+$/);
    await page.getByText('uptake 12 % per use', { exact: false }).waitFor();
  });

  it('the new-series form', async () => {
    const page = await suite.browser.context.newPage();
    await signInAs(page, suite.server.url, 'dyer@demo.test');
    await page.goto(`${suite.server.url}/series`);
    await page.getByRole('button', { name: 'Plan a series' }).click();
    const form = page.getByRole('form', { name: 'New series' });
    await form.getByLabel('Dry mass per cell').fill('');
    await form.getByRole('button', { name: 'Create series' }).click();
    const code = form.getByLabel('Code');
    await expect(messageOf(code)).resolves.toBe('Enter the code');
    await expect(messageOf(form.getByLabel('Title'))).resolves.toBe('Give the series a title');
    await expect(messageOf(form.getByLabel('Dry mass per cell'))).resolves.toBe('Enter the dry mass per cell in g');
    await expect.poll(() => isFocused(code)).toBe(true);
    await noRawText(page);

    await code.fill('S');
    await form.getByLabel('Title').fill('Madder strengths');
    await form.getByLabel('Dry mass per cell').fill('10');
    await form.getByLabel('Dead-volume allowance').fill('150');
    await form.getByLabel('Factor', { exact: true }).first().fill('');
    await form.getByRole('button', { name: 'Create series' }).click();
    await expect(messageOf(code)).resolves.toBe('Use at least 2 characters for the code');
    await expect(messageOf(form.getByLabel('Dead-volume allowance'))).resolves.toBe(
      'The dead-volume allowance must be 100 % or less',
    );
    await expect(form.innerText()).resolves.toContain('Name the factor');
    await expect.poll(() => isFocused(code)).toBe(true);
    await noRawText(page);
  });

  it('the invitation form', async () => {
    const page = await suite.browser.context.newPage();
    await signInAs(page, suite.server.url, 'admin@demo.test');
    await page.goto(`${suite.server.url}/team`);
    const email = page.getByLabel('E-mail');
    await page.getByRole('button', { name: 'Send invitation' }).click();
    await expect(messageOf(email)).resolves.toBe('Enter an e-mail address such as name@example.org');
    await expect.poll(() => isFocused(email)).toBe(true);
    await email.fill('someone');
    await page.getByRole('button', { name: 'Send invitation' }).click();
    await expect(messageOf(email)).resolves.toBe('Enter an e-mail address such as name@example.org');
    await noRawText(page);
  });

  it('the shade search: a bad hex or radius is said under its field and the old results go', async () => {
    const page = await suite.browser.context.newPage();
    await signInAs(page, suite.server.url, 'researcher@demo.test');
    await page.goto(`${suite.server.url}/search?hex=9b2f2f&maxDeltaE=30`);
    await page.getByRole('table', { name: 'Shade matches' }).waitFor();
    await expect(page.getByTestId('result-count').textContent()).resolves.toMatch(/within ΔE00 30/);

    const hex = page.getByLabel('Hex');
    await hex.fill('red');
    await page.getByRole('button', { name: 'Find this hex' }).click();
    await expect(messageOf(hex)).resolves.toBe('Give a colour as six hex digits, e.g. 9b2f2f');
    await expect.poll(() => isFocused(hex)).toBe(true);
    await expect(page.getByTestId('result-count').textContent()).resolves.toBe('No search: correct the shade.');
    await expect(page.getByRole('table', { name: 'Shade matches' }).count()).resolves.toBe(0);
    await noRawText(page);

    await hex.fill('9b2f2f');
    const radius = page.getByLabel('Radius');
    await radius.fill('99');
    await page.getByRole('button', { name: 'Find this hex' }).click();
    await expect(messageOf(radius)).resolves.toBe('Use a radius of at most 30 ΔE00');
    await expect(page.getByRole('table', { name: 'Shade matches' }).count()).resolves.toBe(0);
    await radius.fill('abc');
    await page.getByRole('button', { name: 'Find this hex' }).click();
    await expect(messageOf(radius)).resolves.toBe('Give the radius as a number');
    await noRawText(page);

    await radius.fill('30');
    await page.getByRole('button', { name: 'Find this hex' }).click();
    await page.getByRole('table', { name: 'Shade matches' }).waitFor();
    await expect(hex.getAttribute('aria-invalid')).resolves.toBeNull();
  });

  it('the reading, substitution and fastness forms of a trial', async () => {
    const page = await suite.browser.context.newPage();
    await signInAs(page, suite.server.url, 'dyer@demo.test');
    await page.goto(`${suite.server.url}/trials/new`);
    await page.getByLabel('Dry fibre mass').fill('25');
    await page.getByRole('button', { name: 'Create trial' }).click();
    await page.waitForURL(/\/trials\/\d+$/);

    const reading = page.getByRole('form', { name: 'Add a reading' });
    const L = reading.getByLabel('L*', { exact: true });
    await reading.getByRole('button', { name: 'Add reading' }).click();
    await expect(messageOf(L)).resolves.toBe('Enter L* as a number from 0 to 100');
    await expect(messageOf(reading.getByLabel('b*', { exact: true }))).resolves.toBe(
      'Enter b* as a number from −200 to 200',
    );
    await expect.poll(() => isFocused(L)).toBe(true);
    await L.fill('120');
    await reading.getByLabel('a*', { exact: true }).fill('0');
    await reading.getByLabel('b*', { exact: true }).fill('0');
    await reading.getByRole('button', { name: 'Add reading' }).click();
    await expect(messageOf(L)).resolves.toBe('L* is 0–100');
    await noRawText(page);

    await page.getByRole('button', { name: 'Add a substitution' }).click();
    const sub = page.getByRole('form', { name: 'Record a substitution' });
    const historical = sub.getByLabel('Historical chemical');
    await sub.getByRole('button', { name: 'Save substitution' }).click();
    await expect(messageOf(historical)).resolves.toBe('Name the historical chemical or practice.');
    await expect(messageOf(sub.getByLabel('Modern chemical'))).resolves.toBe('Name the modern chemical or practice.');
    await expect.poll(() => isFocused(historical)).toBe(true);
    await sub.getByLabel('or historical practice').fill('chrome mordant');
    await sub.getByLabel('or modern practice').fill('alum mordant');
    await sub.getByLabel('Historical amount').fill('lots');
    await sub.getByRole('button', { name: 'Save substitution' }).click();
    await expect(messageOf(sub.getByLabel('Historical amount'))).resolves.toBe(
      'Enter the historical amount as a number in g',
    );
    await noRawText(page);

    // Every grade is chosen from its list, so the grades cannot be wrong on screen; they save as before.
    await page.getByRole('button', { name: 'Record grades' }).click();
    const grades = page.getByRole('form', { name: 'Fastness grades' });
    await grades.getByLabel('Light (blue wool 1–8)').selectOption('5');
    await grades.getByLabel('Washing: staining').selectOption('4-5');
    await grades.getByRole('button', { name: 'Save grades' }).click();
    await grades.waitFor({ state: 'detached' });
    const fastness = page.getByRole('region', { name: 'Fastness' });
    await expect.poll(() => fastness.innerText()).toMatch(/blue wool\)\s*5/);
    expect(await fastness.innerText()).toMatch(/change —, staining 4-5/);
  });

  it('the new-region form', async () => {
    const piece = await makePiece({ status: 'published', title: 'Region form piece' });
    await makePhotoWithMaster(piece.id, { width: 900, height: 600 });
    const page = await suite.browser.context.newPage();
    await signInAs(page, suite.server.url, 'curator@demo.test');
    await page.goto(`${suite.server.url}/archive/${piece.id}`);
    const form = page.getByRole('form', { name: 'New region' });
    const x = form.getByLabel(/^x\b/);
    await form.getByRole('button', { name: 'Save region' }).click();
    await expect(messageOf(x)).resolves.toBe('Enter x in pixels');
    await expect(messageOf(form.getByLabel('Width'))).resolves.toBe('Enter width in pixels');
    await expect.poll(() => isFocused(x)).toBe(true);
    await noRawText(page);

    await x.fill('850');
    await form.getByLabel(/^y\b/).fill('0');
    await form.getByLabel('Width').fill('100');
    await form.getByLabel('Height').fill('2.5');
    await form.getByRole('button', { name: 'Save region' }).click();
    await expect(messageOf(form.getByLabel('Height'))).resolves.toBe('Use whole pixels for height');
    await form.getByLabel('Height').fill('10');
    await form.getByRole('button', { name: 'Save region' }).click();
    await expect(messageOf(form.getByLabel('Width'))).resolves.toBe('Reaches past the right edge (900 px wide)');
    await noRawText(page);
  });

  it('the words of the trial list, the archive and the search: too long is said under the box', async () => {
    const page = await suite.browser.context.newPage();
    await signInAs(page, suite.server.url, 'curator@demo.test');

    await page.goto(`${suite.server.url}/trials`);
    const trialWords = page.getByRole('search').getByLabel('Words');
    await trialWords.fill('x'.repeat(101));
    await page.getByRole('search').getByRole('button', { name: 'Search' }).click();
    await expect(messageOf(trialWords)).resolves.toBe('Use at most 100 characters for the words');
    await expect.poll(() => isFocused(trialWords)).toBe(true);
    expect(new URL(page.url()).searchParams.get('q')).toBeNull();
    await trialWords.fill('madder');
    await page.getByRole('search').getByRole('button', { name: 'Search' }).click();
    await page.waitForURL(/q=madder/);
    await expect(trialWords.getAttribute('aria-invalid')).resolves.toBeNull();

    await page.goto(`${suite.server.url}/archive`);
    const archiveWords = page.getByLabel('Accession number or title');
    await archiveWords.fill('x'.repeat(121));
    await expect(messageOf(archiveWords)).resolves.toBe('Use at most 120 characters for the words');
    await archiveWords.fill('1931');
    await expect.poll(() => archiveWords.getAttribute('aria-invalid')).toBeNull();

    await page.goto(`${suite.server.url}/search`);
    const words = page.getByRole('search').getByLabel('Words');
    await words.fill('x'.repeat(201));
    await page.getByRole('search').getByRole('button', { name: 'Search' }).click();
    await expect(messageOf(words)).resolves.toBe('Use at most 200 characters');
    expect(new URL(page.url()).searchParams.get('q')).toBeNull();
    await noRawText(page);
  });

  it('the series target form: chosen from its list, it saves through the shared schema as before', async () => {
    const series = await TrialSeries.findOne({ where: { code: 'WS-2024-01' }, rejectOnEmpty: true });
    const page = await suite.browser.context.newPage();
    await signInAs(page, suite.server.url, 'tamsin.orrery@weldfold.test');
    await page.goto(`${suite.server.url}/series/${series.id}`);
    const form = page.getByRole('form', { name: 'Target colour' });
    const target = form.getByLabel('Target colour of the original');
    await target.locator('option').nth(1).waitFor({ state: 'attached' });
    const chosen = await target.locator('option').nth(1).getAttribute('value');
    await target.selectOption(chosen!);
    const save = form.getByRole('button', { name: 'Save target' });
    await save.click();
    await expect.poll(() => save.isDisabled()).toBe(true);
    await page.reload();
    await expect
      .poll(() =>
        page.getByRole('form', { name: 'Target colour' }).getByLabel('Target colour of the original').inputValue(),
      )
      .toBe(chosen);
    await series.reload();
    expect(
      [series.targetPaletteColourId, series.targetRegionId, series.targetMeasurementId].filter((x) => x != null),
    ).toHaveLength(1);
    // The demo workshop goes back to no target, as the other suites know it.
    await series.update({ targetPaletteColourId: null, targetRegionId: null, targetMeasurementId: null });
  });

  it('the sign-in and new-piece forms, empty', async () => {
    const page = await suite.browser.context.newPage();
    await page.goto(`${suite.server.url}/sign-in`);
    const email = page.getByLabel('E-mail');
    await page.locator('main').getByRole('button', { name: 'Sign in', exact: true }).click();
    await expect(messageOf(email)).resolves.toBe('Enter an e-mail address such as name@example.org');
    await expect(messageOf(page.getByLabel('Password'))).resolves.toBe('Enter your password');
    await expect.poll(() => isFocused(email)).toBe(true);
    await noRawText(page);

    await signInAs(page, suite.server.url, 'curator@demo.test');
    await page.goto(`${suite.server.url}/archive/new`);
    const accession = page.getByLabel('Accession number');
    await page.getByRole('button', { name: 'Save draft' }).click();
    await expect(messageOf(accession)).resolves.toMatch(/accession number/i);
    await expect.poll(() => isFocused(accession)).toBe(true);
    await noRawText(page);
    expect(page.url()).toMatch(/\/archive\/new$/);
  });
});
