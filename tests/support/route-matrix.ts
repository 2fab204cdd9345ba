import { hashPassword } from '../../server/auth/passwords.ts';
import { issueToken } from '../../server/auth/tokens.ts';
import { Chemical, ColourMeasurement, MordantBatch, Substitution, Trial, TrialSeries, User } from '../../server/models/index.ts';
import { makePiece } from '../../server/seed/factories.ts';
import type { Role } from '../../shared/roles.ts';

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
export type Fixture = { params?: Record<string, string | number>; body?: unknown; query?: Record<string, string> };

export type MatrixRow = {
  route: `${Method} /api/${string}`;
  expect: Partial<Record<ActorKey, Expected>>;
  /** Runs before each actor's request; makes the records and returns path params and body. */
  setup?: (ctx: SetupContext) => Promise<Fixture>;
  body?: unknown;
};

// Presets for the common shapes; spread and override where a row differs.
export const everyone = (e: Expected): Record<Who, Expected> => ({ visitor: e, admin: e, curator: e, researcher: e, dyer: e });
export const signedIn: Record<Who, Expected> = { ...everyone('2xx'), visitor: 401 };
export const adminOnly: Record<Who, Expected> = { visitor: 401, admin: '2xx', curator: 403, researcher: 403, dyer: 403 };

const row = (route: MatrixRow['route'], expect: MatrixRow['expect'], more: Omit<MatrixRow, 'route' | 'expect'> = {}): MatrixRow => ({ route, expect, ...more });

// Fixtures: unique records per call, so rows never depend on one another or on counts.
let seq = 0;
export const uniqueEmail = (what: string) => `${what}-${Date.now().toString(36)}-${(seq++).toString(36)}@matrix.test`;
export async function makeUser(role: Role = 'researcher') {
  return User.create({ email: uniqueEmail(role), name: `Matrix ${role}`, role, passwordHash: await hashPassword('matrix-password-1') });
}
const invitationToken = async () => (await issueToken({ purpose: 'invitation', email: uniqueEmail('invitee'), role: 'dyer' })).token;
async function resetToken() {
  const u = await makeUser();
  return (await issueToken({ purpose: 'password-reset', email: u.email, userId: u.id })).token;
}


// Trials: a fresh trial per request, owned by the actor for `:own` and by another dyer otherwise.
async function makeTrial(ctx: SetupContext) {
  const ownerId = ctx.ownership === 'own' && ctx.user ? ctx.user.id : (await makeUser('dyer')).id;
  return Trial.create({ code: `T-1900-${(seq++).toString().padStart(3, '0')}-${Date.now().toString(36)}`.slice(0, 16), pieceId: null, seriesId: null, cell: null, targetPaletteColourId: null, targetRegionId: null, targetMeasurementId: null, dyerId: ownerId, fibre: null, weave: null, gsm: null, dryMassG: 100, fastness: null, notes: null, startedOn: null });
}
const trialParams = async (ctx: SetupContext) => ({ params: { id: (await makeTrial(ctx)).id } });
const ownTrial: MatrixRow['expect'] = { visitor: 401, admin: '2xx', curator: 403, researcher: 403, 'dyer:own': '2xx', 'dyer:other': 403 };
const dyersCreate: MatrixRow['expect'] = { visitor: 401, admin: '2xx', curator: 403, researcher: 403, dyer: '2xx' };
const substitutionBody = { historicalPractice: 'lead-based red liquor', modernPractice: 'aluminium acetate from alum and calcium acetate', reason: 'toxicity' };
async function trialWithSubstitution(ctx: SetupContext) {
  const t = await makeTrial(ctx);
  const s = await Substitution.create({ trialId: t.id, stepId: null, historicalChemicalId: null, historicalPractice: 'x', historicalAmountG: null, modernChemicalId: null, modernPractice: 'y', modernAmountG: null, reason: 'waste', notes: null });
  return { params: { id: t.id, childId: s.id }, body: substitutionBody };
}
async function trialWithReading(ctx: SetupContext) {
  const t = await makeTrial(ctx);
  const m = await ColourMeasurement.create({ pieceId: null, regionId: null, trialId: t.id, instrument: null, geometry: null, specular: null, L: 50, a: 10, b: 10, label: null, takenOn: null, createdById: null });
  return { params: { id: t.id, childId: m.id } };
}

// Baths and series: owned by the actor for `:own`, by another dyer otherwise.
const shortCode = (p: string) => `${p}${Date.now().toString(36)}${(seq++).toString(36)}`.slice(0, 20);
// "Another dyer" is the seeded workshop lead, so these rows add no users to the shared database.
const otherDyerId = async () => (await User.findOne({ where: { email: 'tamsin.orrery@weldfold.test' }, rejectOnEmpty: true })).id;
const ownerFor = async (ctx: SetupContext) => (ctx.ownership === 'own' && ctx.user ? ctx.user.id : otherDyerId());
async function batchParams(ctx: SetupContext) {
  const b = await MordantBatch.create({ code: shortCode('MX-'), kind: 'mordant-bath', name: 'Matrix bath', ingredients: [], volumeMl: 1000, thickenerGPerL: null, ph: null, madeOn: '2024-05-01', madeById: await ownerFor(ctx), checkBy: null, parentId: null, notes: null });
  return { params: { id: b.id } };
}
async function seriesParams(ctx: SetupContext) {
  const s = await TrialSeries.create({ code: shortCode('SX-'), title: 'Matrix series', pieceId: null, factors: [{ name: 'tannin', levels: ['0', '10'] }], cells: [{ tannin: '0' }, { tannin: '10' }], participants: [], dryMassG: 10, ownerId: await ownerFor(ctx), heldOn: null, notes: null });
  return { params: { id: s.id } };
}
const ownRecord: MatrixRow['expect'] = { visitor: 401, admin: '2xx', curator: 403, researcher: 403, 'dyer:own': '2xx', 'dyer:other': 403 };
const batchBody = () => ({ code: shortCode('MN-'), kind: 'mordant-bath', name: 'Matrix new bath', volumeMl: 500, madeOn: '2024-05-01' });
const seriesBody = () => ({ code: shortCode('SN-'), title: 'Matrix new series', factors: [{ name: 'madder', levels: ['25', '50'] }], dryMassG: 10 });
const alumId = async () => (await Chemical.findOne({ where: { name: 'potash alum' }, rejectOnEmpty: true })).id;

export const routeMatrix: MatrixRow[] = [
  row('GET /api/health', everyone('2xx')),

  row('POST /api/auth/login', everyone('2xx'), { setup: async () => ({ body: { email: (await makeUser()).email, password: 'matrix-password-1' } }) }),
  row('POST /api/auth/logout', everyone('2xx')),
  row('GET /api/auth/me', signedIn),
  row('POST /api/auth/password-reset', everyone('2xx'), { setup: async () => ({ body: { email: uniqueEmail('forgot') } }) }),
  row('POST /api/auth/password-reset/:token', everyone('2xx'), { setup: async () => ({ params: { token: await resetToken() }, body: { password: 'a-new-matrix-password' } }) }),

  row('POST /api/invitations', adminOnly, { setup: async () => ({ body: { email: uniqueEmail('invite'), role: 'researcher' } }) }),
  row('GET /api/invitations/:token', everyone('2xx'), { setup: async () => ({ params: { token: await invitationToken() } }) }),
  row('POST /api/invitations/:token/accept', everyone('2xx'), { setup: async () => ({ params: { token: await invitationToken() }, body: { name: 'Matrix Newcomer', password: 'a-new-matrix-password' } }) }),

  row('GET /api/team', adminOnly),
  row('PATCH /api/team/:id', adminOnly, { setup: async () => ({ params: { id: (await makeUser('dyer')).id }, body: { role: 'researcher' } }) }),

  row('GET /api/outbox', adminOnly),

  row('GET /api/trials', signedIn),
  row('POST /api/trials', dyersCreate, { body: { dryMassG: 25 } }),
  row('GET /api/trials/:id', signedIn, { setup: trialParams }),
  row('PATCH /api/trials/:id', ownTrial, { setup: async (ctx) => ({ ...(await trialParams(ctx)), body: { notes: 'matrix' } }) }),
  row('DELETE /api/trials/:id', ownTrial, { setup: trialParams }),
  row('PUT /api/trials/:id/steps', ownTrial, {
    setup: async (ctx) => ({ ...(await trialParams(ctx)), body: { steps: [{ operation: 'mordant-bath', ingredients: [{ kind: 'chemical', refId: await alumId(), amount: 15, basis: 'owf' }], liquorRatio: 30 }] } }),
  }),
  row('POST /api/trials/:id/substitutions', ownTrial, { setup: async (ctx) => ({ ...(await trialParams(ctx)), body: substitutionBody }) }),
  row('PUT /api/trials/:id/substitutions/:childId', ownTrial, { setup: trialWithSubstitution }),
  row('DELETE /api/trials/:id/substitutions/:childId', ownTrial, { setup: trialWithSubstitution }),
  row('POST /api/trials/:id/measurements', ownTrial, { setup: async (ctx) => ({ ...(await trialParams(ctx)), body: { L: 45, a: 40, b: 22 } }) }),
  row('DELETE /api/trials/:id/measurements/:childId', ownTrial, { setup: trialWithReading }),
  row('POST /api/trials/:id/measurements/import', ownTrial, { setup: async (ctx) => ({ ...(await trialParams(ctx)), body: { csv: 'L,a,b\n45,40,22\n' } }) }),
  // No file is sent here, so those allowed get the 400 for a missing photo; the upload itself is tested in tests/api/trial-photos.test.ts.
  row('POST /api/trials/:id/photos', { ...ownTrial, admin: 400, 'dyer:own': 400 }, { setup: trialParams }),
  row('GET /api/pieces/:id/trials', signedIn, { setup: async () => ({ params: { id: (await makePiece()).id } }) }),
  row('POST /api/pieces/:id/trials', dyersCreate, { setup: async () => ({ params: { id: (await makePiece()).id }, body: { dryMassG: 40 } }) }),
  row('POST /api/colour/difference', everyone('2xx'), { body: { reference: { L: 45, a: 48, b: 28 }, sample: { L: 47, a: 44, b: 30 } } }),
  row('GET /api/colour/verdict-bands', everyone('2xx')),
  row('PUT /api/colour/verdict-bands', adminOnly, { body: { bands: { match: 1, close: 2, near: 4 }, source: 'common practice (the defaults, written back by the route matrix)' } }),
  row('GET /api/batches', signedIn),
  row('POST /api/batches', dyersCreate, { setup: async () => ({ body: batchBody() }) }),
  row('GET /api/batches/:id', signedIn, { setup: batchParams }),
  row('PATCH /api/batches/:id', ownRecord, { setup: async (ctx) => ({ ...(await batchParams(ctx)), body: { notes: 'matrix' } }) }),
  row('POST /api/batches/:id/events', dyersCreate, { setup: async (ctx) => ({ ...(await batchParams(ctx)), body: { type: 'use', volumeMl: 10 } }) }),
  row('GET /api/batches/:id/label.pdf', signedIn, { setup: batchParams }),
  row('GET /api/series', signedIn),
  row('POST /api/series/preview', signedIn, { body: { factors: [{ name: 'madder', levels: ['25', '50'] }] } }),
  row('POST /api/series', dyersCreate, { setup: async () => ({ body: seriesBody() }) }),
  row('GET /api/series/:id', signedIn, { setup: seriesParams }),
  row('PATCH /api/series/:id', ownRecord, { setup: async (ctx) => ({ ...(await seriesParams(ctx)), body: { keep: ['tannin=10'] } }) }),
  row('POST /api/series/:id/trials', ownRecord, { setup: seriesParams }),
  row('GET /api/series/:id/cards.pdf', signedIn, { setup: seriesParams }),
  row('GET /api/series/:id/labels.pdf', signedIn, { setup: seriesParams }),
  row('GET /api/trials/:id/card.pdf', signedIn, { setup: trialParams }),
];
