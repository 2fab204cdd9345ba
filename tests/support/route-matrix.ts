import { hashPassword } from '../../server/auth/passwords.ts';
import { issueToken } from '../../server/auth/tokens.ts';
import { User } from '../../server/models/index.ts';
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
];
