import type { MigrationFn } from 'umzug';
import type { MigrationContext } from '../migrator.ts';
import * as m0001 from './0001-initial.ts';
import * as m0002auth from './0002-auth-tokens.ts';
import * as m0008iiif from './0008-iiif-jobs.ts';
import * as m0009trials from './0009-trials-settings.ts';
import * as m0010baths from './0010-baths-series-liquor-ratio.ts';
import * as m0011photoColour from './0011-photo-colour.ts';
import * as m0013names from './0013-palette-names.ts';
import * as m0014draws from './0014-step-draws.ts';
import * as m0015accession from './0015-accession-keys.ts';
import * as m0016seriesTarget from './0016-series-target.ts';
import * as m0017hazards from './0017-hazard-provenance.ts';
import * as m0018thickeners from './0018-thickeners-stock-kind.ts';
import * as m0019trialChecks from './0019-trial-checks.ts';
import * as m0020photoTrialFk from './0020-photo-trial-fk.ts';
import * as m0021rateLimits from './0021-rate-limits.ts';
import * as m0022jobLease from './0022-job-lease.ts';
import * as m0023searchChanges from './0023-search-changes.ts';
import * as m0024importPreviews from './0024-import-previews.ts';
import * as m0025pieceListLoad from './0025-piece-list-load.ts';
import * as m0026spectrum from './0026-measurement-spectrum.ts';
import * as m0027photoChart from './0027-photo-chart.ts';
import * as m0028targetAim from './0028-trial-target-aim.ts';
import * as m0029fadingPairs from './0029-fading-pairs.ts';
import * as m0030records from './0030-analyses-condition-displays.ts';
import * as m0032pieceCuratorial from './0032-piece-curatorial.ts';
import * as m0033savedSearches from './0033-saved-searches.ts';
import * as m0034ingestStage from './0034-photo-ingest-stage.ts';

export type Migration = { name: string; up: MigrationFn<MigrationContext>; down: MigrationFn<MigrationContext> };

// Listed explicitly so bundlers and tsx see every migration; order is the name order.
export const migrations: Migration[] = [
  { name: '0001-initial', ...m0001 },
  { name: '0002-auth-tokens', ...m0002auth },
  { name: '0008-iiif-jobs', ...m0008iiif },
  { name: '0009-trials-settings', ...m0009trials },
  { name: '0010-baths-series-liquor-ratio', ...m0010baths },
  { name: '0011-photo-colour', ...m0011photoColour },
  { name: '0013-palette-names', ...m0013names },
  { name: '0014-step-draws', ...m0014draws },
  { name: '0015-accession-keys', ...m0015accession },
  { name: '0016-series-target', ...m0016seriesTarget },
  { name: '0017-hazard-provenance', ...m0017hazards },
  { name: '0018-thickeners-stock-kind', ...m0018thickeners },
  { name: '0019-trial-checks', ...m0019trialChecks },
  { name: '0020-photo-trial-fk', ...m0020photoTrialFk },
  { name: '0021-rate-limits', ...m0021rateLimits },
  { name: '0022-job-lease', ...m0022jobLease },
  { name: '0023-search-changes', ...m0023searchChanges },
  { name: '0024-import-previews', ...m0024importPreviews },
  { name: '0025-piece-list-load', ...m0025pieceListLoad },
  { name: '0026-measurement-spectrum', ...m0026spectrum },
  { name: '0027-photo-chart', ...m0027photoChart },
  { name: '0028-trial-target-aim', ...m0028targetAim },
  { name: '0029-fading-pairs', ...m0029fadingPairs },
  { name: '0030-analyses-condition-displays', ...m0030records },
  { name: '0032-piece-curatorial', ...m0032pieceCuratorial },
  { name: '0033-saved-searches', ...m0033savedSearches },
  { name: '0034-photo-ingest-stage', ...m0034ingestStage },
];
