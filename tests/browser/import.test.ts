import { describe, expect, it } from 'vitest';
import { Op } from 'sequelize';
import { signInAs } from '../support/browser.ts';
import { useBrowserSuite } from '../support/browser-suite.ts';
import { Piece } from '../../server/models/index.ts';

const suite = useBrowserSuite();

describe('importing a spreadsheet catalogue in Chromium', () => {
  it('maps the columns, shows each bad row with its line, and imports once the file is right', async () => {
    const tag = `BR.${Date.now().toString(36)}`;
    const bad = `Accession No.,Object,Title,Dyes\n${tag}.1,panel,Good row,madder (attributed)\n${tag}.2,panel,Bad row,unobtainium\n`;
    const page = await suite.browser.context.newPage();
    await signInAs(page, suite.server.url, 'curator@demo.test');
    await page.goto(`${suite.server.url}/import`);
    await page
      .getByLabel('CSV file (UTF-8)')
      .setInputFiles({ name: 'catalogue.csv', mimeType: 'text/csv', buffer: Buffer.from(bad) });
    // "Title" is guessed; the others are mapped by hand with the keyboard-usable selects.
    await page.getByLabel('Field for column Accession No.').selectOption('accessionNumber');
    await page.getByLabel('Field for column Object').selectOption('objectName');
    await page.getByLabel('Field for column Dyes').selectOption('dyestuffs');
    await page.getByRole('button', { name: 'Check every row' }).click();
    await expect.poll(() => page.getByTestId('import-summary').textContent()).toMatch(/2 rows: 1 ready, 1 with errors/);
    // The rows with errors are asked of the server after the counts (only=invalid, a page at a time): wait for them.
    await expect.poll(() => page.getByRole('table').last().textContent()).toContain('Unknown dyestuff "unobtainium".');
    expect(await page.getByRole('button', { name: /^Import/ }).isDisabled()).toBe(true);

    const good = bad.replace('unobtainium', 'weld (attributed)');
    await page
      .getByLabel('CSV file (UTF-8)')
      .setInputFiles({ name: 'catalogue.csv', mimeType: 'text/csv', buffer: Buffer.from(good) });
    await page.getByLabel('Field for column Accession No.').selectOption('accessionNumber');
    await page.getByLabel('Field for column Object').selectOption('objectName');
    await page.getByLabel('Field for column Dyes').selectOption('dyestuffs');
    await page.getByRole('button', { name: 'Check every row' }).click();
    await page.getByRole('button', { name: 'Import 2 pieces' }).click();
    await page.getByRole('status').filter({ hasText: 'Imported 2 pieces' }).waitFor();
    const rows = await Piece.findAll({
      where: { accessionNumber: { [Op.like]: `${tag}%` } },
      order: [['accessionNumber', 'ASC']],
    });
    expect(rows.map((r) => [r.accessionNumber, r.dyestuffs])).toEqual([
      [`${tag}.1`, [{ name: 'madder', evidence: 'attributed' }]],
      [`${tag}.2`, [{ name: 'weld', evidence: 'attributed' }]],
    ]);

    // A Latin-1 file is refused with the line of the first bad byte.
    await page.getByLabel('CSV file (UTF-8)').setInputFiles({
      name: 'old.csv',
      mimeType: 'text/csv',
      buffer: Buffer.from(`accessionNumber,objectName,title\n${tag}.9,panel,Toile imprimée\n`, 'latin1'),
    });
    await page.getByRole('button', { name: 'Check every row' }).click();
    await expect.poll(() => page.getByRole('alert').first().textContent()).toMatch(/not UTF-8: line 2/);
    await page.close();
  }, 60_000);

  it('pages through a large preview, a hundred rows at a time, asked of the server', async () => {
    const tag = `BP.${Date.now().toString(36)}`;
    const lines = ['accessionNumber,objectName,title,dyestuffs'];
    for (let i = 1; i <= 250; i++) lines.push(`${tag}.${i},panel,Row ${i},${i % 10 === 0 ? 'unobtainium' : 'madder'}`);
    const page = await suite.browser.context.newPage();
    await signInAs(page, suite.server.url, 'curator@demo.test');
    await page.goto(`${suite.server.url}/import`);
    await page
      .getByLabel('CSV file (UTF-8)')
      .setInputFiles({ name: 'big.csv', mimeType: 'text/csv', buffer: Buffer.from(`${lines.join('\n')}\n`) });
    await page.getByRole('button', { name: 'Check every row' }).click();
    await expect
      .poll(() => page.getByTestId('import-summary').textContent())
      .toMatch(/250 rows: 225 ready, 25 with errors/);
    // Only the 25 rows with errors: one page.
    await expect.poll(() => page.getByRole('table').last().locator('tbody tr').count()).toBe(25);
    await page.getByLabel('Show only rows with errors').uncheck();
    const pager = page.getByRole('navigation', { name: 'Pages of the preview' });
    await expect.poll(() => pager.textContent()).toMatch(/Page 1 of 3/);
    await expect.poll(() => page.getByRole('table').last().locator('tbody tr').count()).toBe(100);
    await pager.getByRole('button', { name: 'Next' }).click();
    await expect.poll(() => pager.textContent()).toMatch(/Page 2 of 3/);
    await expect.poll(() => page.getByRole('table').last().locator('tbody tr').first().textContent()).toMatch(/^102/);
    await page.close();
  }, 60_000);
});
