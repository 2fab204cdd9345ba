import { mkdtemp, rm } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { chromium, type BrowserContext } from 'playwright-core';

// Debian's Chromium, never a downloaded browser; flags as verified on this machine.
export async function launchBrowser(): Promise<{ context: BrowserContext; close: () => Promise<void> }> {
  const profile = await mkdtemp(path.join(os.tmpdir(), 'tinctoria-chromium-'));
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: '/usr/bin/chromium',
    headless: true,
    viewport: { width: 1280, height: 900 },
    args: [
      '--headless',
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
    ],
  });
  return {
    context,
    close: async () => {
      await context.close();
      await rm(profile, { recursive: true, force: true });
    },
  };
}

/** Sign in through the real form as one of the demo accounts. */
export async function signInAs(
  page: import('playwright-core').Page,
  baseUrl: string,
  email: string,
  password = 'tinctoria-demo',
) {
  await page.goto(`${baseUrl}/sign-in`);
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  // Wait for the answer itself: when the context is already signed in, the user menu shows
  // before the new session's cookie arrives, and navigating then would abort the sign-in.
  const answered = page.waitForResponse((r) => r.url().endsWith('/api/auth/login') && r.request().method() === 'POST');
  await page.getByRole('button', { name: 'Sign in' }).click();
  const res = await answered;
  if (res.status() !== 200) throw new Error(`sign-in as ${email} answered ${res.status()}`);
  await page.getByTestId('signed-in-as').waitFor();
}
