import { hashPassword } from '../../server/auth/passwords.ts';
import { issueToken } from '../../server/auth/tokens.ts';
import sharp from 'sharp';
import * as factories from '../../server/seed/factories.ts';
import { makePiece } from '../../server/seed/factories.ts';
import { enqueue } from '../../server/jobs/queue.ts';
import { dryRunImport } from '../../server/import/preview-store.ts';
import { mkdtemp, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { Chemical, Dyestuff, Job, PaletteColour, Photo, SavedSearch, User } from '../../server/models/index.ts';
import { DEFAULT_BANDS_SOURCE } from '../../server/services/settings.ts';
import type { Role } from '../../shared/roles.ts';
import { DEFAULT_TOLERANCES } from '../../shared/compute/chart.ts';
import { CHART_1976 } from '../../shared/data/colour-chart-1976.ts';
import { chartPhoto } from './chart-image.ts';
import { recordRows } from './route-matrix-records.ts';

/**
 * The role × route matrix: one row per API route, with the status class each
 * actor must get. tests/api/route-matrix.test.ts walks every row with every actor
 * and fails when the Express app has an /api route without a row here.
 *
 * Adding a route = adding one line, e.g.
 *   row('GET /api/pieces/:id', { ...published }, { setup: ({ user }) => makePiece(...) }),
 */

export const WHO = ['visitor', 'admin', 'curator', 'researcher', 'dyer'] as const;
export type Who = (typeof WHO)[number];
export type Ownership = 'own' | 'other';
/** `dyer:own` / `dyer:other` where ownership matters (setup gets the ownership and makes the record accordingly). */
export type ActorKey = Who | `${Who}:${Ownership}`;
/** '2xx' for any success; otherwise the exact status. */
export type Expected = '2xx' | 400 | 401 | 403 | 404 | 409 | 410;
export type Method = 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';

export type SetupContext = { who: Who; ownership?: Ownership; user: { id: number; role: Role } | null };
export type Fixture = {
  params?: Record<string, string | number>;
  body?: unknown;
  query?: Record<string, string>;
  /** Multipart files (then `body` is ignored). */
  attach?: Array<{ field: string; buffer: Buffer; filename: string }>;
};

export type MatrixRow = {
  route: `${Method} /api/${string}`;
  expect: Partial<Record<ActorKey, Expected>>;
  /** Runs before each actor's request; makes the records and returns path params and body. */
  setup?: (ctx: SetupContext) => Promise<Fixture>;
  body?: unknown;
};

// Presets for the common shapes; spread and override where a row differs.
export const everyone = (e: Expected): Record<Who, Expected> => ({
  visitor: e,
  admin: e,
  curator: e,
  researcher: e,
  dyer: e,
});
export const signedIn: Record<Who, Expected> = { ...everyone('2xx'), visitor: 401 };
/** Readings of a piece: curators and researchers (and admins). */
const measurers: Record<Who, Expected> = { visitor: 401, admin: '2xx', curator: '2xx', researcher: '2xx', dyer: 403 };
export const adminOnly: Record<Who, Expected> = {
  visitor: 401,
  admin: '2xx',
  curator: 403,
  researcher: 403,
  dyer: 403,
};

const row = (
  route: MatrixRow['route'],
  expect: MatrixRow['expect'],
  more: Omit<MatrixRow, 'route' | 'expect'> = {},
): MatrixRow => ({ route, expect, ...more });

// Fixtures: unique records per call, so rows never depend on one another or on counts.
let seq = 0;
export const uniqueEmail = (what: string) => `${what}-${Date.now().toString(36)}-${(seq++).toString(36)}@matrix.test`;
export async function makeUser(role: Role = 'researcher') {
  return User.create({
    email: uniqueEmail(role),
    name: `Matrix ${role}`,
    role,
    passwordHash: await hashPassword('matrix-password-1'),
  });
}
const invitationToken = async () =>
  (await issueToken({ purpose: 'invitation', email: uniqueEmail('invitee'), role: 'dyer' })).token;
const pendingInvitationId = async () =>
  (await issueToken({ purpose: 'invitation', email: uniqueEmail('pending'), role: 'dyer' })).record.id;
async function resetToken() {
  const u = await makeUser();
  return (await issueToken({ purpose: 'password-reset', email: u.email, userId: u.id })).token;
}

/** The id of any seeded reference row (reference data is read-only in the matrix). */
const anyId = async (model: typeof Chemical | typeof Dyestuff) =>
  (await (model as typeof Chemical).findOne({ order: [['id', 'ASC']], rejectOnEmpty: true })).id;

const makeChemical = () =>
  Chemical.create({
    name: `matrix chemical ${uniqueEmail('c')}`,
    role: 'assistant',
    formula: 'CaCO3',
    metal: 'Ca',
    status: 'permitted',
    signalWord: null,
    hStatements: [],
    ppe: null,
    caution: null,
    source: 'matrix test',
    hazardSource: null,
  });

// A piece with a bare photo row: the job and export routes read rows, not files.
async function pieceWithPhoto(status: 'draft' | 'published' = 'published') {
  const piece = await makePiece({ status });
  const photo = await Photo.create({
    pieceId: piece.id,
    trialId: null,
    sha256: 'e'.repeat(64),
    format: 'jpeg',
    bytes: 1,
    width: 10,
    height: 10,
    originalName: null,
    caption: null,
    capturedAt: null,
    exif: {},
    gps: null,
    derivatives: {},
    referencePatch: null,
    correction: null,
    createdById: null,
  });
  return { piece, photo };
}
async function failedJob() {
  const { photo } = await pieceWithPhoto();
  const job = await enqueue({
    type: 'ingest-photo',
    payload: { photoId: photo.id },
    subject: { type: 'photo', id: photo.id },
  });
  await Job.update({ state: 'failed', error: 'matrix', attempts: 3 }, { where: { id: job.id } });
  return job;
}
/** A photo whose ingest failed (a bare row: the retry only queues its job again). */
async function failedIngest() {
  const { photo } = await pieceWithPhoto('draft');
  await failedJobFor(photo.id);
  await photo.update({ ingestStage: 'failed', ingestError: 'matrix' });
  return { params: { id: photo.id } };
}
async function failedJobFor(photoId: number) {
  const job = await enqueue({ type: 'ingest-photo', payload: { photoId }, subject: { type: 'photo', id: photoId } });
  await Job.update({ state: 'failed', error: 'matrix', attempts: 3 }, { where: { id: job.id } });
}
const importCsv = () =>
  Buffer.from(`accessionNumber,objectName,title\nMATRIX.${uniqueEmail('x').replace(/\W/g, '')},panel,Matrix import\n`);
/** A dry run made by the actor (its own preview); for a visitor or a role that may not import, by a new curator. */
async function importPreview(ctx: SetupContext) {
  const ownerId =
    ctx.user && ['curator', 'admin'].includes(ctx.user.role) ? ctx.user.id : (await makeUser('curator')).id;
  const dir = await mkdtemp(path.join(tmpdir(), 'matrix-import-'));
  try {
    const file = path.join(dir, 'pieces.csv');
    await writeFile(file, importCsv());
    return await dryRunImport({ actor: { id: ownerId }, input: { file, mapping: {} } });
  } finally {
    await rm(dir, { recursive: true, force: true });
  }
}
const exporter: Record<Who, Expected> = { visitor: 401, admin: '2xx', curator: '2xx', researcher: '2xx', dyer: 403 };

// Trials: a fresh trial per request, owned by the actor for `:own` and by another dyer otherwise.
async function makeTrial(ctx: SetupContext) {
  const ownerId = ctx.ownership === 'own' && ctx.user ? ctx.user.id : (await makeUser('dyer')).id;
  return factories.makeTrial({ dyerId: ownerId, fibre: null, dryMassG: 100 });
}
const trialParams = async (ctx: SetupContext) => ({ params: { id: (await makeTrial(ctx)).id } });
const ownTrial: MatrixRow['expect'] = {
  visitor: 401,
  admin: '2xx',
  curator: 403,
  researcher: 403,
  'dyer:own': '2xx',
  'dyer:other': 403,
};
const dyersCreate: MatrixRow['expect'] = { visitor: 401, admin: '2xx', curator: 403, researcher: 403, dyer: '2xx' };
const substitutionBody = {
  historicalPractice: 'lead-based red liquor',
  modernPractice: 'aluminium acetate from alum and calcium acetate',
  reason: 'toxicity',
};
async function trialWithSubstitution(ctx: SetupContext) {
  const t = await makeTrial(ctx);
  const s = await factories.makeSubstitution({
    trialId: t.id,
    historicalPractice: 'x',
    modernPractice: 'y',
    reason: 'waste',
  });
  return { params: { id: t.id, childId: s.id }, body: substitutionBody };
}
async function trialWithReading(ctx: SetupContext) {
  const t = await makeTrial(ctx);
  const m = await factories.makeMeasurement({
    trialId: t.id,
    instrument: null,
    geometry: null,
    specular: null,
    L: 50,
    a: 10,
    b: 10,
  });
  return { params: { id: t.id, childId: m.id } };
}

// Baths and series: owned by the actor for `:own`, by another dyer otherwise.
const shortCode = (p: string) => `${p}${Date.now().toString(36)}${(seq++).toString(36)}`.slice(0, 20);
// "Another dyer" is the seeded workshop lead, so these rows add no users to the shared database.
const otherDyerId = async () =>
  (await User.findOne({ where: { email: 'tamsin.orrery@weldfold.test' }, rejectOnEmpty: true })).id;
const ownerFor = async (ctx: SetupContext) => (ctx.ownership === 'own' && ctx.user ? ctx.user.id : otherDyerId());
async function batchParams(ctx: SetupContext) {
  const b = await factories.makeBatch({
    code: shortCode('MX-'),
    name: 'Matrix bath',
    madeOn: '2024-05-01',
    madeById: await ownerFor(ctx),
  });
  return { params: { id: b.id } };
}
async function seriesParams(ctx: SetupContext) {
  const s = await factories.makeSeries({
    code: shortCode('SX-'),
    title: 'Matrix series',
    factors: [{ name: 'tannin', levels: ['0', '10'] }],
    cells: [{ tannin: '0' }, { tannin: '10' }],
    ownerId: await ownerFor(ctx),
  });
  return { params: { id: s.id } };
}
// Saved searches: the actor's own for `:own`, another person's otherwise (a private bookmark: 404 to everyone else).
async function savedSearchParams(ctx: SetupContext) {
  const userId = ctx.ownership === 'own' && ctx.user ? ctx.user.id : await otherDyerId();
  const s = await SavedSearch.create({ userId, name: `matrix ${uniqueEmail('s')}`, query: 'q=madder' });
  return { params: { id: s.id } };
}
const ownSearch: MatrixRow['expect'] = {
  visitor: 401,
  'admin:own': '2xx',
  'admin:other': 404,
  'curator:own': '2xx',
  'curator:other': 404,
  'researcher:own': '2xx',
  'researcher:other': 404,
  'dyer:own': '2xx',
  'dyer:other': 404,
};
const ownRecord: MatrixRow['expect'] = {
  visitor: 401,
  admin: '2xx',
  curator: 403,
  researcher: 403,
  'dyer:own': '2xx',
  'dyer:other': 403,
};
const batchBody = () => ({
  code: shortCode('MN-'),
  kind: 'mordant-bath',
  name: 'Matrix new bath',
  volumeMl: 500,
  madeOn: '2024-05-01',
});
const seriesBody = () => ({
  code: shortCode('SN-'),
  title: 'Matrix new series',
  factors: [{ name: 'madder', levels: ['25', '50'] }],
  dryMassG: 10,
});
const alumId = async () => (await Chemical.findOne({ where: { name: 'potash alum' }, rejectOnEmpty: true })).id;

// Catalogue: unique accession numbers in the pattern the schema accepts, and real photos through the pipeline.
const accession = () => `2098.${Date.now() % 1_000_000}.${seq++}`;
const pieceBody = () => ({
  accessionNumber: accession(),
  objectName: 'fragment',
  title: 'Matrix piece',
  fibres: ['cotton'],
  techniques: [],
  dyestuffs: [],
  historicalMordants: [],
});
const draftPiece = async () => ({ params: { id: (await makePiece({ status: 'draft' })).id } });
const deletedPiece = async () => {
  const piece = await makePiece({ status: 'draft' });
  await piece.destroy();
  return { params: { id: piece.id } };
};
async function realPhoto() {
  const piece = await makePiece({ status: 'draft' });
  const buffer = await sharp({ create: { width: 96, height: 64, channels: 3, background: '#9b2f2f' } })
    .jpeg()
    .toBuffer();
  return (await factories.makePhoto({ pieceId: piece.id, buffer })).photo;
}
const photoParams = async () => ({ params: { id: (await realPhoto()).id } });
async function fadingPairBody() {
  const piece = await makePiece({ status: 'draft' });
  const [a, b] = await Promise.all(
    [10, 20].map((L) => factories.makeMeasurement({ pieceId: piece.id, L, a: 5, b: 5 })),
  );
  return {
    params: { id: piece.id },
    body: { faded: { measurementId: a.id }, protected: { measurementId: b.id } },
  };
}
async function fadingPairParams() {
  const { params, body } = await fadingPairBody();
  const pair = await factories.makeFadingPair({
    pieceId: params.id,
    fadedMeasurementId: body.faded.measurementId,
    protectedMeasurementId: body.protected.measurementId,
  });
  return { params: { id: params.id, pairId: pair.id } };
}
let chartBuffer: Promise<{ buffer: Buffer; corners: Array<{ x: number; y: number }> }> | null = null;
async function chartPhotoBody() {
  chartBuffer ??= chartPhoto(CHART_1976.map((p) => p.lab)).then(({ buffer, scene }) => ({
    buffer,
    corners: scene.corners,
  }));
  const { buffer, corners } = await chartBuffer;
  const piece = await makePiece({ status: 'draft' });
  const { photo } = await factories.makePhoto({ pieceId: piece.id, buffer });
  return { params: { id: photo.id }, body: { corners, reference: 'published-1976' } };
}
async function photoWithRegion() {
  const photo = await realPhoto();
  const region = await factories.makeRegion({ photoId: photo.id, w: 20, h: 20 });
  return { params: { id: photo.id, regionId: region.id } };
}
async function photoWithColour() {
  const photo = await realPhoto();
  const colour = await PaletteColour.findOne({ where: { photoId: photo.id }, rejectOnEmpty: true });
  return { params: { id: photo.id, colourId: colour.id }, body: { background: true } };
}
const curatorWrites: Record<Who, Expected> = { visitor: 401, admin: '2xx', curator: '2xx', researcher: 403, dyer: 403 };
const jpeg = async () =>
  sharp({ create: { width: 64, height: 48, channels: 3, background: '#4a3350' } })
    .jpeg()
    .toBuffer();

export const routeMatrix: MatrixRow[] = [
  row('GET /api/health', everyone('2xx')),
  row('GET /api/openapi.json', everyone('2xx')),

  row('POST /api/auth/login', everyone('2xx'), {
    setup: async () => ({ body: { email: (await makeUser()).email, password: 'matrix-password-1' } }),
  }),
  row('POST /api/auth/logout', everyone('2xx')),
  row('GET /api/auth/me', signedIn),
  row('POST /api/auth/password-reset', everyone('2xx'), {
    setup: async () => ({ body: { email: uniqueEmail('forgot') } }),
  }),
  row('GET /api/auth/password-reset/:token', everyone('2xx'), {
    setup: async () => ({ params: { token: await resetToken() } }),
  }),
  row('POST /api/auth/password-reset/:token', everyone('2xx'), {
    setup: async () => ({ params: { token: await resetToken() }, body: { password: 'a-new-matrix-password' } }),
  }),

  row('POST /api/invitations', adminOnly, {
    setup: async () => ({ body: { email: uniqueEmail('invite'), role: 'researcher' } }),
  }),
  row('GET /api/invitations/:token', everyone('2xx'), {
    setup: async () => ({ params: { token: await invitationToken() } }),
  }),
  row('POST /api/invitations/:token/accept', everyone('2xx'), {
    setup: async () => ({
      params: { token: await invitationToken() },
      body: { name: 'Matrix Newcomer', password: 'a-new-matrix-password' },
    }),
  }),

  row('GET /api/team', adminOnly),
  row('GET /api/team/invitations', adminOnly),
  row('POST /api/team/invitations/:id/resend', adminOnly, {
    setup: async () => ({ params: { id: await pendingInvitationId() } }),
  }),
  row('DELETE /api/team/invitations/:id', adminOnly, {
    setup: async () => ({ params: { id: await pendingInvitationId() } }),
  }),
  row('PATCH /api/team/:id', adminOnly, {
    setup: async () => ({ params: { id: (await makeUser('dyer')).id }, body: { role: 'researcher' } }),
  }),

  row('GET /api/outbox', adminOnly),

  row('GET /api/chemicals', everyone('2xx')),
  row('GET /api/chemicals/:id', everyone('2xx'), { setup: async () => ({ params: { id: await anyId(Chemical) } }) }),
  row('PATCH /api/chemicals/:id', adminOnly, {
    setup: async () => ({ params: { id: (await makeChemical()).id }, body: { ppe: 'goggles and gloves' } }),
  }),
  row('POST /api/chemicals', adminOnly, {
    setup: async () => ({
      body: {
        name: `matrix chemical ${uniqueEmail('n')}`,
        role: 'assistant',
        status: 'permitted',
        formula: 'CaSO4·½H2O',
        source: 'matrix test',
      },
    }),
  }),
  row('GET /api/dyestuffs', everyone('2xx')),
  row('POST /api/dyestuffs', adminOnly, {
    setup: async () => ({ body: { name: `matrix dyestuff ${uniqueEmail('d')}`, source: 'matrix test' } }),
  }),
  row('GET /api/dyestuffs/:id', everyone('2xx'), { setup: async () => ({ params: { id: await anyId(Dyestuff) } }) }),

  row('GET /api/jobs', adminOnly),
  row('GET /api/jobs/:id', signedIn, { setup: async () => ({ params: { id: (await failedJob()).id } }) }),
  row(
    'POST /api/jobs/:id/retry',
    { visitor: 401, admin: '2xx', curator: '2xx', researcher: 403, dyer: 403 },
    { setup: async () => ({ params: { id: (await failedJob()).id } }) },
  ),
  row('POST /api/admin/fixity', adminOnly),
  row('GET /api/admin/fixity/latest', adminOnly),
  row(
    'POST /api/import/pieces',
    { visitor: 401, admin: '2xx', curator: '2xx', researcher: 403, dyer: 403 },
    {
      setup: async () => ({
        query: { dryRun: 'true' },
        attach: [{ field: 'file', buffer: importCsv(), filename: 'pieces.csv' }],
      }),
    },
  ),
  row(
    'GET /api/import/previews/:id/rows',
    { visitor: 401, admin: '2xx', curator: '2xx', researcher: 403, dyer: 403 },
    {
      setup: async (ctx) => ({ params: { id: (await importPreview(ctx)).id }, query: { only: 'invalid' } }),
    },
  ),
  row(
    'GET /api/import/previews/:id/errors',
    { visitor: 401, admin: '2xx', curator: '2xx', researcher: 403, dyer: 403 },
    { setup: async (ctx) => ({ params: { id: (await importPreview(ctx)).id } }) },
  ),
  row('GET /api/export/pieces.csv', exporter),
  row('GET /api/export/trials.csv', signedIn),
  row('GET /api/export/palettes.csv', everyone('2xx')),
  row('GET /api/export/shade.csv', everyone('2xx'), {
    setup: async () => ({ query: { hex: '9b2f2f', maxDeltaE: '5' } }),
  }),
  row(
    'GET /api/pieces/:id/palettes.csv',
    { ...everyone('2xx'), visitor: 404 },
    { setup: async () => ({ params: { id: (await pieceWithPhoto('draft')).piece.id } }) },
  ),
  row('GET /api/pieces/:id/dublin-core.jsonld', exporter, {
    setup: async () => ({ params: { id: (await pieceWithPhoto()).piece.id } }),
  }),
  row('GET /api/pieces/:id/masters.zip', exporter, {
    setup: async () => ({ params: { id: (await makePiece({ status: 'published' })).id } }),
  }),
  row('GET /api/trials', signedIn),
  row('POST /api/trials', dyersCreate, { body: { dryMassG: 25 } }),
  row('GET /api/trials/:id', signedIn, { setup: trialParams }),
  row('PATCH /api/trials/:id', ownTrial, {
    setup: async (ctx) => ({ ...(await trialParams(ctx)), body: { notes: 'matrix' } }),
  }),
  row('DELETE /api/trials/:id', ownTrial, { setup: trialParams }),
  row('PUT /api/trials/:id/steps', ownTrial, {
    setup: async (ctx) => ({
      ...(await trialParams(ctx)),
      body: {
        steps: [
          {
            operation: 'mordant-bath',
            ingredients: [{ kind: 'chemical', refId: await alumId(), amount: 15, basis: 'owf' }],
            liquorRatio: 30,
          },
        ],
      },
    }),
  }),
  row('POST /api/trials/:id/substitutions', ownTrial, {
    setup: async (ctx) => ({ ...(await trialParams(ctx)), body: substitutionBody }),
  }),
  row('PUT /api/trials/:id/substitutions/:childId', ownTrial, { setup: trialWithSubstitution }),
  row('DELETE /api/trials/:id/substitutions/:childId', ownTrial, { setup: trialWithSubstitution }),
  row('POST /api/trials/:id/measurements', ownTrial, {
    setup: async (ctx) => ({ ...(await trialParams(ctx)), body: { L: 45, a: 40, b: 22 } }),
  }),
  row('DELETE /api/trials/:id/measurements/:childId', ownTrial, { setup: trialWithReading }),
  row('POST /api/trials/:id/measurements/import', ownTrial, {
    setup: async (ctx) => ({ ...(await trialParams(ctx)), body: { csv: 'L,a,b\n45,40,22\n' } }),
  }),
  // No file is sent here, so those allowed get the 400 for a missing photo; the upload itself is tested in tests/api/trial-photos.test.ts.
  row('POST /api/trials/:id/photos', { ...ownTrial, admin: 400, 'dyer:own': 400 }, { setup: trialParams }),
  row('GET /api/pieces/:id/trials', signedIn, { setup: async () => ({ params: { id: (await makePiece()).id } }) }),
  row('POST /api/pieces/:id/trials', dyersCreate, {
    setup: async () => ({ params: { id: (await makePiece()).id }, body: { dryMassG: 40 } }),
  }),
  row('GET /api/suggestions/recipes', signedIn, { setup: async () => ({ query: { L: '45', a: '40', b: '22' } }) }),
  row('POST /api/suggestions/recipes/trials', dyersCreate, {
    setup: async () => ({
      body: {
        dryMassG: 20,
        steps: [
          {
            operation: 'dye-bath',
            ingredients: [{ kind: 'dyestuff', refId: await anyId(Dyestuff), amount: 10, basis: 'owf' }],
          },
        ],
        evidence: 'matrix: a ladder of madder on alum',
      },
    }),
  }),
  row('POST /api/pieces/:id/measurements', measurers, {
    setup: async () => ({ params: { id: (await makePiece()).id }, body: { L: 45, a: 40, b: 22, label: 'matrix' } }),
  }),
  row('DELETE /api/pieces/:id/measurements/:childId', measurers, {
    setup: async () => {
      const piece = await makePiece();
      const m = await factories.makeMeasurement({ pieceId: piece.id, L: 45, a: 40, b: 22 });
      return { params: { id: piece.id, childId: m.id } };
    },
  }),
  row('POST /api/colour/difference', everyone('2xx'), {
    body: { reference: { L: 45, a: 48, b: 28 }, sample: { L: 47, a: 44, b: 30 } },
  }),
  row('GET /api/colour/verdict-bands', everyone('2xx')),
  row('POST /api/colour/spectrum', everyone('2xx'), {
    body: { spectrum: { startNm: 400, intervalNm: 20, values: Array(16).fill(0.5) }, illuminant: 'A', observer: '10' },
  }),
  row('POST /api/colour/metamerism', everyone('2xx'), {
    body: {
      reference: { startNm: 400, intervalNm: 20, values: Array(16).fill(0.5) },
      sample: { startNm: 400, intervalNm: 20, values: Array(16).fill(0.4) },
    },
  }),
  row('POST /api/colour/grey-scale', everyone('2xx'), {
    body: { reference: { L: 45, a: 48, b: 28 }, sample: { L: 47, a: 44, b: 30 } },
  }),
  row('PUT /api/colour/verdict-bands', adminOnly, {
    body: { bands: { match: 1, close: 2, near: 4 }, source: DEFAULT_BANDS_SOURCE },
  }),

  row('GET /api/pieces', everyone('2xx')),
  row('POST /api/pieces', curatorWrites, { setup: async () => ({ body: pieceBody() }) }),
  row('GET /api/pieces/:id', { ...signedIn, visitor: 404 }, { setup: draftPiece }),
  row('PATCH /api/pieces/:id', curatorWrites, {
    setup: async () => ({ ...(await draftPiece()), body: { title: 'Matrix piece, renamed' } }),
  }),
  row('DELETE /api/pieces/:id', curatorWrites, { setup: draftPiece }),
  row(
    'POST /api/pieces/:id/restore',
    { visitor: 401, admin: '2xx', curator: 403, researcher: 404, dyer: 404 },
    { setup: deletedPiece },
  ),
  row(
    'GET /api/pieces/:id/history',
    { visitor: 401, admin: '2xx', curator: '2xx', researcher: '2xx', dyer: 403 },
    { setup: draftPiece },
  ),
  row('POST /api/pieces/:id/photos', curatorWrites, {
    setup: async () => ({
      ...(await draftPiece()),
      attach: [{ field: 'photo', buffer: await jpeg(), filename: 'matrix.jpg' }],
    }),
  }),
  row('GET /api/photos/:id', signedIn, { setup: photoParams }),
  row('PATCH /api/photos/:id', curatorWrites, {
    setup: async () => ({ ...(await photoParams()), body: { caption: 'matrix' } }),
  }),
  row('DELETE /api/photos/:id', curatorWrites, { setup: photoParams }),
  row('POST /api/photos/:id/ingest/retry', curatorWrites, { setup: failedIngest }),
  row('GET /api/photos/:id/regions', signedIn, { setup: photoParams }),
  row('POST /api/photos/:id/regions', curatorWrites, {
    setup: async () => ({ ...(await photoParams()), body: { x: 2, y: 2, w: 20, h: 20, purpose: 'colour-area' } }),
  }),
  row('PATCH /api/photos/:id/regions/:regionId', curatorWrites, {
    setup: async () => ({ ...(await photoWithRegion()), body: { label: 'matrix' } }),
  }),
  row('DELETE /api/photos/:id/regions/:regionId', curatorWrites, { setup: photoWithRegion }),
  row('PUT /api/photos/:id/reference-patch', curatorWrites, {
    setup: async () => ({ ...(await photoParams()), body: { x: 0, y: 0, w: 10, h: 10 } }),
  }),
  row('DELETE /api/photos/:id/reference-patch', curatorWrites, { setup: photoParams }),
  row('PATCH /api/photos/:id/palette/:colourId', curatorWrites, { setup: photoWithColour }),
  row('GET /api/pieces/:id/fading-pairs', signedIn, {
    setup: async () => ({ params: { id: (await makePiece()).id } }),
  }),
  row('POST /api/pieces/:id/fading-pairs', curatorWrites, { setup: fadingPairBody }),
  row('DELETE /api/pieces/:id/fading-pairs/:pairId', curatorWrites, { setup: fadingPairParams }),
  row('PUT /api/photos/:id/chart', curatorWrites, { setup: chartPhotoBody }),
  row('DELETE /api/photos/:id/chart', curatorWrites, { setup: photoParams }),
  row('GET /api/photos/chart-tolerances', signedIn),
  row('PUT /api/photos/chart-tolerances', adminOnly, {
    body: DEFAULT_TOLERANCES,
  }),
  row('GET /api/vocabularies', everyone('2xx')),
  row('GET /api/batches', signedIn),
  row('POST /api/batches', dyersCreate, { setup: async () => ({ body: batchBody() }) }),
  row('GET /api/batches/:id', signedIn, { setup: batchParams }),
  row('PATCH /api/batches/:id', ownRecord, {
    setup: async (ctx) => ({ ...(await batchParams(ctx)), body: { notes: 'matrix' } }),
  }),
  row('POST /api/batches/:id/events', dyersCreate, {
    setup: async (ctx) => ({ ...(await batchParams(ctx)), body: { type: 'use', volumeMl: 10 } }),
  }),
  row('GET /api/batches/:id/label.pdf', signedIn, { setup: batchParams }),
  row('GET /api/series', signedIn),
  row('POST /api/series/preview', signedIn, { body: { factors: [{ name: 'madder', levels: ['25', '50'] }] } }),
  row('POST /api/series', dyersCreate, { setup: async () => ({ body: seriesBody() }) }),
  row('GET /api/series/:id', signedIn, { setup: seriesParams }),
  row('PATCH /api/series/:id', ownRecord, {
    setup: async (ctx) => ({ ...(await seriesParams(ctx)), body: { keep: ['tannin=10'] } }),
  }),
  row('POST /api/series/:id/trials', ownRecord, { setup: seriesParams }),
  row('GET /api/series/:id/cards.pdf', signedIn, { setup: seriesParams }),
  row('GET /api/series/:id/labels.pdf', signedIn, { setup: seriesParams }),
  row('GET /api/trials/:id/card.pdf', signedIn, { setup: trialParams }),

  row('GET /api/search', everyone('2xx'), { setup: async () => ({ query: { q: 'madder' } }) }),
  row('GET /api/search/shade', everyone('2xx'), { setup: async () => ({ query: { hex: '9b2f2f', maxDeltaE: '5' } }) }),
  ...recordRows,

  row('GET /api/home', signedIn),
  row('GET /api/saved-searches', signedIn),
  row('POST /api/saved-searches', signedIn, {
    setup: async () => ({ body: { name: `matrix ${uniqueEmail('s')}`, query: 'q=madder&fibre=cotton' } }),
  }),
  row('DELETE /api/saved-searches/:id', ownSearch, { setup: savedSearchParams }),
];
