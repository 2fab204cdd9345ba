import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { fieldLabel, messageFor } from '../../shared/messages.ts';
import { batchCreateFormSchema, batchCreateSchema, batchEventSchema } from '../../shared/schemas/batches.ts';
import { seriesCreateSchema } from '../../shared/schemas/series.ts';
import { inviteSchema } from '../../shared/schemas/team.ts';
import { chemicalCreateSchema, dyestuffCreateSchema } from '../../shared/schemas/reference.ts';
import { shadeQuerySchema } from '../../shared/schemas/search.ts';
import {
  measurementSchema,
  stepsSchema,
  substitutionSchema,
  trialCreateSchema,
  trialListQuerySchema,
  trialUpdateSchema,
} from '../../shared/schemas/trial.ts';
import { pieceCreateSchema, pieceListQuery } from '../../shared/schemas/piece.ts';
import { savedSearchCreateSchema } from '../../shared/schemas/saved-search.ts';
import { rectSchema, regionCreateSchema } from '../../shared/schemas/photo.ts';
import { loginSchema } from '../../shared/schemas/auth.ts';
import { acceptInvitationSchema, resetPasswordSchema, resetRequestSchema } from '../../shared/schemas/team.ts';

// zod's own English, which must never reach a person.
// "expected" as a word: zod says "expected string"; our formula messages say "Unexpected "x" at position 7".
const RAW =
  /Invalid input|Invalid option|\bexpected|received|Too big|Too small|Unrecognized key|Invalid string|Enter The/;

const messages = (schema: z.ZodType, value: unknown) => {
  const r = schema.safeParse(value);
  if (r.success) throw new Error('expected a failure');
  // The first message of each field, as the forms show it.
  return Object.fromEntries(r.error.issues.toReversed().map((i) => [i.path.join('.'), i.message]));
};

describe('the error map: every issue kind in people words, with the field label', () => {
  // One schema with no messages of its own, so every message comes from the map.
  const bare = z
    .object({
      volumeMl: z.number().positive().max(1000),
      dryMassG: z.number(),
      code: z
        .string()
        .min(2)
        .max(5)
        .regex(/^[A-Z]+$/),
      name: z.string().min(1),
      kind: z.enum(['mordant-bath', 'dye-bath']),
      factors: z.array(z.string()).min(1).max(2),
      minutes: z.number().int().multipleOf(5),
      email: z.email(),
      startedOn: z.iso.date(),
      hex: z.union([z.string().length(6), z.number()]),
      active: z.boolean(),
      refId: z.number().int().positive(),
      modernPractice: z.string().refine((v) => v !== 'x'),
    })
    .strict();

  const cases: Array<[string, unknown, RegExp]> = [
    ['volumeMl', undefined, /^Enter the volume in mL$/],
    ['volumeMl', null, /^Enter the volume in mL$/],
    ['volumeMl', Number.NaN, /^Enter the volume in mL$/],
    ['volumeMl', 'lots', /^Enter the volume as a number in mL$/],
    ['volumeMl', 0, /^The volume must be more than 0 mL$/],
    ['volumeMl', 5000, /^The volume must be 1,000 mL or less$/],
    ['dryMassG', '', /^Enter the dry fibre mass in g$/],
    ['code', 'A', /^Use at least 2 characters for the code$/],
    ['code', 'ABCDEFG', /^Use at most 5 characters for the code$/],
    ['code', 'ab', /^Check the code: it is not written the way it should be$/],
    ['name', '', /^Enter the name$/],
    ['code', '', /^Enter the code$/],
    ['kind', 'vat', /^Choose a kind: mordant-bath, dye-bath$/],
    ['kind', undefined, /^Choose a kind/],
    ['factors', [], /^Add at least one entry to the factors$/],
    ['factors', ['a', 'b', 'c'], /^The factors can have at most 2 entries$/],
    ['minutes', 2.5, /^The time must be a whole number$/],
    ['minutes', 7, /^The time must be a multiple of 5$/],
    ['email', 'nobody', /^Enter an e-mail address such as name@example\.org$/],
    ['startedOn', '12/03/2024', /^Enter a date such as 2024-03-12$/],
    ['hex', true, /^Check the hex colour/],
    ['active', 'yes', /^Choose active or not$/],
    ['refId', 0, /^Choose an ingredient$/],
    ['modernPractice', 'x', /^Check the modern practice$/],
  ];
  const valid = {
    volumeMl: 10,
    dryMassG: 1,
    code: 'AB',
    name: 'n',
    kind: 'dye-bath',
    factors: ['a'],
    minutes: 5,
    email: 'a@b.org',
    startedOn: '2024-03-12',
    hex: 'aaaaaa',
    active: true,
    refId: 1,
    modernPractice: 'y',
  };
  it.each(cases)('%s = %j', (field, value, want) => {
    const got = messages(bare, { ...valid, [field]: value })[field];
    expect(got).toMatch(want);
    expect(got).not.toMatch(RAW);
  });

  it('names an unknown field in words', () => {
    const got = messages(bare, { ...valid, colour: 'red' })[''];
    expect(got).toBe('Leave out the field this form does not have: colour');
  });

  it('uses a list row’s own key, and words an unlisted camelCase key', () => {
    expect(fieldLabel(['steps', 0, 'ingredients', 2, 'amount']).label).toBe('the amount');
    expect(fieldLabel(['steps', 1]).label).toBe('the steps');
    expect(fieldLabel(['historicalPractice']).label).toBe('the historical practice');
    expect(messageFor({ code: 'custom', path: [], input: 1 } as never)).toBe('Check this value');
  });
});

describe('the forms’ schemas, empty and wrong', () => {
  const sweep: Array<[string, z.ZodType, unknown]> = [
    ['new bath, empty', batchCreateFormSchema, {}],
    [
      'new bath, wrong',
      batchCreateFormSchema,
      {
        code: '?',
        kind: 'soup',
        name: '',
        volumeMl: -3,
        madeOn: 'soon',
        ph: 15,
        uptakePerUse: 150,
        ingredients: [{ kind: 'chemical', refId: 1, name: 'alum', grams: Number.NaN }],
      },
    ],
    ['bath event, empty draw', batchEventSchema, { type: 'use' }],
    ['new trial, empty', trialCreateSchema, { dryMassG: undefined }],
    [
      'new trial, wrong',
      trialCreateSchema,
      { dryMassG: 'heavy', gsm: -1, startedOn: 'March', status: 'done', targetRegionId: 1, targetPaletteColourId: 2 },
    ],
    ['new trial, wrong mass basis', trialCreateSchema, { dryMassG: 5, dryMassBasis: 'damp' }],
    [
      'recipe, wrong historical-use confirmation',
      stepsSchema,
      { steps: [{ operation: 'dye-bath', historicalUseConfirmed: 'yes', historicalUseReason: 5 }] },
    ],
    [
      'recipe, wrong',
      stepsSchema,
      {
        steps: [
          {
            operation: 'boil',
            temperatureC: 200,
            minutes: -1,
            ph: 15,
            ingredients: [{ kind: 'chemical', refId: 0, amount: Number.NaN, basis: 'owf' }],
          },
        ],
      },
    ],
    ['series, empty', seriesCreateSchema, {}],
    [
      'series, wrong',
      seriesCreateSchema,
      {
        code: 'x',
        title: '',
        factors: [{ name: '', levels: [] }],
        dryMassG: 0,
        deadVolumePct: 140,
        liquorRatio: 'high',
      },
    ],
    ['invitation, empty', inviteSchema, {}],
    ['invitation, wrong', inviteSchema, { email: 'someone', role: 'boss' }],
    ['shade, wrong', shadeQuerySchema, { hex: 'red', maxDeltaE: '99' }],
    ['new chemical, empty', chemicalCreateSchema, {}],
    [
      'new chemical, wrong',
      chemicalCreateSchema,
      {
        name: '',
        role: 'salt',
        status: 'banned',
        formula: 'CaSO4·x',
        metal: 'al',
        signalWord: 'Maybe',
        hazardBasis: 'rumour',
        hStatements: ['', 3],
      },
    ],
    ['new dyestuff, empty', dyestuffCreateSchema, {}],
    ['sign in, empty', loginSchema, {}],
    ['join, wrong', acceptInvitationSchema, { token: '', name: '', password: 'x' }],
    ['forgotten password, wrong', resetRequestSchema, { email: 'nobody' }],
    ['new password, short', resetPasswordSchema, { password: 'x' }],
    ['new piece, empty', pieceCreateSchema, {}],
    [
      'piece makers, marks and rights, wrong',
      pieceCreateSchema,
      {
        makers: [{ name: '', role: 'weaver', dates: '1850-02-30' }, {}],
        marks: [{ text: 5, kind: 'tag' }],
        objectRights: 'all rights reserved',
        imageRights: 7,
        storageLocation: ['x'],
      },
    ],
    ['saved search, empty', savedSearchCreateSchema, {}],
    ['saved search, wrong', savedSearchCreateSchema, { name: 4, query: 'hex=red&maxDeltaE=99' }],
    ['trial details, wrong', trialUpdateSchema, { dryMassG: 'heavy', gsm: 0, dryMassBasis: 'damp' }],
    [
      'fastness grades, wrong',
      trialUpdateSchema,
      {
        fastness: {
          light: { blueWool: '9' },
          washing: { change: '6' },
          rubbingDry: { staining: null },
          rubbingWet: { staining: '2', testedOn: 'May' },
        },
      },
    ],
    ['reading, empty', measurementSchema, { L: undefined, a: undefined, b: undefined }],
    [
      'reading, wrong',
      measurementSchema,
      {
        L: 'dark',
        a: 300,
        b: -300,
        illuminant: 'sun',
        geometry: 'flat',
        specular: 'both',
        instrument: 'x'.repeat(200),
      },
    ],
    ['substitution, empty', substitutionSchema, { reason: 'toxicity' }],
    [
      'substitution, wrong',
      substitutionSchema,
      { stepId: 0, historicalAmountG: -1, modernAmountG: -2, reason: 'fashion' },
    ],
    ['region, empty', regionCreateSchema, {}],
    [
      'region, wrong',
      regionCreateSchema,
      { x: -1, y: 'top', w: 0, h: 2.5, purpose: 'decoration', label: 'x'.repeat(200) },
    ],
    ['reference patch, empty', rectSchema, {}],
    ['trial list words, too long', trialListQuerySchema, { q: 'x'.repeat(101), status: 'done', mine: 'yes' }],
    [
      'archive filters, too long',
      pieceListQuery,
      { q: 'x'.repeat(121), status: 'lost', deleted: 'all', sort: 'colour', dir: 'up' },
    ],
  ];
  it.each(sweep)('%s: no raw validator text', (_, schema, value) => {
    const got = messages(schema, value);
    expect(Object.keys(got).length).toBeGreaterThan(0);
    for (const m of Object.values(got)) expect(m).not.toMatch(RAW);
  });

  it('says what is missing on a new chemical, and where a formula goes wrong', () => {
    expect(messages(chemicalCreateSchema, {})).toMatchObject({
      name: 'Enter the name',
      role: expect.stringMatching(/^Choose a role/),
      status: expect.stringMatching(/^Choose a status/),
      source: 'Enter where the data come from',
    });
    expect(messages(chemicalCreateSchema, { formula: 'CaSO4·x' }).formula).toBe(
      'Unexpected "x" at position 7. Write a formula such as KAl(SO4)2·12H2O or CaSO4·½H2O',
    );
  });

  it('says what is missing on a new bath, and takes the uptake as a percentage', () => {
    const empty = messages(batchCreateFormSchema, {});
    expect(empty).toMatchObject({
      code: 'Enter the code',
      name: 'Enter the name',
      volumeMl: 'Enter the volume in mL',
      madeOn: 'Enter the date it was made',
    });
    expect(messages(batchCreateFormSchema, { uptakePerUse: 150 }).uptakePerUse).toBe(
      'Give the uptake per use as a percentage from 0 to 100',
    );
    const ok = batchCreateFormSchema.parse({
      code: 'MB-1',
      kind: 'mordant-bath',
      name: 'alum',
      volumeMl: 100,
      madeOn: '2024-01-01',
      uptakePerUse: 12,
    });
    expect(ok.uptakePerUse).toBeCloseTo(0.12);
    // The API itself keeps the fraction, and says so in words.
    expect(messages(batchCreateSchema, { uptakePerUse: 12 }).uptakePerUse).toBe(
      'Give the uptake per use as a fraction from 0 to 1 (0.1 = 10 %)',
    );
  });

  it('names the fields of the converted forms: grades, readings, substitutions, regions and the list words', () => {
    expect(messages(trialUpdateSchema, { fastness: { light: { blueWool: '9' } } })['fastness.light.blueWool']).toBe(
      'Choose a blue wool grade from 1 to 8',
    );
    expect(messages(measurementSchema, {}).L).toBe('Enter L* as a number from 0 to 100');
    expect(messages(measurementSchema, { L: 50, a: 0, b: 0, geometry: 'flat' }).geometry).toMatch(
      /^Choose a measuring geometry/,
    );
    expect(messages(substitutionSchema, { reason: 'toxicity' }).historicalChemicalId).toBe(
      'Name the historical chemical or practice.',
    );
    expect(
      messages(substitutionSchema, {
        historicalPractice: 'x',
        modernPractice: 'y',
        historicalAmountG: 'lots',
        reason: 'toxicity',
      }).historicalAmountG,
    ).toBe('Enter the historical amount as a number in g');
    expect(messages(regionCreateSchema, { x: 0, y: 0, h: 5, purpose: 'motif' }).w).toBe('Enter width in pixels');
    expect(messages(trialListQuerySchema, { q: 'x'.repeat(101) }).q).toBe('Use at most 100 characters for the words');
    expect(messages(pieceListQuery, { q: 'x'.repeat(121) }).q).toBe('Use at most 120 characters for the words');
  });

  it('names each field of a new trial and a recipe step', () => {
    expect(messages(trialCreateSchema, {}).dryMassG).toBe('Enter the dry fibre mass in g');
    expect(messages(trialCreateSchema, { dryMassG: 'heavy' }).dryMassG).toBe(
      'Enter the dry fibre mass as a number in g',
    );
    const steps = messages(stepsSchema, {
      steps: [
        {
          operation: 'dye-bath',
          minutes: -1,
          ingredients: [{ kind: 'chemical', refId: 0, amount: Number.NaN, basis: 'owf' }],
        },
      ],
    });
    expect(steps).toMatchObject({
      'steps.0.minutes': 'The time must be 0 min or more',
      'steps.0.ingredients.0.refId': 'Choose an ingredient',
      'steps.0.ingredients.0.amount': 'Enter the amount',
    });
  });
});
