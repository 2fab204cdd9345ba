import { describe, expect, it } from 'vitest';
import { signInAs } from '../support/browser.ts';
import { useBrowserSuite } from '../support/browser-suite.ts';
import { ColourMeasurement, Trial, User } from '../../server/models/index.ts';
import { makePiece } from '../../server/seed/factories.ts';

const suite = useBrowserSuite({ mail: true });

describe('the demo dyer records a reproduction in Chromium', () => {
  it('attaches a trial with a lead-to-aluminium substitution to a piece and sees ΔE00, the verdict and the lead avoided', async () => {
    const curator = await User.findOne({ where: { email: 'curator@demo.test' }, rejectOnEmpty: true });
    const piece = await makePiece({
      createdById: curator.id,
      title: `Madder red ground, browser ${Date.now().toString(36)}`,
      status: 'published',
    });
    await ColourMeasurement.create({
      pieceId: piece.id,
      regionId: null,
      trialId: null,
      instrument: 'bench spectrophotometer',
      geometry: 'd:8°',
      specular: 'SCI',
      L: 45,
      a: 48,
      b: 28,
      label: 'red ground',
      takenOn: null,
      createdById: null,
    });

    const page = await suite.browser.context.newPage();
    await signInAs(page, suite.server.url, 'dyer@demo.test');
    await page.goto(`${suite.server.url}/archive/${piece.id}`);
    await page.getByRole('link', { name: 'Attach a trial' }).click();
    await page.waitForURL(/\/trials\/new\?pieceId=/);
    await page.getByLabel('Dry fibre mass').fill('250');
    const target = page.getByLabel('Target colour of the original');
    await target.locator('option', { hasText: 'red ground' }).waitFor({ state: 'attached' });
    // Each target reading now names its illuminant and observer (the model's default D65/10°).
    await target.selectOption({ label: 'Instrument measurement: red ground, D65/10° (L* 45.0 a* 48.0 b* 28.0)' });
    await page.getByRole('button', { name: 'Create trial' }).click();
    await page.waitForURL(/\/trials\/\d+$/);
    const trialId = Number(new URL(page.url()).pathname.split('/').pop());
    const trial = await Trial.findByPk(trialId, { rejectOnEmpty: true });
    await page.getByRole('heading', { name: `Trial ${trial.code}` }).waitFor();

    await page.getByRole('button', { name: 'Add a substitution' }).click();
    const form = page.getByRole('form', { name: 'Record a substitution' });
    await form.getByLabel('Historical chemical').selectOption({ label: 'lead(II) acetate (sugar of lead)' });
    await form.getByLabel('Historical amount').fill('18');
    await form.getByLabel('Modern chemical').selectOption({ label: 'aluminium acetate (basic)' });
    await form.getByLabel('Modern amount').fill('12');
    await form.getByRole('button', { name: 'Save substitution' }).click();
    // 18 g × 0.546222 (Pb in Pb(CH3COO)2·3H2O, tests/reference/mordant-compounds.json) = 9.83 g.
    const avoided = page.getByRole('list', { name: 'What this reproduction avoided' });
    await avoided.getByText('of lead not used').waitFor();
    expect(await avoided.textContent()).toContain('9.83 g');

    const reading = page.getByRole('form', { name: 'Add a reading' });
    await reading.getByLabel('L*', { exact: true }).fill('47');
    await reading.getByLabel('a*', { exact: true }).fill('44');
    await reading.getByLabel('b*', { exact: true }).fill('30');
    await reading.getByRole('button', { name: 'Add reading' }).click();
    const delta = page.getByLabel('Delta E 2000');
    await delta.waitFor();
    expect(await delta.textContent()).toMatch(/ΔE00 \d+\.\d\d/);
    // The verdict from the default bands (common practice) is shown beside it.
    await page
      .getByText(/^(Match|Close|Near|Different)$/)
      .first()
      .waitFor();
    // The colours are labelled with their source and viewing conditions (was "instrument measurement: red ground").
    await page.getByText('red ground', { exact: true }).first().waitFor();
    await page.getByTestId('viewing-conditions').getByText('instrument reading · D65/10°').first().waitFor();
    expect(await page.getByTestId('comparison-conditions').textContent()).toBe(
      'Under D65; original 10°, reproduction 10° observer',
    );
    await page.close();
  });
});
