// The names of every action the policies decide; the client reads abilities, never rules.
export const ACTIONS = [
  'piece:read', 'piece:list-drafts', 'piece:create', 'piece:update', 'piece:publish', 'piece:delete', 'piece:restore', 'piece:history',
  'photo:create', 'photo:update', 'photo:delete', 'photo:see-gps', 'photo:master',
  'region:create', 'region:update', 'region:delete',
  'measurement:create', 'analysis:create', 'note:create',
  'trial:read', 'trial:create', 'trial:update', 'trial:delete',
  'batch:read', 'batch:create', 'batch:update', 'batch-event:create',
  'series:read', 'series:create', 'series:update',
  'search:run', 'export:run', 'import:run',
  'reference:read', 'reference:manage', 'team:manage', 'outbox:read', 'fixity:run',
] as const;
export type Action = (typeof ACTIONS)[number];
export type Abilities<A extends Action = Action> = Record<A, boolean>;
