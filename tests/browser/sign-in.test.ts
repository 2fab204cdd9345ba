import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launchBrowser, signInAs } from '../support/browser.ts';
import { startServer } from '../support/server.ts';
import { sequelize } from '../../server/models/index.ts';

let server: Awaited<ReturnType<typeof startServer>>;
let browser: Awaited<ReturnType<typeof launchBrowser>>;
beforeAll(async () => {
  server = await startServer();
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
  await server?.close();
  await sequelize.close();
});

describe('signing in and out in Chromium', () => {
  it('shows a clear error for a wrong password, then signs the curator in and out', async () => {
    const page = await browser.context.newPage();
    await page.goto(`${server.url}/sign-in`);
    await page.getByLabel('E-mail').fill('curator@demo.test');
    await page.getByLabel('Password').fill('not the password');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await expect(page.getByRole('alert').textContent()).resolves.toMatch(/do not match/);

    await signInAs(page, server.url, 'curator@demo.test');
    await expect(page.getByTestId('signed-in-as').textContent()).resolves.toContain('Ysolde Marrin');
    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.getByRole('link', { name: 'Sign in' }).waitFor();
  });
});
