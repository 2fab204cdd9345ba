import { describe, expect, it } from 'vitest';
import type { Locator, Page } from 'playwright-core';
import { signInAs } from '../support/browser.ts';
import { useBrowserSuite } from '../support/browser-suite.ts';

// zod's own English, which must never reach the page.
const RAW = /Invalid input|Invalid option|expected (string|number|boolean)|received|Too big|Too small|Unrecognized key|Enter The|NaN/;

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
    await expect(page.getByRole('alert').textContent()).resolves.toBe('Some fields need attention; see the steps above.');
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
    await expect(messageOf(form.getByLabel('Dead-volume allowance'))).resolves.toBe('The dead-volume allowance must be 100 % or less');
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
});
