import { describe, expect, it } from 'vitest';
import { signInAs } from '../support/browser.ts';
import { useBrowserSuite } from '../support/browser-suite.ts';
import { tokenFrom, waitForMail } from '../support/mail.ts';
import { issueToken } from '../../server/auth/tokens.ts';
import { User } from '../../server/models/index.ts';

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
    await admin.getByRole('banner').getByRole('link', { name: 'Sign in' }).waitFor();

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
    await page.getByRole('banner').getByRole('link', { name: 'Sign in' }).waitFor();

    // The link works once, and then says why and offers sign-in.
    await page.goto(`${suite.server.url}/join/${token}`);
    await page.getByRole('heading', { name: 'You have already joined' }).waitFor();
    await page.getByText(`${email} is on the team. Sign in with that address.`).waitFor();
    await page.getByTestId('spent-invitation').getByRole('link', { name: 'Sign in' }).click();
    await page.waitForURL(/\/sign-in$/);
  }, 120_000);

  it('an admin sees pending invitations, resends and withdraws them; the outbox links are clickable; spent links explain themselves', async () => {
    const email = `pending-${Date.now().toString(36)}@invite.test`;
    const admin = await suite.browser.context.newPage();
    admin.on('dialog', (d) => void d.accept());
    await signInAs(admin, suite.server.url, 'admin@demo.test');
    await admin.goto(`${suite.server.url}/team`);
    await admin.getByLabel('E-mail').fill(email);
    await admin.getByLabel('Role', { exact: true }).selectOption('researcher');
    await admin.getByRole('button', { name: 'Send invitation' }).click();
    const row = admin.getByTestId(`invitation-${email}`);
    await row.getByText('by Jory Fenmarch').waitFor();
    expect(await row.innerText()).toMatch(
      /as Researcher[\s\S]*Sent \d{4}-\d{2}-\d{2} by Jory Fenmarch · link works until \d{4}-\d{2}-\d{2}/,
    );
    const first = tokenFrom(await waitForMail(email), 'join');

    await row.getByRole('button', { name: 'Resend' }).click();
    await admin.getByText(`A new link is on its way to ${email}; the earlier link no longer works.`).waitFor();
    let second = first;
    for (let i = 0; i < 50 && second === first; i++) second = tokenFrom(await waitForMail(email), 'join');
    expect(second).not.toBe(first);

    // The outbox shows the new mail with its link as a real link.
    await admin.goto(`${suite.server.url}/outbox`);
    await admin.getByText(`to ${email}`).first().click();
    const link = admin.locator(`a[href$="/join/${second}"]`);
    await link.waitFor();
    expect(await link.textContent()).toMatch(new RegExp(`/join/${second}$`));
    await admin.screenshot({ path: '.data/test/outbox-links.png' });

    // The replaced link says where to look.
    const page = await suite.browser.context.newPage();
    await page.goto(`${suite.server.url}/join/${first}`);
    await page.getByRole('heading', { name: 'A newer invitation was sent' }).waitFor();

    // Withdraw: gone from the list, and the link says so.
    await admin.goto(`${suite.server.url}/team`);
    await admin.getByTestId(`invitation-${email}`).getByRole('button', { name: 'Withdraw' }).click();
    await admin.getByText(`The invitation to ${email} is withdrawn.`).waitFor();
    await admin.getByTestId(`invitation-${email}`).waitFor({ state: 'detached' });
    await admin.screenshot({ path: '.data/test/pending-invitations.png', fullPage: true });
    await page.goto(`${suite.server.url}/join/${second}`);
    await page.getByRole('heading', { name: 'This invitation was withdrawn' }).waitFor();
    await page.getByText('Ask Jory Fenmarch or another admin if you should still join.').waitFor();

    // A reset link that was already used says so when opened, before any password is typed, and offers a new one.
    const dyer = await User.findOne({ where: { email: 'dyer@demo.test' }, rejectOnEmpty: true });
    const live = await issueToken({ purpose: 'password-reset', email: dyer.email, userId: dyer.id });
    await page.goto(`${suite.server.url}/reset-password/${live.token}`);
    await page.getByLabel('New password').waitFor();
    await live.record.update({ usedAt: new Date() });
    await page.goto(`${suite.server.url}/reset-password/${live.token}`);
    await page.getByRole('heading', { name: 'This link no longer works' }).waitFor();
    await page
      .getByText(
        'This link has already been used (or a newer one was sent). Sign in with your password, or ask for a new link.',
      )
      .waitFor();
    await page.getByTestId('spent-reset-link').getByRole('link', { name: 'Ask for a new link' }).click();
    await page.waitForURL(/\/forgot-password$/);
    // Leave the shared browser signed out, as the next test expects a visitor.
    await page.close();
    await admin.goto(`${suite.server.url}/team`);
    await admin.getByRole('button', { name: 'Sign out' }).click();
    await admin.getByRole('banner').getByRole('link', { name: 'Sign in' }).waitFor();
  }, 180_000);

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
