import { afterAll, beforeAll } from 'vitest';
import { sequelize } from '../../server/models/index.ts';
import { launchBrowser } from './browser.ts';
import { startTestMail } from './mail.ts';
import { startServer } from './server.ts';

type Suite = { server: Awaited<ReturnType<typeof startServer>>; browser: Awaited<ReturnType<typeof launchBrowser>> };

/**
 * The usual browser-suite hooks: the real app on a free port and Debian's Chromium, both closed afterwards;
 * with `mail`, the local mail catcher too (started first, closed last).
 */
export function useBrowserSuite({ mail = false }: { mail?: boolean } = {}): Suite {
  const suite = {} as Suite;
  let catcher: Awaited<ReturnType<typeof startTestMail>> | undefined;
  beforeAll(async () => {
    if (mail) catcher = await startTestMail();
    suite.server = await startServer();
    suite.browser = await launchBrowser();
  });
  afterAll(async () => {
    await suite.browser?.close();
    await suite.server?.close();
    await catcher?.close();
    await sequelize.close();
  });
  return suite;
}
