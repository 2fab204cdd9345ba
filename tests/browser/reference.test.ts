import { describe, expect, it } from 'vitest';
import { signInAs } from '../support/browser.ts';
import { useBrowserSuite } from '../support/browser-suite.ts';
import { Chemical, Dyestuff } from '../../server/models/index.ts';

const suite = useBrowserSuite();

describe('reference page in Chromium', () => {
  it('shows each chemical with molar mass, metal fraction, status and its safety caution, and the dyestuffs', async () => {
    const page = await suite.browser.context.newPage();
    await page.goto(`${suite.server.url}/reference`);
    await page.getByRole('heading', { name: 'Chemicals' }).waitFor();
    const lead = page.locator('tr[data-testid^="chemical-"]', { hasText: 'lead(II) acetate' });
    await lead.waitFor();
    // Pb(CH3COO)2·3H2O: 379.333 g/mol, Pb 0.546222 (tests/reference/mordant-compounds.json, IUPAC 2021).
    const text = await lead.textContent();
    expect(text).toContain('379.33');
    expect(text).toContain('Pb 54.62 %');
    expect(text).toContain('historical only');
    const caution = page.getByRole('complementary', { name: /Safety: lead\(II\) acetate/ });
    const cautionText = await caution.textContent();
    expect(cautionText).toContain('Danger');
    expect(cautionText).toMatch(/H360/);
    expect(cautionText).toContain("Defer to the supplier's safety data sheet, local rules and licensed practice.");
    // The box names its chemical; H410 is shown without H400 (CLP Article 27 / Annex VI Table 3 labelling, recalled
    // from memory); one line names where the data come from (EU CLP Annex VI index 082-005-00-8, as recalled).
    const statements = await caution.getByRole('list').allTextContents();
    expect(statements.join(' ')).toMatch(/H362/);
    expect(statements.join(' ')).toMatch(/H410/);
    expect(statements.join(' ')).not.toMatch(/H400/);
    const source = await caution.getByTestId('hazard-source').allTextContents();
    expect(source).toHaveLength(1);
    expect(source[0]).toMatch(
      /^Hazard data for lead\(II\) acetate \(sugar of lead\): Harmonised EU classification \(CLP\) — Annex VI index 082-005-00-8/,
    );
    const alum = await page
      .getByRole('complementary', { name: /Safety: potash alum/ })
      .getByTestId('hazard-source')
      .textContent();
    expect(alum).toMatch(/Recalled from memory — check the supplier's safety data sheet/);

    // Filtering narrows the table without another request.
    await page.getByLabel('Status').selectOption('historical-only');
    const rows = page.locator('tr[data-testid^="chemical-"]');
    await expect(rows.filter({ hasText: 'potash alum' }).count()).resolves.toBe(0);
    await expect(rows.filter({ hasText: 'potassium dichromate' }).count()).resolves.toBe(1);
    const statuses = await rows.locator('td:last-child').allTextContents();
    expect(new Set(statuses)).toEqual(new Set(['historical only']));

    await page.getByRole('heading', { name: 'Dyestuffs' }).scrollIntoViewIfNeeded();
    const madder = await page
      .getByRole('row', { name: /madder/ })
      .first()
      .textContent();
    expect(madder).toContain('C.I. Natural Red 8');
  });

  it('lets an admin add a chemical, with a formula fault shown beside the formula with its position, and a dyestuff', async () => {
    const name = `browser gypsum ${Date.now().toString(36)}`;
    const page = await suite.browser.context.newPage();
    await signInAs(page, suite.server.url, 'admin@demo.test');
    await page.goto(`${suite.server.url}/reference`);
    const form = page.getByRole('form', { name: 'Add chemical' });
    await form.waitFor();
    await form.getByLabel('Name', { exact: true }).fill(name);
    await form.getByLabel('Formula').fill('CaSO4·x');
    await form.getByLabel('Where the data come from', { exact: true }).fill('browser test');
    await form.getByRole('button', { name: 'Add chemical' }).click();
    const formula = form.getByLabel('Formula');
    await expect(formula.getAttribute('aria-invalid')).resolves.toBe('true');
    const describedBy = await formula.getAttribute('aria-describedby');
    await expect(page.locator(`[id="${describedBy}"]`).textContent()).resolves.toMatch(
      /^Unexpected "x" at position 7\./,
    );
    await formula.fill('CaSO4·½H2O');
    await form.getByRole('button', { name: 'Add chemical' }).click();
    await expect(form.getByRole('status').textContent()).resolves.toBe(`${name} added to the reference.`);
    // CaSO4·½H2O = 145.14 g/mol (IUPAC 2021 abridged atomic weights, summed by hand).
    const row = page.locator('tr[data-testid^="chemical-"]', { hasText: name });
    await expect(row.textContent()).resolves.toContain('145.14');

    const dye = page.getByRole('form', { name: 'Add dyestuff' });
    const dyeName = `browser weld ${Date.now().toString(36)}`;
    await dye.getByLabel('Name', { exact: true }).fill(dyeName);
    await dye.getByLabel('Where the data come from', { exact: true }).fill('browser test');
    await dye.getByRole('button', { name: 'Add dyestuff' }).click();
    await expect(dye.getByRole('status').textContent()).resolves.toBe(`${dyeName} added to the reference.`);
    await Chemical.destroy({ where: { name } });
    await Dyestuff.destroy({ where: { name: dyeName } });
  });
});
