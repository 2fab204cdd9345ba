import type { RouteGroup } from '../registry.ts';
import health from './health.ts';
import auth from './auth.ts';
import invitations from './invitations.ts';
import team from './team.ts';
import outbox from './outbox.ts';
import jobs from './jobs.ts';
import adminFixity from './admin-fixity.ts';
import importGroup from './import.ts';
import exportGroup from './export.ts';

// One import per route group, in the order of server/routes/index.ts.
export const groups: RouteGroup[] = [
  health,
  auth,
  invitations,
  team,
  outbox,
  jobs,
  adminFixity,
  importGroup,
  exportGroup,
];
