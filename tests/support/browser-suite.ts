import { afterAll, beforeAll } from 'vitest';
import { sequelize } from '../../server/models/index.ts';
import { launchBrowser } from './browser.ts';
import { startServer } from './server.ts';

type Suite = { server: Awaited<ReturnType<typeof startServer>>; browser: Awaited<ReturnType<typeof launchBrowser>> };

/** The usual browser-suite hooks: the real app on a free port and Debian's Chromium, both closed afterwards. */
export function useBrowserSuite(): Suite {
  const suite = {} as Suite;
  beforeAll(async () => {
    suite.server = await startServer();
    suite.browser = await launchBrowser();
  });
  afterAll(async () => {
    await suite.browser?.close();
    await suite.server?.close();
    await sequelize.close();
  });
  return suite;
}
