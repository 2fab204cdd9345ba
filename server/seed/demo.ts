import { readFileSync } from 'node:fs';
import path from 'node:path';
import type { Transaction } from 'sequelize';
import { ROOT_DIR } from '../env.ts';
import { seedDemoRecords } from './demo-records.ts';
import {
  Chemical,
  Dyestuff,
  type BatchEvent,
  type Piece,
  type Substitution,
  type Trial,
  type User,
} from '../models/index.ts';
import type { Ingredient, Operation } from '../models/trials.ts';
import { bathProduct, matchingReactant, REACTIONS } from '../../shared/compute/stoichiometry.ts';
import { computeLedger, type LedgerEvent } from '../../shared/compute/ledger.ts';
import {
  makeBatch,
  makeBatchEvent,
  makeMeasurement,
  makePiece,
  makeSavedSearch,
  makeRecipeStep,
  makeSeries,
  makeSubstitution,
  makeTrial as makeTrialRow,
  makeUser,
  type PieceInput,
} from './factories.ts';
import { seedDemoPhotos } from './demo-photos.ts';
import { ladderSpectrum } from './ladders.ts';
import { spectrumToLab, type Spectrum } from '../../shared/colour/spectral.ts';

// Invented reflectance spectra (400–700 nm every 10 nm, fractions) of the purple ground and its reproduction.
const PURPLE_GROUND = [
  0.1041, 0.1145, 0.1225, 0.1255, 0.1225, 0.1145, 0.1041, 0.094, 0.0861, 0.0809, 0.078, 0.0766, 0.076, 0.0758, 0.0758,
  0.076, 0.0762, 0.0767, 0.0777, 0.0796, 0.0834, 0.0905, 0.1041, 0.1291, 0.1732, 0.2451, 0.3483, 0.4725, 0.5935, 0.6896,
  0.7543,
];
const PURPLE_SWATCH = [
  0.0839, 0.0914, 0.101, 0.1109, 0.1186, 0.1215, 0.1186, 0.111, 0.101, 0.0915, 0.0841, 0.0793, 0.0768, 0.0761, 0.0767,
  0.0787, 0.0825, 0.089, 0.0986, 0.1106, 0.1228, 0.1328, 0.1397, 0.144, 0.1464, 0.1477, 0.1484, 0.1487, 0.1489, 0.149,
  0.1491,
];
/** A reading taken as a spectrum: the spectrum and its L*a*b* for D65/10° (the demo readings' conditions). */
const spectral = (values: number[]) => {
  const spectrum: Spectrum = { startNm: 400, intervalNm: 10, values };
  return { ...spectrumToLab(spectrum, 'D65', '10').lab, spectrum };
};

/** The invented demo scenario: the Calderwick museum and the Weldfold dye studio. */
export const DEMO_PASSWORD = 'tinctoria-demo';
export const DEMO_ACCOUNTS = [
  { email: 'admin@demo.test', name: 'Jory Fenmarch', role: 'admin' },
  { email: 'curator@demo.test', name: 'Ysolde Marrin', role: 'curator' },
  { email: 'researcher@demo.test', name: 'Dr Anselm Threave', role: 'researcher' },
  { email: 'dyer@demo.test', name: 'Bryony Kettlewick', role: 'dyer' },
] as const;

const chem = async (name: string, t: Transaction) =>
  await Chemical.findOne({ where: { name }, transaction: t, rejectOnEmpty: true });
const dye = async (name: string, t: Transaction) =>
  await Dyestuff.findOne({ where: { name }, transaction: t, rejectOnEmpty: true });

type StepSpec = {
  operation: Operation;
  ingredients: Array<[kind: 'dyestuff' | 'chemical', name: string, amount: number, basis: Ingredient['basis']]>;
  liquorRatio?: number;
  temperatureC?: number;
  minutes?: number;
  ph?: number;
  paste?: Record<string, unknown>;
  notes?: string;
  batchCode?: string;
  batchVolumeMl?: number;
};

export async function seedDemo(t: Transaction) {
  const users: Record<string, User> = {};
  for (const a of DEMO_ACCOUNTS) users[a.role] = await makeUser({ ...a, password: DEMO_PASSWORD }, t);
  const tamsin = await makeUser(
    { email: 'tamsin.orrery@weldfold.test', name: 'Tamsin Orrery', role: 'dyer', password: DEMO_PASSWORD },
    t,
  );

  const pieceRows = JSON.parse(
    readFileSync(path.join(ROOT_DIR, 'server/seed/data/demo-pieces.json'), 'utf8'),
  ) as PieceInput[];
  const pieces: Record<string, Piece> = {};
  for (const p of pieceRows) pieces[p.accessionNumber!] = await makePiece({ ...p, createdById: users.curator.id }, t);
  await seedDemoRecords(t, { pieces, researcher: users.researcher, curator: users.curator });

  const alum = await chem('potash alum', t);
  const alAcetate = await chem('aluminium acetate (basic)', t);
  const caAcetate = await chem('calcium acetate', t);
  const leadAcetate = await chem('lead(II) acetate (sugar of lead)', t);
  const dichromate = await chem('potassium dichromate', t);
  const ferrous = await chem('iron(II) sulfate (copperas)', t);
  const feAcetate = await chem('iron(II) acetate', t);
  const chalk = await chem('calcium carbonate (chalk)', t);
  const guar = await chem('guar gum', t);
  const tannin = await chem('tannic acid', t);
  const soda = await chem('sodium carbonate (soda ash)', t);
  const lime = await chem('calcium hydroxide (slaked lime)', t);
  const fructose = await chem('fructose', t);
  const madder = await dye('madder', t);
  const weld = await dye('weld', t);
  const indigo = await dye('indigo', t);
  const byName = new Map(
    [
      alum,
      alAcetate,
      caAcetate,
      leadAcetate,
      dichromate,
      ferrous,
      feAcetate,
      chalk,
      guar,
      tannin,
      soda,
      lime,
      fructose,
    ].map((c) => [c.name, c]),
  );
  const dyes = new Map([madder, weld, indigo].map((d) => [d.name, d]));

  // Batches. MB-07 is aluminium acetate made in the pot from alum and calcium acetate: its strength is
  // what that charge can make (calcium acetate limits), computed, not the 150 g weighed in.
  const mb07Charge = [
    { kind: 'chemical' as const, refId: alum.id, name: alum.name, grams: 100 },
    { kind: 'chemical' as const, refId: caAcetate.id, name: caAcetate.name, grams: 50 },
  ];
  const made = bathProduct(mb07Charge, 2000)!;
  const r1 = (x: number) => Math.round(x * 10) / 10;
  const r2 = (x: number) => Math.round(x * 100) / 100;
  const mb07 = await makeBatch(
    {
      code: 'MB-07',
      kind: 'mordant-bath',
      name: 'Aluminium acetate liquor (alum + calcium acetate)',
      ingredients: mb07Charge,
      volumeMl: 2000,
      thickenerGPerL: null,
      ph: 4.2,
      madeOn: '2024-03-04',
      madeById: users.dyer.id,
      checkBy: '2024-06-04',
      status: 'exhausted',
      parentId: null,
      uptakePerUse: 0.12,
      notes: `Red liquor without lead. Makes about ${r1(made.active.grams)} g basic aluminium acetate (${r1(made.activeGPerL)} g/L; ${made.limiting} limits); the gypsum settled overnight and the clear liquor was decanted.`,
    },
    t,
  );
  // MB-08: one part MB-07 to three parts water, thickened with guar; its aluminium acetate is what the 125 mL drawn carried.
  const mb08FromMb07Ml = 125;
  const mb08AlAcetateG = r2((made.activeGPerL * mb08FromMb07Ml) / 1000);
  const mb08 = await makeBatch(
    {
      code: 'MB-08',
      kind: 'print-paste',
      name: 'Weak aluminium acetate print paste for pinks (1 part MB-07 to 3 parts water)',
      ingredients: [
        { kind: 'chemical', refId: alAcetate.id, name: alAcetate.name, grams: mb08AlAcetateG },
        { kind: 'chemical', refId: guar.id, name: guar.name, grams: 10 },
      ],
      volumeMl: 500,
      thickenerGPerL: 20,
      ph: 4.4,
      madeOn: '2024-03-11',
      madeById: users.dyer.id,
      checkBy: '2024-03-18',
      status: 'active',
      parentId: mb07.id,
      uptakePerUse: 0,
      notes: `Child of MB-07: ${mb08FromMb07Ml} mL of MB-07 made up to 500 mL (${mb08AlAcetateG} g aluminium acetate, ${r2(mb08AlAcetateG * 2)} g/L), thickened with 10 g guar.`,
    },
    t,
  );
  const mb09 = await makeBatch(
    {
      code: 'MB-09',
      kind: 'mordant-bath',
      name: 'Iron(II) acetate liquor for purples',
      ingredients: [{ kind: 'chemical', refId: feAcetate.id, name: feAcetate.name, grams: 15 }],
      volumeMl: 1000,
      thickenerGPerL: null,
      ph: 4.8,
      madeOn: '2024-03-11',
      madeById: users.dyer.id,
      checkBy: '2024-05-11',
      status: 'active',
      parentId: null,
      uptakePerUse: 0,
      notes:
        'Stock drawn from for purple pastes: 15 g iron(II) acetate in 1 L. Keep it closed: it oxidises and browns in air.',
    },
    t,
  );
  const at = (d: string) => new Date(`${d}T10:00:00Z`);
  const ev = (
    batchId: number,
    type: BatchEvent['type'],
    d: string,
    extra: Partial<BatchEvent['_creationAttributes']> = {},
  ) => makeBatchEvent({ batchId, type, occurredAt: at(d), createdById: users.dyer.id, ...extra }, t);

  // Trials
  let seq = 0;
  const trials: Trial[] = [];
  // The step that owns each bath's draw (one recipe step per demo bath), for its ledger event.
  const drawStep: Record<string, number> = {};
  const makeTrial = async (
    attrs: Partial<Trial['_creationAttributes']>,
    steps: StepSpec[],
    subs: Array<Partial<Substitution['_creationAttributes']>> = [],
  ) => {
    seq += 1;
    const trial = await makeTrialRow(
      {
        code: `T-2024-${String(seq).padStart(3, '0')}`,
        dyerId: users.dyer.id,
        fibre: 'cotton',
        weave: 'plain (tabby)',
        gsm: 140,
        dryMassG: 250,
        startedOn: '2024-03-12',
        ...attrs,
      },
      t,
    );
    const batchIds: Record<string, number> = { 'MB-07': mb07.id, 'MB-08': mb08.id, 'MB-09': mb09.id };
    for (const [i, s] of steps.entries()) {
      const step = await makeRecipeStep(
        {
          trialId: trial.id,
          position: i + 1,
          operation: s.operation,
          ingredients: s.ingredients.map(([kind, name, amount, basis]) => {
            const ref = kind === 'dyestuff' ? dyes.get(name)! : byName.get(name)!;
            return { kind, refId: ref.id, name, amount, basis };
          }),
          liquorRatio: s.liquorRatio ?? null,
          temperatureC: s.temperatureC ?? null,
          minutes: s.minutes ?? null,
          ph: s.ph ?? null,
          paste: s.paste ?? null,
          batchId: s.batchCode ? batchIds[s.batchCode] : null,
          batchVolumeMl: s.batchVolumeMl ?? null,
          notes: s.notes ?? null,
        },
        t,
      );
      if (s.batchCode) drawStep[s.batchCode] = step.id;
      for (const sub of subs.filter((x) => x.stepId === i + 1)) {
        await makeSubstitution({ trialId: trial.id, ...sub, stepId: step.id }, t);
      }
    }
    trials.push(trial);
    return trial;
  };

  // Cotton takes tannin before alum (common practice for cellulose): the same two steps on every alum trial.
  const tannin8: StepSpec = {
    operation: 'tannin',
    ingredients: [['chemical', 'tannic acid', 8, 'owf']],
    liquorRatio: 30,
    temperatureC: 50,
    minutes: 60,
  };
  const alum15: StepSpec = {
    operation: 'mordant-bath',
    ingredients: [['chemical', 'potash alum', 15, 'owf']],
    liquorRatio: 30,
    temperatureC: 45,
    minutes: 60,
  };
  const p12 = pieces['1931.4.12'];
  // The red paste is MB-07's liquor thickened as drawn; the pink uses MB-08 as it is; the purple thins MB-09 with guar.
  const redDrawMl = 300;
  const redGPerL = r1(made.activeGPerL);
  const pinkDrawMl = 120;
  const pinkGPerL = r2(mb08AlAcetateG * 2);
  // Like with like: historically the same alum made red liquor with sugar of lead instead of calcium acetate.
  const leadRecipe = REACTIONS.find((r) => r.id === 'alum-lead-acetate')!;
  const alumIn = (mlOfMb07: number) => (100 * mlOfMb07) / 2000;
  const leadFor = (mlOfMb07: number) => r1(matchingReactant(leadRecipe, alum.name, alumIn(mlOfMb07))[0].grams);
  const caFor = (mlOfMb07: number) => r2((50 * mlOfMb07) / 2000);
  const sludgeNote =
    'Most of the lead left the red liquor as insoluble lead sulfate sludge rather than going onto the cloth; the sludge was hazardous waste.';
  const pinkMb07Ml = (pinkDrawMl * mb08FromMb07Ml) / 500;
  const t1 = await makeTrial(
    {
      pieceId: p12.id,
      status: 'finished',
      notes: 'Strong red from the aluminium acetate liquor MB-07 in place of the lead-based red liquor.',
      fastness: {
        light: { blueWool: '5', informal: false },
        washing: { change: '4-5', staining: '4', informal: false },
        rubbingDry: { staining: '4', informal: false },
        rubbingWet: { staining: '3-4', informal: false },
      },
    },
    [
      {
        operation: 'scour',
        ingredients: [['chemical', 'sodium carbonate (soda ash)', 5, 'owf']],
        liquorRatio: 40,
        temperatureC: 95,
        minutes: 60,
      },
      tannin8,
      {
        operation: 'print-paste',
        ingredients: [
          ['chemical', 'aluminium acetate (basic)', redGPerL, 'g/L'],
          ['chemical', 'guar gum', 20, 'g/L'],
        ],
        paste: { volumeMl: redDrawMl, stockGPerL: redGPerL },
        batchCode: 'MB-07',
        batchVolumeMl: redDrawMl,
        notes: 'MB-07 liquor thickened as drawn. Print with the pheasant block; dry 48 h.',
      },
      {
        operation: 'after-treatment',
        ingredients: [['chemical', 'calcium carbonate (chalk)', 2, 'g/L']],
        liquorRatio: 30,
        temperatureC: 40,
        minutes: 15,
        notes: 'Fix and clear the thickener.',
      },
      {
        operation: 'dye-bath',
        ingredients: [
          ['dyestuff', 'madder', 60, 'owf'],
          ['chemical', 'calcium carbonate (chalk)', 1, 'owf'],
        ],
        liquorRatio: 30,
        temperatureC: 70,
        minutes: 90,
      },
    ],
    [
      {
        stepId: 3,
        historicalChemicalId: leadAcetate.id,
        historicalAmountG: leadFor(redDrawMl),
        historicalPractice: `red liquor: ${alumIn(redDrawMl)} g alum with sugar of lead`,
        modernChemicalId: caAcetate.id,
        modernAmountG: caFor(redDrawMl),
        modernPractice: `aluminium acetate from the same ${alumIn(redDrawMl)} g alum with calcium acetate`,
        reason: 'toxicity',
        notes: sludgeNote,
      },
    ],
  );
  await makeTrial(
    { pieceId: p12.id, status: 'finished', notes: 'Pink from the weak paste MB-08, used as it is.' },
    [
      {
        operation: 'print-paste',
        ingredients: [
          ['chemical', 'aluminium acetate (basic)', pinkGPerL, 'g/L'],
          ['chemical', 'guar gum', 20, 'g/L'],
        ],
        paste: { volumeMl: pinkDrawMl, stockGPerL: pinkGPerL },
        batchCode: 'MB-08',
        batchVolumeMl: pinkDrawMl,
        notes: 'Ready-made paste MB-08, already thickened.',
      },
      {
        operation: 'dye-bath',
        ingredients: [['dyestuff', 'madder', 60, 'owf']],
        liquorRatio: 30,
        temperatureC: 70,
        minutes: 90,
      },
    ],
    [
      {
        stepId: 1,
        historicalChemicalId: leadAcetate.id,
        historicalAmountG: leadFor(pinkMb07Ml),
        historicalPractice: `weak red liquor: ${alumIn(pinkMb07Ml)} g alum with sugar of lead`,
        modernChemicalId: caAcetate.id,
        modernAmountG: caFor(pinkMb07Ml),
        modernPractice: 'aluminium acetate from alum and calcium acetate, diluted',
        reason: 'toxicity',
        notes: sludgeNote,
      },
    ],
  );
  await makeTrial({ pieceId: p12.id, status: 'finished', notes: 'Purple from the iron acetate liquor MB-09.' }, [
    {
      operation: 'print-paste',
      ingredients: [
        ['chemical', 'iron(II) acetate', 10, 'g/L'],
        ['chemical', 'guar gum', 20, 'g/L'],
      ],
      paste: { volumeMl: 150, stockGPerL: 15 },
      batchCode: 'MB-09',
      batchVolumeMl: 100,
      notes: '100 mL of MB-09 made up to 150 mL with guar.',
    },
    {
      operation: 'dye-bath',
      ingredients: [['dyestuff', 'madder', 60, 'owf']],
      liquorRatio: 30,
      temperatureC: 70,
      minutes: 90,
    },
  ]);
  await makeTrial({ pieceId: p12.id, status: 'in-progress', notes: 'Green: weld over pencilled indigo.' }, [
    tannin8,
    alum15,
    {
      operation: 'overdye',
      ingredients: [
        ['dyestuff', 'weld', 50, 'owf'],
        ['chemical', 'calcium carbonate (chalk)', 2, 'owf'],
      ],
      liquorRatio: 30,
      temperatureC: 70,
      minutes: 60,
    },
  ]);
  // Fructose-lime vats at 1 part indigo, 2 parts lime, 3 parts fructose by mass (common practice, recalled from memory).
  const vat = (indigoOwf: number, notes: string): StepSpec => ({
    operation: 'vat',
    ingredients: [
      ['dyestuff', 'indigo', indigoOwf, 'owf'],
      ['chemical', lime.name, indigoOwf * 2, 'owf'],
      ['chemical', fructose.name, indigoOwf * 3, 'owf'],
    ],
    liquorRatio: 50,
    temperatureC: 50,
    minutes: 20,
    notes,
  });
  const p96 = pieces['1996.9.6'];
  await makeTrial(
    {
      pieceId: p96.id,
      status: 'finished',
      dryMassG: 120,
      notes: 'Yellow over indigo without chromium: alum and a weld overdye.',
    },
    [
      vat(2, 'Fructose-lime vat; two dips.'),
      tannin8,
      alum15,
      {
        operation: 'overdye',
        ingredients: [['dyestuff', 'weld', 60, 'owf']],
        liquorRatio: 30,
        temperatureC: 70,
        minutes: 60,
      },
    ],
    [
      {
        stepId: 3,
        historicalChemicalId: dichromate.id,
        historicalAmountG: 3.6,
        modernChemicalId: alum.id,
        modernAmountG: 18,
        modernPractice: 'alum mordant with a weld overdye',
        reason: 'toxicity',
      },
    ],
  );
  for (const [i, note] of ['Indigo depth test, 4 dips.', 'Resist paste trial (clay and gum).'].entries()) {
    await makeTrial(
      { pieceId: pieces['1958.22.4'].id, status: i ? 'planned' : 'finished', dryMassG: 100, notes: note },
      [vat(3, 'Fructose-lime vat.')],
    );
  }

  // Invented instrument readings: the original's red, pink and purple grounds as targets, and each result's swatch.
  const reading = (attrs: {
    pieceId?: number;
    trialId?: number;
    L: number;
    a: number;
    b: number;
    label: string;
    illuminant?: string;
    spectrum?: Spectrum | null;
  }) => makeMeasurement({ takenOn: '2024-04-02', createdById: users.researcher.id, ...attrs }, t);
  type Ground = {
    label: string;
    L: number;
    a: number;
    b: number;
    spectrum?: Spectrum;
    result: Array<{ L: number; a: number; b: number; spectrum?: Spectrum }>;
  };
  const grounds: Ground[] = [
    {
      label: 'madder red ground',
      L: 42.5,
      a: 45.1,
      b: 26.3,
      result: [
        { L: 43.9, a: 42.8, b: 27.5 },
        { L: 44.2, a: 42.4, b: 27.9 },
      ],
    },
    { label: 'madder pink ground', L: 68.2, a: 24.5, b: 10.1, result: [{ L: 66.9, a: 26.0, b: 11.2 }] },
    // The purple ground and its swatch were read as reflectance spectra (invented smooth curves: a blue bump
    // and a red rise at different places), their L*a*b* computed from them: close in daylight, apart under F11 and A.
    { label: 'madder purple ground', ...spectral(PURPLE_GROUND), result: [spectral(PURPLE_SWATCH)] },
  ];
  for (const [i, g] of grounds.entries()) {
    const target = await reading({ pieceId: p12.id, L: g.L, a: g.a, b: g.b, label: g.label, spectrum: g.spectrum });
    await trials[i].update({ targetMeasurementId: target.id }, { transaction: t });
    for (const r of g.result) await reading({ trialId: trials[i].id, ...r, label: `${trials[i].code} swatch` });
  }
  // The red ground and T-2024-001's swatch read again under tungsten light (A/10°): compared under A
  // beside the primary D65 comparison, never averaged with the D65 readings.
  await reading({ pieceId: p12.id, L: 44.6, a: 48.3, b: 33.4, label: 'madder red ground', illuminant: 'A' });
  await reading({
    trialId: trials[0].id,
    L: 46.2,
    a: 44.9,
    b: 35.8,
    label: `${trials[0].code} swatch`,
    illuminant: 'A',
  });

  // Events on the batches, in order. Liquor drawn off for a paste or a child batch is a use without fibre: it
  // takes volume, not strength. MB-07 is drawn from, used to mordant cloth, topped up twice, then used up.
  // The dyer topped up as the ledger suggested (weighed to the half gram): replay MB-07's history so far.
  const mb07History: LedgerEvent[] = [];
  const mb07Ev = async (type: BatchEvent['type'], d: string, extra: Partial<BatchEvent['_creationAttributes']>) => {
    mb07History.push({
      type,
      volumeMl: extra.volumeMl ?? 0,
      fibreMassG: extra.fibreMassG ?? null,
      additions: extra.additions ?? null,
      result: extra.result ?? null,
    } as LedgerEvent);
    return ev(mb07.id, type, d, extra);
  };
  const asSuggested = (d: string) => {
    const ledger = computeLedger(
      { volumeMl: mb07.volumeMl, ingredients: mb07.ingredients, uptakePerUse: mb07.uptakePerUse },
      mb07History,
    );
    const t = ledger.topUp!;
    const additions = t.ingredients
      .filter((i) => i.grams > 0)
      .map((i) => ({ kind: 'chemical' as const, refId: i.refId!, name: i.name, grams: Math.round(i.grams * 2) / 2 }));
    return mb07Ev('top-up', d, {
      additions,
      volumeMl: Math.round(t.waterMl),
      notes: 'As the ledger suggested: back to the strength and volume as made.',
    });
  };
  await mb07Ev('use', '2024-03-11', { volumeMl: mb08FromMb07Ml, notes: 'Drawn to make MB-08.' });
  await mb07Ev('use', '2024-03-12', {
    volumeMl: redDrawMl,
    trialId: t1.id,
    stepId: drawStep['MB-07'],
    notes: 'Drawn for the red paste of T-2024-001.',
  });
  await mb07Ev('use', '2024-03-14', { volumeMl: 400, fibreMassG: 250, notes: 'Cotton padded through the liquor.' });
  await asSuggested('2024-03-15');
  await mb07Ev('use', '2024-03-20', { volumeMl: 600, fibreMassG: 300 });
  await mb07Ev('test-strip', '2024-03-21', { result: 'strip dyed a full red: bath still strong' });
  await asSuggested('2024-03-22');
  await mb07Ev('use', '2024-04-02', { volumeMl: 900, fibreMassG: 400 });
  await mb07Ev('use', '2024-04-10', { volumeMl: 1100, fibreMassG: 350, notes: 'The last of the liquor.' });
  await mb07Ev('test-strip', '2024-04-11', { result: 'strip pale pink only: bath exhausted' });
  await ev(mb08.id, 'use', '2024-03-12', {
    volumeMl: pinkDrawMl,
    trialId: trials[1].id,
    stepId: drawStep['MB-08'],
    notes: 'Drawn for the pink of T-2024-002.',
  });
  await ev(mb09.id, 'use', '2024-03-13', {
    volumeMl: 100,
    trialId: trials[2].id,
    stepId: drawStep['MB-09'],
    notes: 'Drawn for the purple paste of T-2024-003.',
  });

  // The workshop: six shades per participant from shared baths.
  // Factors say what they change in the recipe, so the series can scale it and list the materials.
  const al = (owf: number) => ({ refId: alum.id, name: alum.name, owf });
  const fe = (owf: number) => ({ refId: ferrous.id, name: ferrous.name, owf });
  const factors = [
    { name: 'madder', role: 'dyestuff', refId: madder.id, refName: madder.name, levels: ['50'] },
    {
      name: 'mordant',
      role: 'mordant',
      refId: null,
      refName: null,
      levels: ['strong Al', 'weak Al', 'Fe', 'Al+Fe'],
      mordants: [
        { level: 'strong Al', chemicals: [al(15)] },
        { level: 'weak Al', chemicals: [al(5)] },
        { level: 'Fe', chemicals: [fe(2)] },
        { level: 'Al+Fe', chemicals: [al(10), fe(1)] },
      ],
    },
    { name: 'tannin', role: 'tannin', refId: tannin.id, refName: tannin.name, levels: ['0', '10'] },
  ];
  const cells = [
    { mordant: 'strong Al', tannin: '10' },
    { mordant: 'weak Al', tannin: '10' },
    { mordant: 'Fe', tannin: '10' },
    { mordant: 'Al+Fe', tannin: '10' },
    { mordant: 'strong Al', tannin: '0' },
    { mordant: 'weak Al', tannin: '0' },
  ].map((c) => ({ madder: '50', ...c }));
  const series = await makeSeries(
    {
      code: 'WS-2024-01',
      title: 'Madder on four mordants: a six-shade card',
      kind: 'workshop',
      pieceId: p12.id,
      factors,
      cells,
      participants: ['P-01', 'P-02', 'P-03', 'P-04'],
      dryMassG: 10,
      deadVolumePct: 15,
      ownerId: tamsin.id,
      heldOn: '2024-04-20',
      notes:
        'Each participant mordants and dyes six 10 g swatches: tannin, alum and iron baths made up per cell from its recipe, then one shared madder bath.',
    },
    t,
  );
  // Each planned cell carries its whole recipe: the tannin and mordant steps its levels call for, then the dye bath.
  for (const cell of cells.slice(0, 3)) {
    const mordant = factors[1].mordants!.find((m) => m.level === cell.mordant)!.chemicals;
    const tanninOwf = Number(cell.tannin);
    await makeTrial(
      {
        pieceId: p12.id,
        seriesId: series.id,
        cell,
        dyerId: tamsin.id,
        dryMassG: 10,
        status: 'planned',
        notes: `Workshop cell: ${cell.mordant}, tannin ${cell.tannin} % owf`,
      },
      [
        ...(tanninOwf > 0
          ? [
              {
                operation: 'tannin' as const,
                ingredients: [['chemical', tannin.name, tanninOwf, 'owf'] as StepSpec['ingredients'][number]],
                liquorRatio: 30,
                minutes: 60,
              },
            ]
          : []),
        {
          operation: 'mordant-bath',
          ingredients: mordant.map((c) => ['chemical', c.name, c.owf, 'owf'] as StepSpec['ingredients'][number]),
          liquorRatio: 30,
          minutes: 60,
        },
        {
          operation: 'dye-bath',
          ingredients: [['dyestuff', 'madder', 50, 'owf']],
          liquorRatio: 30,
          temperatureC: 70,
          minutes: 60,
        },
      ],
    );
  }
  // The workshop's strength ladders, dyed to choose its madder strength: madder and weld at 5, 10, 20 and 40 % owf on
  // tannin-and-alum mordanted cotton, everything else the same, each swatch read as a spectrum; in the series, outside
  // its grid of cells. They are what
  // recipe suggestions interpolate (server/services/suggestions/); the readings are invented (server/seed/ladders.ts).
  for (const dye of ['madder', 'weld'] as const)
    for (const owf of [5, 10, 20, 40]) {
      const trial = await makeTrial(
        {
          seriesId: series.id,
          dyerId: tamsin.id,
          dryMassG: 10,
          gsm: 140,
          status: 'finished',
          startedOn: '2024-03-28',
          notes: `Strength ladder: ${dye} ${owf} % owf on tannin and alum, the workshop's preparation.`,
        },
        [
          tannin8,
          alum15,
          {
            operation: 'dye-bath',
            ingredients: [['dyestuff', dye, owf, 'owf']],
            liquorRatio: 30,
            temperatureC: 70,
            minutes: 60,
          },
        ],
      );
      await reading({ trialId: trial.id, ...spectral(ladderSpectrum(dye, owf).values), label: `${trial.code} swatch` });
    }
  // Saved searches on the home pages (issue 19): the /search page's own query strings.
  for (const [who, name, query] of [
    ['researcher', 'Madder on cotton', 'dyestuff=madder&fibre=cotton'],
    ['researcher', 'Reds near the bed hanging', 'hex=a53a2d&maxDeltaE=8'],
    ['curator', 'Calderwick drafts', 'q=Calderwick&status=draft'],
    ['dyer', 'Weld greens', 'q=weld'],
  ] as const)
    await makeSavedSearch({ userId: users[who].id, name, query }, t);
  await seedDemoPhotos(t, { pieces, trials, curator: users.curator, dyer: users.dyer });
  return { users, pieces, trials, batches: { mb07, mb08, mb09 }, series };
}
