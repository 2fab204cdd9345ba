import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launchBrowser, signInAs } from '../support/browser.ts';
import { startServer } from '../support/server.ts';
import { MordantBatch, User, sequelize } from '../../server/models/index.ts';

let server: Awaited<ReturnType<typeof startServer>>;
let browser: Awaited<ReturnType<typeof launchBrowser>>;
let batch: MordantBatch;
beforeAll(async () => {
  server = await startServer();
  browser = await launchBrowser();
  const dyer = await User.findOne({ where: { email: 'dyer@demo.test' }, rejectOnEmpty: true });
  batch = await MordantBatch.create({
    code: `BR-${Date.now() % 1_000_000}`,
    kind: 'mordant-bath',
    name: 'Browser test alum bath',
    ingredients: [],
    volumeMl: 500,
    thickenerGPerL: null,
    ph: null,
    madeOn: '2024-05-01',
    madeById: dyer.id,
    checkBy: null,
    parentId: null,
    notes: null,
  });
});
afterAll(async () => {
  await browser?.close();
  await server?.close();
  await sequelize.close();
});

describe('the bath ledger in Chromium', () => {
  it('lets the dyer draw from a bath for a trial and shows the remaining volume drop', async () => {
    const page = await browser.context.newPage();
    await signInAs(page, server.url, 'dyer@demo.test');
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Baths' }).click();
    await page.getByRole('link', { name: batch.code }).first().click();
    const remaining = page.locator('dt:text-is("Remaining") + dd');
    await expect(remaining.textContent()).resolves.toBe('500 mL');

    await page.getByRole('tab', { name: 'Draw for a trial' }).click();
    await page.getByLabel('Volume drawn').fill('120');
    await page.getByLabel('Trial code').fill('T-2024-001');
    await page.getByLabel('Fibre mass').fill('50');
    await page.getByRole('button', { name: 'Record' }).click();
    await page.getByRole('status').filter({ hasText: 'recorded' }).waitFor();
    await expect(remaining.textContent()).resolves.toBe('380 mL');
    await expect(page.getByRole('table', { name: 'Ledger' }).textContent()).resolves.toContain('−120');

    // A draw larger than what is left is refused with the server's words, and nothing changes.
    await page.getByLabel('Volume drawn').fill('400');
    await page.getByRole('button', { name: 'Record' }).click();
    await expect(page.getByRole('alert').textContent()).resolves.toMatch(/Only 380 mL/);
    await expect(remaining.textContent()).resolves.toBe('380 mL');
  });

  it('lets the dyer make a new bath from chemicals in grams, and shows them with its cautions', async () => {
    const page = await browser.context.newPage();
    await signInAs(page, server.url, 'dyer@demo.test');
    await page.goto(`${server.url}/baths`);
    await page.getByRole('heading', { name: 'Baths', level: 1 }).waitFor();
    await page.getByRole('button', { name: 'New bath' }).click();
    const form = page.getByRole('form', { name: 'New bath' });
    const code = `NB-${Date.now() % 1_000_000}`;
    await form.getByLabel('Code').fill(code);
    await form.getByLabel('Name').fill('Alum and chalk bath made in the browser');
    await form.getByLabel(/^Volume/).fill('3000');
    await form.getByLabel('Ingredient 1', { exact: true }).selectOption({ label: 'potash alum' });
    await form.getByLabel('Amount of ingredient 1 (g)').fill('45');
    await form.getByRole('button', { name: 'Add an ingredient' }).click();
    await form.getByLabel('Ingredient 2', { exact: true }).selectOption({ label: 'calcium carbonate (chalk)' });
    await form.getByLabel('Amount of ingredient 2 (g)').fill('6');
    await form.getByRole('button', { name: 'Create bath' }).click();
    await page.getByRole('heading', { name: new RegExp(code) }).waitFor();
    const ingredients = await page.getByRole('region', { name: 'Ingredients' }).textContent();
    expect(ingredients).toContain('potash alum: 45 g');
    expect(ingredients).toContain('calcium carbonate (chalk): 6 g');
    expect(ingredients).toContain('Made up to 3000 mL with water');
    // The uptake was left empty: a mordant bath takes 10 % per load, the load being 3000 mL at 1:20 = 150 g fibre.
    await page.getByText('uptake 10 % per use of 150 g fibre', { exact: false }).waitFor();

    // One load drawn with 1000 mL: 2000 mL left holding 45 × 2/3 × 0.9 = 27 g alum and 6 × 2/3 × 0.9 = 3.6 g chalk.
    // The top-up brings each back to its made g/L in the made 3000 mL: 45 − 27 = 18 g, 6 − 3.6 = 2.4 g, 1000 mL water.
    await page.getByRole('tab', { name: 'Draw for a trial' }).click();
    await page.getByLabel('Volume drawn').fill('1000');
    await page.getByLabel('Fibre mass').fill('150');
    await page.getByRole('button', { name: 'Record' }).click();
    await page.getByRole('status').filter({ hasText: 'recorded' }).waitFor();
    await page.getByRole('heading', { name: 'Suggested top-up (estimate)' }).waitFor();
    const topUp = await page.getByRole('region', { name: 'Ingredients' }).textContent();
    expect(topUp).toContain('potash alum: 18 g');
    expect(topUp).toContain('calcium carbonate (chalk): 2.4 g');
    expect(topUp).toContain('Water back to the made volume: 1000 mL');
    await page.close();
  });
});
