import { mkdirSync } from 'node:fs';
import { writeFile, mkdtemp, rm } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launchBrowser, signInAs } from '../support/browser.ts';
import { startServer } from '../support/server.ts';
import { clothJpeg } from '../support/images.ts';
import { testEnv } from '../support/env.ts';
import { Photo, Piece, sequelize } from '../../server/models/index.ts';
import { ingested } from '../support/photos.ts';

let server: Awaited<ReturnType<typeof startServer>>;
let browser: Awaited<ReturnType<typeof launchBrowser>>;
let dir: string;
beforeAll(async () => {
  server = await startServer();
  browser = await launchBrowser();
  dir = await mkdtemp(path.join(os.tmpdir(), 'tinctoria-upload-'));
});
afterAll(async () => {
  await browser?.close();
  await server?.close();
  await rm(dir, { recursive: true, force: true });
  await sequelize.close();
});

describe('cataloguing a piece in Chromium', () => {
  it('the curator catalogues a piece, uploads a photo, watches the progress and sees the palette once processed', async () => {
    const page = await browser.context.newPage();
    await signInAs(page, server.url, 'curator@demo.test');
    await page.goto(`${server.url}/archive`);
    await page.getByRole('link', { name: 'Catalogue a piece' }).click();

    // The vocabularies fill the checklists and move the form's button; wait for them first.
    await page.getByLabel('cotton').waitFor();
    const accession = `EX 2098/${Date.now() % 100000}`;
    // A wrong accession number is explained beside the field before anything is sent.
    await page.getByLabel('Accession number').fill('1931.4.12#');
    await page.getByRole('button', { name: 'Save draft' }).click();
    await page.getByText('Use letters and digits', { exact: false }).first().waitFor();
    // Empty required fields say what to enter, not a type error.
    await page.getByText('Enter the object name, e.g. panel').waitFor();
    // A number already in the archive, written in other case and spacing, is refused beside the field by the server.
    await page.getByLabel('Accession number').fill(' 1931.4.12 ');
    await page.getByLabel('Object name').fill('panel');
    await page.getByLabel('Title', { exact: true }).fill('Clash');
    await page.getByRole('button', { name: 'Save draft' }).click();
    await page.getByText('That accession number is already used.').first().waitFor();
    // Beside the field as well as above the button.
    expect(await page.getByText('That accession number is already used.').count()).toBe(2);

    await page.getByLabel('Accession number').fill(accession);
    await page.getByLabel('Object name').fill('furnishing fabric');
    await page.getByLabel('Title', { exact: true }).fill('Browser-catalogued madder print');
    // The EDTF date is read as typed; a day not in the calendar is named beside the field once it is left.
    await page.getByLabel('Date (EDTF)').fill('1851-02-29');
    await page.getByLabel('Place').focus();
    await page.getByText('1851 is not a leap year: February 1851 has 28 days').waitFor();
    await page.getByLabel('Date (EDTF)').fill('1760~');
    await page.getByText(/Approximate or uncertain: may reach earlier/).waitFor();
    expect(await page.getByText('1851 is not a leap year').count()).toBe(0);
    await page.getByLabel('Date (EDTF)').fill('1770/1785');
    await page.getByLabel('cotton').check();
    await page.getByLabel('block printing').check();
    await page.getByLabel(/Height/).fill('420');
    await page.getByRole('button', { name: 'Save draft' }).click();
    await page.getByRole('heading', { name: 'Browser-catalogued madder print' }).waitFor();
    await page.getByText(accession).first().waitFor();
    await page.getByText('420 mm').waitFor();

    // The upload box names the formats and the default limits of large masters.
    const drop = page.getByRole('region', { name: 'Add photos' });
    await drop.getByText(/TIFF including 16-bit and BigTIFF.*up to 2 GB and 1 gigapixel each/).waitFor();
    const shots = testEnv.screensDir;
    mkdirSync(shots, { recursive: true });
    for (const width of [1280, 768, 390]) {
      await page.setViewportSize({ width, height: 900 });
      await drop.screenshot({ path: `${shots}/upload-panel-${width}.png` });
    }
    await page.setViewportSize({ width: 1280, height: 900 });

    const file = path.join(dir, 'recto.jpg');
    await writeFile(file, await clothJpeg({ seed: 21, exposure: true }));
    await page.getByLabel('Photos to upload').setInputFiles(file);
    const item = page.getByTestId('upload-item');
    await item.locator('progress').waitFor();
    await item.getByText(/^Stored/).waitFor({ timeout: 20_000 });
    await expect(item.locator('progress').getAttribute('value')).resolves.toBe('1');

    // The photo appears at once as a placeholder with its stage; its ingest job (run here: this server has no
    // worker) processes it, and the panel, asking every 1.5 s, follows until the palette shows.
    const waiting = page.getByTestId('ingest-status');
    await waiting.waitFor();
    expect(await waiting.getAttribute('data-stage')).toBe('queued');
    for (const width of [1280, 768, 390]) {
      await page.setViewportSize({ width, height: 900 });
      await page
        .getByTestId('photo-panel')
        .first()
        .screenshot({ path: `${shots}/ingest-queued-${width}.png` });
    }
    await page.setViewportSize({ width: 1280, height: 900 });
    const piece = await Piece.findOne({ where: { accessionNumber: accession }, rejectOnEmpty: true });
    const photo = await Photo.findOne({ where: { pieceId: piece.id }, rejectOnEmpty: true });
    await ingested(photo.id);
    const colours = page.getByTestId('palette-colour');
    await colours.first().waitFor({ timeout: 30_000 });
    expect(await page.getByTestId('ingest-status').count()).toBe(0);
    expect(await colours.count()).toBeGreaterThan(1);
    await expect(colours.first().textContent()).resolves.toMatch(/#[0-9a-f]{6}.*L\*.*a\*.*b\*.*share/s);
    // The palette carries the shared viewing-conditions label: photo estimates are D65/2° (was "source: image estimate").
    await page.getByText('image estimate · D65/2°').first().waitFor();
    // The test JPEG carries no ICC profile: its file facts say it was taken as sRGB.
    await page.getByText('File facts').first().click();
    await expect(page.getByTestId('colour-facts').first().textContent()).resolves.toMatch(
      /No embedded colour profile: taken as sRGB.*8 bits/s,
    );
    // EXIF as labelled values with units, the camera's clock as written.
    const exif = await page.getByTestId('exif').first().innerText();
    expect(
      exif
        .split('\n')
        .map((l) => l.trim())
        .filter(Boolean)
        .join(' | '),
    ).toBe(
      "Camera | Weldfold Copy Stand 2 | Exposure | 1/60 s | Aperture | f/8 | Sensitivity | ISO 200 | Focal length | 50 mm | Taken | 2025-03-14 10:22 (camera's clock)",
    );
    await expect(page.getByTestId('photo-panel').first().textContent()).resolves.toMatch(
      /jpeg · \d+ kB · taken 2025-03-14 10:22/,
    );
    await page.getByTestId('photo-panel').first().screenshot({ path: '.data/test/file-facts.png' });

    await page.getByRole('button', { name: 'Publish' }).click();
    await page.getByRole('button', { name: 'Unpublish' }).waitFor();
    await page.getByRole('button', { name: 'Show who changed what' }).click();
    await expect(page.getByTestId('history').textContent()).resolves.toMatch(/published.*added a photo.*catalogued/s);
  }, 120_000);
});
