import { mkdirSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { PaletteColour, Photo, sequelize } from '../../server/models/index.ts';
import { makePiece } from '../../server/seed/factories.ts';
import { deltaE00 } from '../../server/search/ciede2000.ts';
import { hexToLab, labToHex } from '../../shared/search/lab.ts';
import { launchBrowser, signInAs } from '../support/browser.ts';
import { startServer } from '../support/server.ts';
import { testEnv } from '../support/env.ts';

let server: Awaited<ReturnType<typeof startServer>>;
let browser: Awaited<ReturnType<typeof launchBrowser>>;
const u = `w${Array.from({ length: 10 }, () => 'bcdfghjkmnpqrstvwxz'[Math.floor(Math.random() * 19)]).join('')}`;
const target = '#6a3d5c';
const t = hexToLab(target);
// Three shades at growing CIEDE2000 distances from the target, and one well outside the radius.
const shades = [
  target,
  labToHex({ ...t, L: t.L + 1.5 }),
  labToHex({ ...t, a: t.a + 4, L: t.L - 2 }),
  labToHex({ ...t, L: t.L + 15 }),
];
const accessions: string[] = [];

beforeAll(async () => {
  for (const [i, hex] of shades.entries()) {
    const p = await makePiece({
      title: `Plum ${u} sample ${i}`,
      status: 'published',
      dyestuffs: [{ name: i === 0 ? `logwood${u}` : `cochineal${u}`, evidence: 'attributed' }],
    });
    accessions.push(p.accessionNumber);
    const photo = await Photo.create({
      pieceId: p.id,
      trialId: null,
      sha256: `${u}${i}`.padEnd(64, '0'),
      format: 'jpeg',
      bytes: 1,
      width: 1,
      height: 1,
      originalName: null,
      caption: null,
      capturedAt: null,
      exif: {},
      gps: null,
      derivatives: {},
      referencePatch: null,
      correction: null,
      createdById: null,
    });
    await PaletteColour.create({
      photoId: photo.id,
      regionId: null,
      variant: 'raw',
      rank: 1,
      ...hexToLab(hex),
      hex,
      share: 0.5,
      spread: 1,
      name: 'plum',
      tradeName: null,
      background: false,
    });
  }
  server = await startServer();
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
  await server?.close();
  await sequelize.close();
});

describe('search page in Chromium', () => {
  it('a researcher types a shade hex and sees the matches ranked by ΔE00, then narrows words by a facet', async () => {
    const page = await browser.context.newPage();
    await signInAs(page, server.url, 'researcher@demo.test');
    await page.goto(`${server.url}/search`);
    await page.getByLabel('Words').fill(u);
    await page.getByRole('button', { name: 'Search', exact: true }).click();
    await expect.poll(() => page.getByTestId('result-count').textContent()).toBe('4 pieces');
    const facet = (name: string) =>
      page.getByRole('region', { name: 'Facets' }).getByRole('checkbox', { name: new RegExp(`^${name}${u}`) });
    // The words match three cochineal pieces …
    await expect
      .poll(async () => (await facet('cochineal').locator('xpath=..').textContent())?.trim())
      .toBe(`cochineal${u}3`);

    await page.getByLabel('Hex').fill(target.slice(1));
    await page.getByRole('button', { name: 'Find this hex' }).click();
    await expect.poll(() => page.getByTestId('result-count').textContent()).toContain('3 pieces within ΔE00 5');
    // … and with the shade chosen the facets count the shade's matches: two cochineal pieces lie within the radius.
    await expect
      .poll(async () => (await facet('cochineal').locator('xpath=..').textContent())?.trim())
      .toBe(`cochineal${u}2`);
    await expect
      .poll(async () => (await facet('logwood').locator('xpath=..').textContent())?.trim())
      .toBe(`logwood${u}1`);
    const shots = testEnv.screensDir;
    mkdirSync(shots, { recursive: true });
    await page.screenshot({ path: `${shots}/search-shade-facets-1280.png`, fullPage: true });
    await page.setViewportSize({ width: 390, height: 844 });
    await page.screenshot({ path: `${shots}/search-shade-facets-390.png`, fullPage: true });
    await page.setViewportSize({ width: 1280, height: 900 });
    const rows = page.getByRole('table', { name: 'Shade matches' }).locator('tbody tr');
    const texts = await rows.allTextContents();
    // Ranked by ΔE00 from the target (CIEDE2000, checked against Sharma et al. 2005 in tests/unit).
    const expected = [0, 1, 2].sort((x, y) => deltaE00(t, hexToLab(shades[x])) - deltaE00(t, hexToLab(shades[y])));
    expect(texts.map((r) => accessions.findIndex((a) => r.includes(a)))).toEqual(expected);
    expect(new URL(page.url()).searchParams.get('hex')).toBe(target.slice(1));
    await expect(page.getByRole('img', { name: 'Matches on the a*b* plane' }).isVisible()).resolves.toBe(true);
    await page.getByRole('button', { name: 'Swatches' }).click();
    await expect(page.getByRole('list', { name: 'Shade matches' }).locator('li').count()).resolves.toBe(3);

    await page.getByRole('button', { name: 'Clear shade' }).click();
    await expect.poll(() => page.getByTestId('result-count').textContent()).toBe('4 pieces');
    await page.getByRole('checkbox', { name: new RegExp(`^logwood${u}`) }).click();
    await expect.poll(() => page.getByTestId('result-count').textContent()).toBe('1 piece');
    await expect(page.getByRole('list', { name: 'Pieces found' }).textContent()).resolves.toContain(accessions[0]);
    await page.getByRole('button', { name: 'Clear all' }).click();
    await expect.poll(() => page.getByTestId('result-count').textContent()).toBe('4 pieces');
  });

  it('opens straight on a shade from a link such as /search?hex=…', async () => {
    const page = await browser.context.newPage();
    await page.goto(`${server.url}/search?hex=${target.slice(1)}&q=${u}`);
    await expect.poll(() => page.getByTestId('result-count').textContent()).toContain('3 pieces within ΔE00 5');
    await expect(page.getByLabel('Hex').inputValue()).resolves.toBe(target.slice(1));
  });

  it('narrows by "identified by": the method of the analysis behind an identification (issue 19)', async () => {
    // The demo's 1931.4.12 has madder identified by HPLC-DAD and its mordants by XRF (server/seed/data/demo-records.json).
    const page = await browser.context.newPage();
    await page.goto(`${server.url}/search?q=1931.4.12`);
    const group = page.getByRole('group', { name: 'Identified by (analysis)' });
    await group.getByRole('checkbox', { name: /^HPLC-DAD/ }).click();
    await expect.poll(() => new URL(page.url()).searchParams.getAll('identifiedBy')).toEqual(['HPLC-DAD']);
    await expect.poll(() => page.getByTestId('result-count').textContent()).toBe('1 piece');
    await expect(page.getByRole('list', { name: 'Pieces found' }).textContent()).resolves.toContain('1931.4.12');
    await expect(group.getByRole('checkbox', { name: /^XRF/ }).isVisible()).resolves.toBe(true);
  });
});
