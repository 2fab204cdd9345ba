import { describe, expect, it } from 'vitest';
import { signInAs } from '../support/browser.ts';
import { useBrowserSuite } from '../support/browser-suite.ts';

const suite = useBrowserSuite();

describe('signing in and out in Chromium', () => {
  it('shows a clear error for a wrong password, then signs the curator in and out', async () => {
    const page = await suite.browser.context.newPage();
    await page.goto(`${suite.server.url}/sign-in`);
    await page.getByLabel('E-mail').fill('curator@demo.test');
    await page.getByLabel('Password').fill('not the password');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await expect(page.getByRole('alert').textContent()).resolves.toMatch(/do not match/);

    await signInAs(page, suite.server.url, 'curator@demo.test');
    await expect(page.getByTestId('signed-in-as').textContent()).resolves.toContain('Ysolde Marrin');
    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.getByRole('banner').getByRole('link', { name: 'Sign in' }).waitFor();
  });
});
