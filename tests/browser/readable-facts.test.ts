import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launchBrowser, signInAs } from '../support/browser.ts';
import { startServer } from '../support/server.ts';
import { User, sequelize } from '../../server/models/index.ts';
import { makePiece } from '../../server/seed/factories.ts';
import { audit } from '../../server/services/audit.ts';

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

describe("facts in a person's format, in Chromium", () => {
  it("names each page in the tab, and tells a piece's history in words with ISO dates", async () => {
    const curator = await User.findOne({ where: { email: 'curator@demo.test' }, rejectOnEmpty: true });
    const piece = await makePiece({ accessionNumber: `EX ${Date.now() % 100000}/1`, title: 'History in words' });
    await sequelize.transaction(async (transaction) => {
      const ctx = { actor: { id: curator.id, role: curator.role }, transaction };
      await audit(ctx, 'piece', piece.id, 'update', {
        dateEdtf: { from: null, to: '1770/1785' },
        historicalMordants: { from: [], to: [] },
      });
      await audit(ctx, 'piece', piece.id, 'region-added', {
        region: { from: null, to: { label: 'ground red', purpose: 'colour-area' } },
      });
      await audit(ctx, 'piece', piece.id, 'reference-patch-set', {
        referencePatch: { from: null, to: { x: 1, y: 1, w: 5, h: 5 } },
      });
    });

    const page = await browser.context.newPage();
    await signInAs(page, server.url, 'curator@demo.test');
    await page.goto(`${server.url}/archive`);
    await page.getByRole('heading', { name: 'Archive' }).first().waitFor();
    await page.waitForFunction(() => document.title === 'Archive — Tinctoria');

    await page.goto(`${server.url}/archive/${piece.id}`);
    await page.getByRole('heading', { name: 'History in words' }).waitFor();
    await page.waitForFunction((n) => document.title === `${n} — Tinctoria`, piece.accessionNumber);
    await page.getByRole('button', { name: 'Show who changed what' }).click();
    const history = page.getByTestId('history');
    await history.getByText('Ysolde Marrin: reference patch set').waitFor();
    const text = await history.innerText();
    expect(text).toContain('Ysolde Marrin: colour area ‘ground red’ added');
    expect(text).toContain('Ysolde Marrin: changed the date (EDTF) and historical mordants');
    expect(text).not.toMatch(/dateEdtf|historicalMordants|referencePatch/);
    // Dates as ISO 8601: 2026-12-03 21:15.
    expect(text).toMatch(/\d{4}-\d{2}-\d{2} \d{2}:\d{2}/);
    await page.screenshot({ path: '.data/test/readable-history.png' });
  });
});
