import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { createApp } from '../../server/app.ts';
import { makeMeasurement, makePiece } from '../../server/seed/factories.ts';
import { ORIGIN, signedInAgent } from '../support/agents.ts';
import { signInAs } from '../support/browser.ts';
import { useBrowserSuite } from '../support/browser-suite.ts';

const suite = useBrowserSuite();

// Issue 17, point 5: a dyer (not only a curator) sees a piece's fading pairs and starts a trial aimed at the
// piece as made (the protected area) or as seen (the faded one); the trial page says which.
describe('a trial aimed at one side of a fading pair', () => {
  it('from the piece page, as a dyer, keyboard and pointer alike; the trial keeps the aim', async () => {
    const app = createApp();
    const curator = await signedInAgent(app, 'curator');
    const piece = await makePiece({ title: `Faded hem ${Date.now().toString(36)}`, status: 'published' });
    const prot = await makeMeasurement({ pieceId: piece.id, L: 40, a: 45, b: 25, label: 'hem back' });
    const faded = await makeMeasurement({ pieceId: piece.id, L: 52, a: 30, b: 22, label: 'hem front' });
    await curator
      .post(`/api/pieces/${piece.id}/fading-pairs`)
      .set('Origin', ORIGIN)
      .send({ label: 'weld hem', faded: { measurementId: faded.id }, protected: { measurementId: prot.id } })
      .expect(201);

    const page = await suite.browser.context.newPage();
    await page.setViewportSize({ width: 1280, height: 900 });
    await signInAs(page, suite.server.url, 'dyer@demo.test');
    await page.goto(`${suite.server.url}/archive/${piece.id}`);
    const pair = page.getByTestId('fading-pair');
    await pair.waitFor();
    for (const width of [1280, 768, 390]) {
      await page.setViewportSize({ width, height: 900 });
      await pair.scrollIntoViewIfNeeded();
      await page.screenshot({ path: join(tmpdir(), `fading-aim-piece-${width}.png`), fullPage: true });
      const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
      expect(overflow).toBeLessThanOrEqual(1);
    }
    await page.setViewportSize({ width: 1280, height: 900 });
    // The dyer may not change the pairs, only aim at them.
    await expect(page.getByRole('button', { name: 'Remove pair' }).count()).resolves.toBe(0);
    const link = pair.getByRole('link', { name: 'Aim a trial at it as seen' });
    await link.focus();
    await page.keyboard.press('Enter');
    await page.getByLabel('Aim at the piece').waitFor();
    expect(await page.getByLabel('Aim at the piece').inputValue()).toBe('as-seen');
    expect(await page.getByLabel('Target colour of the original').inputValue()).toBe(`measurement:${faded.id}`);
    await page.getByLabel('Dry fibre mass').fill('12');
    await page.getByRole('button', { name: 'Create trial' }).click();
    await page.getByText('the piece as seen (the faded area)').waitFor();
    for (const width of [1280, 768, 390]) {
      await page.setViewportSize({ width, height: 900 });
      await page.screenshot({ path: join(tmpdir(), `fading-aim-trial-${width}.png`), fullPage: true });
      const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
      expect(overflow).toBeLessThanOrEqual(1);
    }
    await page.close();
  });
});
