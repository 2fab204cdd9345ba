import { describe, expect, it } from 'vitest';
import { useBrowserSuite } from '../support/browser-suite.ts';

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

    // Filtering narrows the table without another request.
    await page.getByLabel('Status').selectOption('historical-only');
    const rows = page.locator('tr[data-testid^="chemical-"]');
    await expect(rows.filter({ hasText: 'potash alum' }).count()).resolves.toBe(0);
    await expect(rows.filter({ hasText: 'potassium dichromate' }).count()).resolves.toBe(1);
    const statuses = await rows.locator('td:last-child').allTextContents();
    expect(new Set(statuses)).toEqual(new Set(['historical only']));

    await page.getByRole('heading', { name: 'Dyestuffs' }).scrollIntoViewIfNeeded();
    const madder = await page.getByRole('row', { name: /madder/ }).first().textContent();
    expect(madder).toContain('C.I. Natural Red 8');
  });
});
