import { describe, expect, it } from 'vitest';
import { signInAs } from '../support/browser.ts';
import { useBrowserSuite } from '../support/browser-suite.ts';
import { tokenFrom, waitForMail } from '../support/mail.ts';

const suite = useBrowserSuite({ mail: true });

// Generous timeouts: Chromium shares two cores with everything else; nothing here asserts on time.
describe('the team and invitations in Chromium', () => {
  it('an admin invites from the team page; the invitee joins through the mailed link and is signed in', async () => {
    const email = `browser-${Date.now().toString(36)}@invite.test`;
    const admin = await suite.browser.context.newPage();
    await signInAs(admin, suite.server.url, 'admin@demo.test');
    await admin.goto(`${suite.server.url}/team`);
    await admin.getByRole('heading', { name: 'Team' }).waitFor();
    await admin.getByLabel('E-mail').fill(email);
    await admin.getByLabel('Role', { exact: true }).selectOption('dyer');
    await admin.getByRole('button', { name: 'Send invitation' }).click();
    await expect(admin.getByRole('status').textContent()).resolves.toMatch(`Invitation sent to ${email}`);
    await admin.getByRole('button', { name: 'Sign out' }).click();
    await admin.getByRole('link', { name: 'Sign in' }).waitFor();

    // The link in the mail names the public origin; follow its path on the test server.
    const token = tokenFrom(await waitForMail(email), 'join');
    const page = await suite.browser.context.newPage();
    await page.goto(`${suite.server.url}/join/${token}`);
    await page.getByText(email).waitFor();
    await page.getByLabel('Password').fill('short');
    await page.getByRole('button', { name: 'Join Tinctoria' }).click();
    await expect(page.getByText('Use at least 10 characters').count()).resolves.toBe(1);
    await page.getByLabel('Your name').fill('Corin Ashgrove');
    await page.getByLabel('Password').fill('a-long-browser-password');
    await page.getByRole('button', { name: 'Join Tinctoria' }).click();
    await expect(page.getByTestId('signed-in-as').textContent()).resolves.toContain('Corin Ashgrove');

    // A dyer may not open the team page: the 403 page, not the table.
    await page.goto(`${suite.server.url}/team`);
    await page.getByRole('heading', { name: 'Not allowed' }).waitFor();
    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.getByRole('link', { name: 'Sign in' }).waitFor();

    // The link works once.
    await page.goto(`${suite.server.url}/join/${token}`);
    await page.getByRole('heading', { name: 'This invitation can no longer be used' }).waitFor();
  }, 120_000);

  it('tells a visitor who opens the team page to sign in, and comes back after signing in', async () => {
    const page = await suite.browser.context.newPage();
    await page.goto(`${suite.server.url}/team`);
    await page.getByRole('link', { name: 'Sign in and come back here' }).click();
    await page.waitForURL(/\/sign-in\?next=%2Fteam$/);
    await page.getByLabel('E-mail').fill('admin@demo.test');
    await page.getByLabel('Password').fill('tinctoria-demo');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.waitForURL(/\/team$/);
    await page.getByTestId('member-curator@demo.test').waitFor();
  }, 60_000);
});
