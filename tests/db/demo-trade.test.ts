import { describe, expect, it } from 'vitest';
import { Op } from 'sequelize';
import { BatchEvent, Chemical, MordantBatch, RecipeStep, Substitution, Trial } from '../../server/models/index.ts';
import { bathProduct, matchingReactant, REACTIONS } from '../../shared/compute/stoichiometry.ts';
import { stockVolumeMl } from '../../shared/compute/paste.ts';
import { computeLedger } from '../../shared/compute/ledger.ts';

// The demo scenario read as a dyer and a conservator would: every figure follows from the batches'
// own charges and volumes. Stoichiometry checked separately against IUPAC 2021 masses (tests/unit/stoichiometry.test.ts).

const batch = (code: string) => MordantBatch.findOne({ where: { code }, rejectOnEmpty: true });
const trial = (code: string) => Trial.findOne({ where: { code }, rejectOnEmpty: true });
const steps = async (code: string) =>
  RecipeStep.findAll({ where: { trialId: (await trial(code)).id }, order: [['position', 'ASC']] });
// Only the seeded history: tests elsewhere may draw from demo batches today.
const seededEvents = async (batchId: number) =>
  BatchEvent.findAll({
    where: { batchId, occurredAt: { [Op.lt]: new Date('2025-01-01') } },
    order: [
      ['occurredAt', 'ASC'],
      ['id', 'ASC'],
    ],
  });

describe('demo batches', () => {
  it('MB-07 is as strong as its charge can make it: about 17.1 g/L basic aluminium acetate, not the 75 g/L weighed in', async () => {
    const mb07 = await batch('MB-07');
    const made = bathProduct(mb07.ingredients, mb07.volumeMl)!;
    expect(made.activeGPerL).toBeCloseTo(17.08, 1);
    expect(mb07.notes).toContain(`${Math.round(made.activeGPerL * 10) / 10} g/L`);
  });

  it('MB-08 carries the aluminium acetate of the MB-07 liquor it was made from', async () => {
    const [mb07, mb08] = [await batch('MB-07'), await batch('MB-08')];
    expect(mb08.parentId).toBe(mb07.id);
    const al = mb08.ingredients.find((i) => i.name === 'aluminium acetate (basic)')!;
    const drawn = (await seededEvents(mb07.id)).find((e) => e.notes?.includes('MB-08'))!;
    const made = bathProduct(mb07.ingredients, mb07.volumeMl)!;
    expect(al.grams).toBeCloseTo((made.activeGPerL * drawn.volumeMl!) / 1000, 2);
    // One part MB-07 to three parts water.
    expect(drawn.volumeMl! / mb08.volumeMl).toBe(0.25);
  });

  it('MB-09 is the iron acetate it is named for', async () => {
    const mb09 = await batch('MB-09');
    expect(mb09.name).toMatch(/iron\(II\) acetate/i);
    expect(mb09.ingredients.map((i) => i.name)).toEqual(['iron(II) acetate']);
  });

  it('every seeded ledger replays, and MB-07 ends used up', async () => {
    for (const code of ['MB-07', 'MB-08', 'MB-09']) {
      const b = await batch(code);
      const events = (await seededEvents(b.id)).map((e) => e.get({ plain: true })) as never[];
      const ledger = computeLedger(
        { volumeMl: b.volumeMl, ingredients: b.ingredients, uptakePerUse: b.uptakePerUse, status: b.status },
        events,
      );
      if (code === 'MB-07') expect(ledger.state.remainingMl).toBe(0);
      else expect(ledger.state.remainingMl).toBeGreaterThan(0);
    }
  });
});

describe('demo top-ups', () => {
  it("MB-07 was topped up as its own ledger suggested: each ingredient's deficit to the made g/L (to the half gram), water back to 2000 mL", async () => {
    const b = await batch('MB-07');
    const events = (await seededEvents(b.id)).map((e) => e.get({ plain: true }));
    const topUps = events.flatMap((e, i) => (e.type === 'top-up' ? [i] : []));
    expect(topUps).toHaveLength(2);
    for (const i of topUps) {
      const before = computeLedger(
        { volumeMl: b.volumeMl, ingredients: b.ingredients, uptakePerUse: b.uptakePerUse },
        events.slice(0, i) as never[],
      );
      const t = before.topUp!;
      for (const a of events[i].additions!)
        expect(Math.abs(a.grams - t.ingredients.find((x) => x.name === a.name)!.grams), a.name).toBeLessThanOrEqual(
          0.25,
        );
      expect(events[i].volumeMl! + before.state.remainingMl).toBeCloseTo(2000, 0);
    }
  });
});

describe('demo trials', () => {
  it('each paste drawn from a bath draws exactly the stock its g/L needs (c1·V1 = c2·V2)', async () => {
    for (const code of ['T-2024-001', 'T-2024-002', 'T-2024-003']) {
      const paste = (await steps(code)).find((s) => s.operation === 'print-paste')!;
      const mordant = paste.ingredients.find((i) => !/gum/.test(i.name))!;
      const p = paste.paste as { volumeMl: number; stockGPerL: number };
      expect(stockVolumeMl(mordant.amount, p.volumeMl, p.stockGPerL), code).toBeCloseTo(paste.batchVolumeMl!, 0);
    }
  });

  it('the drawn pastes are as strong as the batches they come from', async () => {
    const made = bathProduct((await batch('MB-07')).ingredients, 2000)!;
    const red = (await steps('T-2024-001')).find((s) => s.operation === 'print-paste')!;
    expect((red.paste as { stockGPerL: number }).stockGPerL).toBeCloseTo(made.activeGPerL, 1);
    const mb08 = await batch('MB-08');
    const pink = (await steps('T-2024-002')).find((s) => s.operation === 'print-paste')!;
    const mb08GPerL =
      (mb08.ingredients.find((i) => i.name === 'aluminium acetate (basic)')!.grams * 1000) / mb08.volumeMl;
    expect((pink.paste as { stockGPerL: number }).stockGPerL).toBeCloseTo(mb08GPerL, 2);
  });

  it('alum on cotton always has its tannin step first (common practice for cellulose; aluminium acetate is used without one)', async () => {
    const trials = await Trial.findAll({ where: { fibre: 'cotton' } });
    for (const t of trials) {
      const s = await RecipeStep.findAll({ where: { trialId: t.id }, order: [['position', 'ASC']] });
      const alumAt = s.findIndex((x) => x.ingredients.some((i) => /potash alum|aluminium sulfate/.test(i.name)));
      if (alumAt < 0) continue;
      const tanninAt = s.findIndex(
        (x) => x.operation === 'tannin' || x.ingredients.some((i) => i.name === 'tannic acid'),
      );
      expect(tanninAt, t.code).toBeGreaterThanOrEqual(0);
      expect(tanninAt, t.code).toBeLessThan(alumAt);
    }
  });

  it('every indigo vat lists its lime and fructose, so the lime caution shows', async () => {
    const demoVats = await RecipeStep.findAll({
      where: {
        operation: 'vat',
        trialId: {
          [Op.in]: (await Trial.findAll({ where: { code: ['T-2024-005', 'T-2024-006', 'T-2024-007'] } })).map(
            (t) => t.id,
          ),
        },
      },
    });
    expect(demoVats).toHaveLength(3);
    for (const v of demoVats)
      expect(v.ingredients.map((i) => i.name)).toEqual(['indigo', 'calcium hydroxide (slaked lime)', 'fructose']);
    const lime = await Chemical.findOne({ where: { name: 'calcium hydroxide (slaked lime)' }, rejectOnEmpty: true });
    expect(lime.signalWord).toBe('Danger');
  });

  it('the red-liquor substitution compares like with like: the lead acetate the same alum would have taken, and its sludge noted', async () => {
    const t1 = await trial('T-2024-001');
    const [sub] = await Substitution.findAll({ where: { trialId: t1.id } });
    const red = (await steps('T-2024-001')).find((s) => s.operation === 'print-paste')!;
    const alumG = (100 * red.batchVolumeMl!) / 2000;
    const lead = matchingReactant(
      REACTIONS.find((r) => r.id === 'alum-lead-acetate')!,
      'potash alum',
      alumG,
    )[0].grams;
    expect(sub.historicalAmountG).toBeCloseTo(lead, 1);
    expect(sub.modernAmountG).toBeCloseTo((50 * red.batchVolumeMl!) / 2000, 2);
    expect(sub.notes).toMatch(/lead sulfate sludge/);
  });
});
