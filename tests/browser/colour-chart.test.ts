import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { createApp } from '../../server/app.ts';
import { User } from '../../server/models/index.ts';
import { makeMeasurement, makePiece } from '../../server/seed/factories.ts';
import type { Lab } from '../../shared/colour/index.ts';
import { ingested } from '../support/photos.ts';
import { ORIGIN, signedInAgent } from '../support/agents.ts';
import { signInAs } from '../support/browser.ts';
import { useBrowserSuite } from '../support/browser-suite.ts';
import { chartPhoto } from '../support/chart-image.ts';

const suite = useBrowserSuite();

// McCamy, Marcus & Davidson (1976), adapted to D65 (tests/reference/colour-rendition-chart-1976.json).
const REF = JSON.parse(readFileSync(new URL('../reference/colour-rendition-chart-1976.json', import.meta.url), 'utf8'));
const PUBLISHED: Lab[] = REF.patches.map((p: { lab_D65_bradford: number[] }) => {
  const [L, a, b] = p.lab_D65_bradford;
  return { L, a, b };
});

describe('the colour chart mode and fading pairs (issue 17, points 1, 5, 6)', () => {
  it('places the corners by keyboard and click, shows the 24 boxes, the per-patch chart, the grade and the palette in use; pairs a faded area with a protected one', async () => {
    const app = createApp();
    const curatorAgent = await signedInAgent(app, 'curator');
    const curator = await User.findOne({ where: { email: 'curator@demo.test' }, rejectOnEmpty: true });
    const piece = await makePiece({ createdById: curator.id, title: `Chart, browser ${Date.now().toString(36)}` });
    const shot = await chartPhoto(PUBLISHED);
    const up = await curatorAgent
      .post(`/api/pieces/${piece.id}/photos`)
      .set('Origin', ORIGIN)
      .attach('photo', shot.buffer, 'chart.png')
      .expect(201);
    await ingested(up.body.photos[0].id);
    await makeMeasurement({ pieceId: piece.id, L: 40, a: 45, b: 25, label: 'seam allowance' });
    await makeMeasurement({ pieceId: piece.id, L: 52, a: 30, b: 22, label: 'sunlit front' });

    const page = await suite.browser.context.newPage();
    await page.setViewportSize({ width: 1280, height: 900 });
    await signInAs(page, suite.server.url, 'curator@demo.test');
    await page.goto(`${suite.server.url}/archive/${piece.id}`);
    await page.getByRole('button', { name: 'Colour chart' }).click();
    const panel = page.getByTestId('chart-panel');
    await panel.waitFor();
    expect(await page.getByTestId('variant-in-use').textContent()).toMatch(/raw \(as photographed\)/);

    // Nothing marked: the schema's message beside the corners.
    await panel.getByRole('button', { name: 'Measure the chart' }).click();
    await expect.poll(() => panel.getByText('Enter the x position in pixels').count()).toBeGreaterThan(0);

    // Corner 1 by a click on the photo (its shown size maps to the master's pixels).
    await panel.getByRole('button', { name: 'Place 1', exact: true }).click();
    const photoBox = (await panel.getByTestId('chart-photo').boundingBox())!;
    await page.mouse.click(
      photoBox.x + (shot.scene.corners[0].x / shot.scene.width) * photoBox.width,
      photoBox.y + (shot.scene.corners[0].y / shot.scene.height) * photoBox.height,
    );
    const x1 = Number(await panel.getByLabel(/^Patch 1 x/).inputValue());
    expect(Math.abs(x1 - shot.scene.corners[0].x)).toBeLessThanOrEqual(3);
    // The others typed; then corner 1 nudged with the arrow keys and put back.
    for (const [i, name] of ['6', '24', '19'].entries()) {
      await panel.getByLabel(new RegExp(`^Patch ${name} x`)).fill(String(shot.scene.corners[i + 1].x));
      await panel.getByLabel(new RegExp(`^Patch ${name} y`)).fill(String(shot.scene.corners[i + 1].y));
    }
    await panel.getByLabel(/^Patch 1 x/).fill(String(shot.scene.corners[0].x));
    await panel.getByLabel(/^Patch 1 y/).fill(String(shot.scene.corners[0].y));
    const marker = panel.getByRole('button', { name: /^Corner patch 1 \(dark skin\)/ });
    await marker.focus();
    await page.keyboard.press('ArrowRight');
    const moved = Number(await panel.getByLabel(/^Patch 1 x/).inputValue());
    expect(moved).toBeGreaterThan(shot.scene.corners[0].x);
    await page.keyboard.press('ArrowLeft');
    expect(Number(await panel.getByLabel(/^Patch 1 x/).inputValue())).toBe(shot.scene.corners[0].x);
    expect(await panel.getByTestId('patch-box').count()).toBe(24);

    await panel.getByRole('button', { name: 'Measure the chart' }).click();
    await panel.getByTestId('chart-result').waitFor({ timeout: 30_000 });
    expect(await panel.getByTestId('grade-after').textContent()).toBe('4 stars');
    expect(await panel.getByTestId('patch-error-chart').locator('rect').count()).toBe(48);
    await expect
      .poll(() => page.getByTestId('variant-in-use').first().textContent())
      .toMatch(/calibrated from the colour chart/);
    await page.screenshot({ path: '.data/test/colour-chart-1280.png', fullPage: true });

    // A fading pair from the two readings.
    const fading = page.getByTestId('fading-pairs');
    await fading.getByLabel('Faded area (as seen)').selectOption({ label: 'sunlit front (D65/10°)' });
    await fading.getByLabel('Protected area (as made)').selectOption({ label: 'seam allowance (D65/10°)' });
    await fading.getByRole('button', { name: 'Pair them' }).click();
    await fading.getByTestId('fading-pair').waitFor();
    expect(await fading.getByTestId('fading-pair').textContent()).toMatch(/ΔE00 \d+\.\d/);
    expect(await fading.getByRole('link', { name: 'Aim a trial at it as made' }).getAttribute('href')).toMatch(
      /target=measurement%3A\d+/,
    );

    await page.setViewportSize({ width: 390, height: 844 });
    await panel.getByTestId('chart-result').waitFor();
    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
    expect(overflow).toBeLessThanOrEqual(1);
    await page.screenshot({ path: '.data/test/colour-chart-390.png', fullPage: true });
    await page.close();
  }, 120_000);
});
