import sharp from 'sharp';
import type { Transaction } from 'sequelize';
import {
  Analysis,
  BatchEvent,
  ConditionReport,
  DisplayPeriod,
  ColourMeasurement,
  FadingPair,
  MordantBatch,
  PaletteColour,
  Piece,
  RecipeStep,
  Region,
  Substitution,
  Trial,
  TrialSeries,
  User,
  sequelize,
  SavedSearch,
} from '../models/index.ts';
import type { Role } from '../../shared/roles.ts';
import { hashPassword } from '../auth/passwords.ts';
import { ingestPhoto, type IngestInput } from '../media/pipeline.ts';
import { hexToLab } from '../../shared/colour/convert.ts';

// Shared by the demo seed and the tests, so both build records the same way. Every factory takes
// overrides for any column and the caller's transaction; the defaults make a valid, plain record.
let counter = 0;
const next = () => `${Date.now().toString(36)}${(counter++).toString(36)}`;

export async function makeUser(
  attrs: Partial<{ email: string; name: string; role: Role; password: string; active: boolean }> = {},
  transaction?: Transaction,
) {
  const n = next();
  return User.create(
    {
      email: attrs.email ?? `user-${n}@example.test`,
      name: attrs.name ?? `Test user ${n}`,
      role: attrs.role ?? 'researcher',
      passwordHash: await hashPassword(attrs.password ?? 'correct horse battery'),
      active: attrs.active ?? true,
    },
    { transaction },
  );
}

export type PieceInput = Partial<Omit<Piece['_creationAttributes'], 'id'>>;

export async function makePiece(attrs: PieceInput = {}, transaction?: Transaction) {
  const n = next();
  return Piece.create(
    {
      accessionNumber: `T.${n}`,
      objectName: 'fragment',
      title: `Test piece ${n}`,
      dateText: null,
      dateEdtf: null,
      earliestYear: null,
      latestYear: null,
      place: null,
      fibres: ['cotton'],
      weave: null,
      threadCount: null,
      heightMm: null,
      widthMm: null,
      repeatMm: null,
      techniques: [],
      dyestuffs: [],
      historicalMordants: [],
      description: null,
      provenance: null,
      condition: null,
      creditLine: null,
      status: 'draft',
      makers: [],
      patternName: null,
      marks: [],
      storageLocation: null,
      objectRights: null,
      imageRights: null,
      createdById: null,
      ...attrs,
    },
    { transaction },
  );
}

type Attrs<M extends { _creationAttributes: object }> = Partial<Omit<M['_creationAttributes'], 'id'>>;

/** A mordant bath (or paste, or stock): 1 L of 10 g potash alum by name only, made today. */
export function makeBatch(attrs: Attrs<MordantBatch> = {}, transaction?: Transaction) {
  const n = next();
  return MordantBatch.create(
    {
      code: `B-${n}`,
      kind: 'mordant-bath',
      name: `Test bath ${n}`,
      ingredients: [],
      volumeMl: 1000,
      thickenerGPerL: null,
      ph: null,
      madeOn: new Date().toISOString().slice(0, 10),
      madeById: null,
      checkBy: null,
      parentId: null,
      notes: null,
      ...attrs,
    },
    { transaction },
  );
}

/** One ledger event on a batch (a use without fibre unless told otherwise). */
export function makeBatchEvent(attrs: Attrs<BatchEvent> & { batchId: number }, transaction?: Transaction) {
  return BatchEvent.create(
    {
      type: 'use',
      occurredAt: new Date(),
      createdById: null,
      volumeMl: null,
      fibreMassG: null,
      trialId: null,
      additions: null,
      ph: null,
      result: null,
      route: null,
      ruleFollowed: null,
      notes: null,
      ...attrs,
    },
    { transaction },
  );
}

/** A planned modern trial of 10 g cotton, on no piece (codes outside the T-YYYY-NNN sequence so they never clash with it). */
export function makeTrial(attrs: Attrs<Trial> = {}, transaction?: Transaction) {
  const n = next();
  return Trial.create(
    {
      code: `F-${n}`.slice(0, 16),
      pieceId: null,
      seriesId: null,
      cell: null,
      targetPaletteColourId: null,
      targetRegionId: null,
      targetMeasurementId: null,
      dyerId: null,
      fibre: 'cotton',
      weave: null,
      gsm: null,
      dryMassG: 10,
      fastness: null,
      notes: null,
      startedOn: null,
      ...attrs,
    },
    { transaction },
  );
}

/** A recipe step: a dye bath with no ingredients, at position 1 unless told. */
export function makeRecipeStep(attrs: Attrs<RecipeStep> & { trialId: number }, transaction?: Transaction) {
  return RecipeStep.create(
    {
      position: 1,
      operation: 'dye-bath',
      ingredients: [],
      liquorRatio: null,
      temperatureC: null,
      minutes: null,
      ph: null,
      paste: null,
      batchId: null,
      batchVolumeMl: null,
      notes: null,
      ...attrs,
    },
    { transaction },
  );
}

/** A substitution on a trial, for toxicity, naming nothing unless told. */
export function makeSubstitution(attrs: Attrs<Substitution> & { trialId: number }, transaction?: Transaction) {
  return Substitution.create(
    {
      stepId: null,
      historicalChemicalId: null,
      historicalPractice: null,
      historicalAmountG: null,
      modernChemicalId: null,
      modernPractice: null,
      modernAmountG: null,
      reason: 'toxicity',
      notes: null,
      ...attrs,
    },
    { transaction },
  );
}

/** An instrument reading (D65/10° by the column defaults), attached to nothing unless told. */
export function makeMeasurement(attrs: Attrs<ColourMeasurement> = {}, transaction?: Transaction) {
  return ColourMeasurement.create(
    {
      pieceId: null,
      regionId: null,
      trialId: null,
      instrument: 'bench spectrophotometer',
      geometry: 'd:8°',
      specular: 'SCI',
      L: 50,
      a: 0,
      b: 0,
      label: null,
      takenOn: null,
      createdById: null,
      ...attrs,
    },
    { transaction },
  );
}

/** A trial series with one factor of one level and one cell. */
export function makeSeries(attrs: Attrs<TrialSeries> = {}, transaction?: Transaction) {
  const n = next();
  return TrialSeries.create(
    {
      code: `S-${n}`,
      title: `Test series ${n}`,
      pieceId: null,
      factors: [{ name: 'madder', levels: ['50'] }],
      cells: [{ madder: '50' }],
      participants: [],
      dryMassG: 10,
      ownerId: null,
      heldOn: null,
      notes: null,
      ...attrs,
    },
    { transaction },
  );
}

/**
 * A photo through the real media pipeline (master by SHA-256, derivatives, palette): a flat image of
 * one colour unless a buffer is given. Give a pieceId or a trialId. Answers the pipeline's { photo, palette }.
 */
export async function makePhoto(
  input: Partial<IngestInput> & { hex?: string; width?: number; height?: number } = {},
  transaction?: Transaction,
) {
  const { hex = '#8a3b2f', width = 240, height = 160, path: _path, ...rest } = input;
  const buffer =
    rest.buffer ??
    (await sharp({ create: { width, height, channels: 3, background: hex } })
      .png()
      .toBuffer());
  const run = (t: Transaction) => ingestPhoto({ actor: null, transaction: t, input: { ...rest, buffer } });
  return transaction ? run(transaction) : sequelize.transaction(run);
}

/** A fading pair of a piece (issue 17): a faded side and a protected side, each a region or a reading. */
export function makeFadingPair(attrs: Attrs<FadingPair> & { pieceId: number }, transaction?: Transaction) {
  return FadingPair.create(
    {
      label: null,
      fadedRegionId: null,
      fadedMeasurementId: null,
      protectedRegionId: null,
      protectedMeasurementId: null,
      createdById: null,
      ...attrs,
    },
    { transaction },
  );
}

/** A colour area on a photo (no palette re-extraction: the region row alone). */
export function makeRegion(attrs: Attrs<Region> & { photoId: number }, transaction?: Transaction) {
  return Region.create(
    { x: 0, y: 0, w: 10, h: 10, purpose: 'colour-area', label: null, createdById: null, ...attrs },
    { transaction },
  );
}

/** One palette colour row, its L*a*b* from its hex (shared/colour/convert.ts) unless given. */
export function makePaletteColour(attrs: Attrs<PaletteColour> & { photoId: number }, transaction?: Transaction) {
  const hex = attrs.hex ?? '#8a3b2f';
  return PaletteColour.create(
    {
      regionId: null,
      variant: 'raw',
      rank: 1,
      ...hexToLab(hex),
      hex,
      share: 1,
      spread: 0,
      name: 'red',
      tradeName: null,
      background: false,
      ...attrs,
    },
    { transaction },
  );
}

/** An analysis of a piece (HPLC-DAD, described site, no findings, no report unless given). */
export function makeAnalysis(attrs: Attrs<Analysis> & { pieceId: number }, transaction?: Transaction) {
  return Analysis.create(
    {
      method: 'HPLC-DAD',
      regionId: null,
      site: 'loose thread from the lower edge',
      laboratory: null,
      analyst: null,
      analysedOn: '2024-05-02',
      notes: null,
      findings: [],
      reportSha256: null,
      reportBytes: null,
      reportName: null,
      createdById: null,
      ...attrs,
    },
    { transaction },
  );
}

export function makeConditionReport(attrs: Attrs<ConditionReport> & { pieceId: number }, transaction?: Transaction) {
  return ConditionReport.create(
    {
      assessedOn: '2024-01-15',
      assessor: 'Test assessor',
      state: 'stable',
      notes: null,
      photoIds: [],
      regionIds: [],
      createdById: null,
      ...attrs,
    },
    { transaction },
  );
}

export function makeDisplayPeriod(attrs: Attrs<DisplayPeriod> & { pieceId: number }, transaction?: Transaction) {
  return DisplayPeriod.create(
    {
      fromDate: '2024-03-01',
      toDate: '2024-03-31',
      lux: 50,
      hoursPerDay: 8,
      uvMicrowattsPerLumen: null,
      place: null,
      createdById: null,
      ...attrs,
    },
    { transaction },
  );
}

/** A saved search of one person (words only unless told). */
export function makeSavedSearch(attrs: Attrs<SavedSearch> & { userId: number }, transaction?: Transaction) {
  const n = next();
  return SavedSearch.create({ name: `Saved search ${n}`, query: 'q=madder', ...attrs }, { transaction });
}
