import type { RouteGroup } from '../registry.ts';
import openapi from './openapi.ts';
import health from './health.ts';
import auth from './auth.ts';
import invitations from './invitations.ts';
import team from './team.ts';
import outbox from './outbox.ts';
import jobs from './jobs.ts';
import adminFixity from './admin-fixity.ts';
import importGroup from './import.ts';
import exportGroup from './export.ts';
import reference from './reference.ts';
import vocabularies from './vocabularies.ts';
import trials from './trials.ts';
import spectral from './spectral.ts';
import batches from './batches.ts';
import series from './series.ts';
import pieces from './pieces.ts';
import photos from './photos.ts';
import search from './search.ts';
import suggestions from './suggestions.ts';
import iiif from './iiif.ts';
import media from './media.ts';
import records from './records.ts';
import home from './home.ts';
import savedSearches from './saved-searches.ts';

// One import per route group, in the order of server/routes/index.ts (then /iiif and /media, mounted in server/app.ts).
export const groups: RouteGroup[] = [
  openapi,
  health,
  auth,
  invitations,
  team,
  outbox,
  jobs,
  adminFixity,
  importGroup,
  exportGroup,
  pieces,
  records,
  photos,
  reference,
  vocabularies,
  trials,
  spectral,
  batches,
  series,
  search,
  suggestions,
  home,
  savedSearches,
  iiif,
  media,
];
