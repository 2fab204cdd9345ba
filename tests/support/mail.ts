import { afterAll, beforeAll } from 'vitest';
import { mailDir, startLocalMail } from '../../server/mail/index.ts';
import { sequelize } from '../../server/models/index.ts';
import { mailFiles, readMail, type CaughtMail } from '../../server/mail/outbox.ts';

/** Start the local SMTP catcher and route the app's mail to it; close it in afterAll. */
export async function startTestMail() {
  const catcher = await startLocalMail();
  if (!catcher) throw new Error('SMTP_URL is set: the tests need the local mail catcher');
  return catcher;
}

/**
 * The usual hooks of a suite that sends mail: the catcher starts before the suite's own beforeAll hooks (call this
 * first) and closes, with the database connection, after its own afterAll hooks.
 */
export function useTestMail() {
  let catcher: Awaited<ReturnType<typeof startTestMail>> | undefined;
  beforeAll(async () => {
    catcher = await startTestMail();
  });
  afterAll(async () => {
    await catcher?.close();
    await sequelize.close();
  });
}

/** The newest caught message addressed to `to`, or null. */
export async function newestMailTo(to: string): Promise<CaughtMail | null> {
  for (const f of await mailFiles(mailDir())) {
    const mail = await readMail(mailDir(), f);
    if (mail.to.includes(to.toLowerCase())) return mail;
  }
  return null;
}

/** Wait for a message to `to` (some mail is sent after the HTTP answer); polls the catcher's folder. */
export async function waitForMail(to: string, tries = 50): Promise<CaughtMail> {
  for (let i = 0; i < tries; i++) {
    const mail = await newestMailTo(to);
    if (mail) return mail;
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`no mail to ${to} arrived in the catcher`);
}

/** The token at the end of the link `…/<prefix>/<token>` in a message's text part. */
export function tokenFrom(mail: CaughtMail, prefix: string): string {
  const m = mail.text.match(new RegExp(`https?://\\S+/${prefix}/([A-Za-z0-9_-]{43})`));
  if (!m) throw new Error(`no /${prefix}/ link in: ${mail.text}`);
  return m[1];
}
