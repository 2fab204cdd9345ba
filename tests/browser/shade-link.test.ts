import { parse } from 'csv-parse/sync';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Piece, sequelize } from '../../server/models/index.ts';
import { deltaE00 } from '../../server/search/ciede2000.ts';
import { hexToLab } from '../../shared/search/lab.ts';
import { launchBrowser, signInAs } from '../support/browser.ts';
import { startServer } from '../support/server.ts';

let server: Awaited<ReturnType<typeof startServer>>;
let browser: Awaited<ReturnType<typeof launchBrowser>>;
// The demo's madder-printed furnishing fabric (BRIEF §6); its first photo's palette leads with a madder (Turkey) red.
const DEMO_PIECE = '1931.4.12';
const MADDER_RED = '#a53a2d';

beforeAll(async () => {
  server = await startServer();
  browser = await launchBrowser();
}, 60_000);
afterAll(async () => {
  await browser?.close();
  await server?.close();
  await sequelize.close();
});

describe('from a palette swatch to the pieces with that shade', () => {
  it('the researcher clicks a madder red on a demo piece and finds the other madder-red pieces ranked by ΔE00', async () => {
    const piece = await Piece.findOne({ where: { accessionNumber: DEMO_PIECE }, rejectOnEmpty: true });
    const page = await browser.context.newPage();
    await signInAs(page, server.url, 'researcher@demo.test');
    await page.goto(`${server.url}/archive/${piece.id}`);
    const swatch = page.getByTestId('palette-colour').filter({ hasText: MADDER_RED }).first();
    await swatch.getByRole('link', { name: 'Pieces with this shade' }).click();

    await page.waitForURL((u) => u.pathname === '/search');
    expect(new URL(page.url()).searchParams.get('hex')).toBe(MADDER_RED.slice(1));
    await expect.poll(() => page.getByTestId('result-count').textContent()).toMatch(/within ΔE00 5/);
    const rows = page.getByRole('table', { name: 'Shade matches' }).locator('tbody tr');
    // The piece cell starts with the accession number in its own element (numbers may hold spaces, e.g. "EX 2021/1").
    const cells = await rows.evaluateAll((trs) =>
      trs.map((tr) =>
        Array.from(
          tr.querySelectorAll('td'),
          (td, i) => (i === 2 ? td.querySelector('.font-mono')?.textContent : td.textContent) ?? '',
        ),
      ),
    );
    // Figures are shown with a true minus sign.
    const num = (t: string) => Number(t.replace('\u2212', '-'));
    const found = cells.map((c) => ({
      accession: c[2],
      lab: { L: num(c[3]), a: num(c[4]), b: num(c[5]) },
      dE: num(c[7]),
    }));

    // Other pieces than the one we came from, among them the demo's other Turkey-red piece (1962.3.1).
    const others = new Set(found.map((f) => f.accession).filter((a) => a !== DEMO_PIECE));
    expect(others.size).toBeGreaterThanOrEqual(2);
    expect(others).toContain('1962.3.1');
    // Ranked by ΔE00, each figure agreeing with CIEDE2000 (Sharma, Wu & Dalal 2005, checked in tests/unit) recomputed
    // here from the L*a*b* the table shows to one decimal, hence the 0.15 tolerance.
    for (let i = 1; i < found.length; i++) expect(found[i].dE).toBeGreaterThanOrEqual(found[i - 1].dE);
    for (const f of found) {
      expect(f.dE).toBeLessThanOrEqual(5);
      expect(Math.abs(deltaE00(hexToLab(MADDER_RED), f.lab) - f.dE)).toBeLessThan(0.15);
    }
    // The same matches as CSV, in the same order, from the link beside the table.
    const csvHref = await page.getByRole('link', { name: 'Export matches (CSV)' }).getAttribute('href');
    expect(csvHref).toMatch(/^\/api\/export\/shade\.csv\?/);
    const csv = await (await page.request.get(`${server.url}${csvHref}`)).text();
    const accessions = (parse(csv, { columns: true }) as Array<Record<string, string>>).map(
      (r) => r.pieceAccessionNumber,
    );
    expect(accessions.slice(0, found.length)).toEqual(found.map((f) => f.accession));
  });
});
