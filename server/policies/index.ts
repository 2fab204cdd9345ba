import type { Role } from '../../shared/roles.ts';
import type { Action, Abilities } from '../../shared/abilities.ts';

/** Who is asking: a signed-in user, or null for a signed-out visitor. */
export type Actor = { id: number; role: Role } | null;

/** The facts a rule needs about a record; omitted for actions on a collection. */
export type PolicyRecord = {
  status?: 'draft' | 'published';
  ownerId?: number | null;
  deleted?: boolean;
  /** A photo whose master still carries GPS tags. */
  hasGps?: boolean;
};

const everyoneSignedIn = (a: Actor) => a !== null;
const roleIn =
  (...roles: Role[]) =>
  (a: Actor) =>
    a !== null && roles.includes(a.role);
const owns = (a: Actor, r?: PolicyRecord) => a !== null && r?.ownerId != null && r.ownerId === a.id;

type Rule = (actor: Actor, record?: PolicyRecord) => boolean;

/**
 * The single table of rights. Admin may do everything; the other roles as the
 * product brief sets out. Reading a record a user may not read answers 404.
 */
const rules: Record<Action, Rule> = {
  'piece:read': (a, r) => (r?.deleted ? roleIn('curator')(a) : r?.status === 'published' || everyoneSignedIn(a)),
  'piece:list-drafts': everyoneSignedIn,
  'piece:create': roleIn('curator'),
  'piece:update': roleIn('curator'),
  'piece:publish': roleIn('curator'),
  'piece:delete': roleIn('curator'),
  'piece:restore': () => false,
  'piece:history': roleIn('curator', 'researcher'),
  // Where a piece is kept is for the team only: never in a visitor's answer, IIIF or the public Dublin Core record.
  'piece:see-storage': everyoneSignedIn,
  'photo:create': roleIn('curator'),
  'photo:update': roleIn('curator'),
  'photo:delete': roleIn('curator'),
  'photo:see-gps': roleIn('curator'),
  // The master is the archive's untouched file (EXIF and GPS included); visitors get the display image and tiles.
  'photo:master': (a, r) => everyoneSignedIn(a) && (!r?.hasGps || roleIn('curator')(a)),
  'region:create': roleIn('curator'),
  'region:update': roleIn('curator'),
  'region:delete': roleIn('curator'),
  'measurement:create': roleIn('researcher', 'curator'),
  // Researchers and curators record analyses; anyone who may read the piece reads them (visitors: published only).
  'analysis:create': roleIn('researcher', 'curator'),
  'analysis:update': roleIn('researcher', 'curator'),
  // The lab's report PDF is for the team, not the public.
  'analysis:report': everyoneSignedIn,
  'condition:read': everyoneSignedIn,
  'condition:create': roleIn('curator'),
  'display:read': everyoneSignedIn,
  'display:create': roleIn('curator'),
  'note:create': roleIn('researcher', 'curator'),
  'trial:read': everyoneSignedIn,
  'trial:create': roleIn('dyer'),
  'trial:update': (a, r) => roleIn('dyer')(a) && owns(a, r),
  'trial:delete': (a, r) => roleIn('dyer')(a) && owns(a, r),
  'batch:read': everyoneSignedIn,
  'batch:create': roleIn('dyer'),
  'batch:update': (a, r) => roleIn('dyer')(a) && owns(a, r),
  'batch-event:create': roleIn('dyer'),
  'series:read': everyoneSignedIn,
  'series:create': roleIn('dyer'),
  'series:update': (a, r) => roleIn('dyer')(a) && owns(a, r),
  'search:run': () => true,
  'export:run': roleIn('researcher', 'curator'),
  'import:run': roleIn('curator'),
  'reference:read': () => true,
  'reference:manage': () => false,
  'team:manage': () => false,
  'outbox:read': () => false,
  'fixity:run': () => false,
};

export function can(actor: Actor, action: Action, record?: PolicyRecord): boolean {
  if (actor?.role === 'admin') return true;
  return rules[action](actor, record);
}

/** The abilities sent with a record so the client shows only what is allowed. */
export function abilities<A extends Action>(actor: Actor, actions: readonly A[], record?: PolicyRecord): Abilities<A> {
  return Object.fromEntries(actions.map((x) => [x, can(actor, x, record)])) as Abilities<A>;
}
