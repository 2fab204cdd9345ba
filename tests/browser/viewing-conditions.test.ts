import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { createApp } from '../../server/app.ts';
import { ColourMeasurement, User } from '../../server/models/index.ts';
import { makePiece } from '../../server/seed/factories.ts';
import { ORIGIN, signedInAgent } from '../support/agents.ts';
import { signInAs } from '../support/browser.ts';
import { useBrowserSuite } from '../support/browser-suite.ts';

const suite = useBrowserSuite({ mail: true });

type Pair = { pair: number; L1: number; a1: number; b1: number; L2: number; a2: number; b2: number; dE00: number };
// Sharma, Wu & Dalal (2005), Color Res. Appl. 30(1):21–30, Table 1 (tests/reference/ciede2000-sharma2005.json), pair 2: ΔE00 2.8615.
const p2 = (
  JSON.parse(readFileSync(new URL('../reference/ciede2000-sharma2005.json', import.meta.url), 'utf8')) as Pair[]
).find((p) => p.pair === 2)!;
const original = { L: p2.L1, a: p2.a1, b: p2.b1 };
const swatch = { L: p2.L2, a: p2.a2, b: p2.b2 };
// CIE 15 components worked out here from their definitions, not by the app: ΔC*ab = C*₂ − C*₁,
// |ΔH*ab| = √(ΔE*ab² − ΔL*² − ΔC*ab²) = √(Δa*² + Δb*² − ΔC*ab²), negative because the hue angle shrinks (272.3° → 270.0°).
const dC = Math.hypot(swatch.a, swatch.b) - Math.hypot(original.a, original.b);
const dH = -Math.sqrt((swatch.a - original.a) ** 2 + (swatch.b - original.b) ** 2 - dC ** 2);
const show = (x: number) => `${x < 0 ? '−' : '+'}${Math.abs(x).toFixed(2)}`;

describe('the trial page names the viewing conditions of every figure', () => {
  it('shows ΔE00 with the signed ΔL*, ΔC*ab, ΔH*ab, the illuminant and observers, the other illuminants, and which reading is missing', async () => {
    const app = createApp();
    const dyer = await signedInAgent(app, 'dyer');
    const curator = await User.findOne({ where: { email: 'curator@demo.test' }, rejectOnEmpty: true });
    const piece = await makePiece({
      createdById: curator.id,
      title: `Blue ground, browser ${Date.now().toString(36)}`,
    });
    const read = (lab: object, illuminant: string, observer: string) =>
      ColourMeasurement.create({
        pieceId: piece.id,
        regionId: null,
        trialId: null,
        instrument: 'bench spectrophotometer',
        geometry: 'd:8°',
        specular: 'SCI',
        ...(lab as { L: number; a: number; b: number }),
        illuminant,
        observer,
        label: 'blue ground',
        takenOn: null,
        createdById: null,
      });
    const underD65 = await read(original, 'D65', '10');
    const underA = await read({ L: 48, a: 6, b: -70 }, 'A', '10');
    const trialFor = async (targetMeasurementId: number) =>
      (
        await dyer
          .post(`/api/pieces/${piece.id}/trials`)
          .set('Origin', ORIGIN)
          .send({ dryMassG: 20, targetMeasurementId })
          .expect(201)
      ).body.trial;
    const reading = (id: number, body: object) =>
      dyer.post(`/api/trials/${id}/measurements`).set('Origin', ORIGIN).send(body).expect(201);

    // Compared under D65 with a 2° reading (observers differ), and also under A.
    const compared = await trialFor(underD65.id);
    await reading(compared.id, { ...swatch, illuminant: 'D65', observer: '2' });
    await reading(compared.id, { L: 49, a: 4, b: -72, illuminant: 'A', observer: '10' });
    // Aimed at the A reading but read under D65 only: no ΔE.
    const unmatched = await trialFor(underA.id);
    await reading(unmatched.id, { ...swatch, illuminant: 'D65', observer: '10' });

    const page = await suite.browser.context.newPage();
    await signInAs(page, suite.server.url, 'researcher@demo.test');
    await page.goto(`${suite.server.url}/trials/${compared.id}`);
    const delta = page.getByLabel('Delta E 2000');
    await delta.waitFor();
    expect(await delta.textContent()).toBe(`ΔE00 ${p2.dE00.toFixed(2)}`);
    expect(await page.getByTestId('comparison-conditions').textContent()).toBe(
      'Under D65; original 10°, reproduction 2° observer',
    );
    const text = (await page.getByLabel('Colour difference figures').textContent()) ?? '';
    expect(text).toContain('ΔL*0.00');
    expect(text).toContain(`ΔC*ab${show(dC)}`);
    expect(text).toContain(`ΔH*ab${show(dH)}`);
    expect(await page.getByRole('note').textContent()).toMatch(
      /^Observers differ: the original's reading is for the 10° observer and the reproduction's reading for the 2° observer \(both under D65\)/,
    );
    // Each colour carries its label; the original and the reproduction under their own conditions.
    const labels = await page.getByTestId('viewing-conditions').allTextContents();
    expect(labels).toEqual(
      expect.arrayContaining([
        'instrument reading · D65/10°',
        'instrument reading · D65/2°',
        'instrument reading · A/10°',
      ]),
    );
    await page
      .getByRole('table', { name: 'The same comparison under other illuminants' })
      .getByRole('cell', { name: 'A', exact: true })
      .waitFor();

    await page.goto(`${suite.server.url}/trials/${unmatched.id}`);
    const missing = page.getByTestId('missing-reading');
    await missing.waitFor();
    expect(await missing.textContent()).toMatch(
      /^No ΔE is given under A\. No reading of the swatch under A\/10°: measure it under A to compare with the original's reading\./,
    );
    expect(await page.getByLabel('Delta E 2000').count()).toBe(0);
    await page.close();
  });
});
