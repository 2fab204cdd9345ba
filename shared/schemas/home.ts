import { z } from 'zod';
import '../messages.ts';
import { ROLES } from '../roles.ts';
import { savedSearchSchema } from './saved-search.ts';

// GET /api/home: the signed-in person's landing page, one answer per role (server/routes/home). Each section says how
// many there are in all (`total`) and lists the first few, newest or most urgent first; the client links each row
// to its page through client/paths.ts.

const section = <T extends z.ZodType>(item: T) => z.object({ total: z.number().int().min(0), items: z.array(item) });

export const homePieceSchema = z.object({
  id: z.number(),
  accessionNumber: z.string(),
  title: z.string(),
  updatedAt: z.iso.datetime(),
});
export const homePhotoSchema = z.object({
  id: z.number(),
  pieceId: z.number(),
  accessionNumber: z.string(),
  title: z.string(),
  view: z.string(),
  thumbUrl: z.string(),
});
export const homeTrialSchema = z.object({
  id: z.number(),
  code: z.string(),
  status: z.string(),
  startedOn: z.string().nullable(),
  pieceId: z.number().nullable(),
  accessionNumber: z.string().nullable(),
  updatedAt: z.iso.datetime(),
});
export const homeBathSchema = z.object({
  id: z.number(),
  code: z.string(),
  name: z.string(),
  kind: z.string(),
  checkBy: z.string(),
  mine: z.boolean(),
});
export const homeSeriesSchema = z.object({
  id: z.number(),
  code: z.string(),
  title: z.string(),
  cells: z.number().int(),
  planned: z.number().int(),
  inProgress: z.number().int(),
  finished: z.number().int(),
});
export const homeMemberCountSchema = z.object({
  role: z.enum(ROLES),
  active: z.number().int(),
  inactive: z.number().int(),
});
export const homeInvitationSchema = z.object({
  email: z.string(),
  role: z.enum(ROLES).nullable(),
  expiresAt: z.iso.datetime(),
});
export const homeFixitySchema = z.object({
  state: z.enum(['never', 'queued', 'running', 'done', 'failed']),
  checkedAt: z.iso.datetime().nullable(),
  masters: z.number().int().nullable(),
  problems: z.number().int().nullable(),
});
export const homeJobsSchema = z.object({
  queued: z.number().int(),
  running: z.number().int(),
  failed: z.number().int(),
  recentFailures: z.array(
    z.object({
      id: z.number(),
      type: z.string(),
      subject: z.object({ type: z.string(), id: z.number() }).nullable(),
      error: z.string().nullable(),
      finishedAt: z.iso.datetime().nullable(),
    }),
  ),
});

/** A piece whose light exposure has used much of its allowance (this year's, or all years' since its first display). */
export const homeLightSchema = z.object({
  id: z.number(),
  accessionNumber: z.string(),
  title: z.string(),
  categoryLabel: z.string(),
  luxHours: z.number(),
  /** Share of this calendar year's allowance used (1 = all of it). */
  thisYearUsed: z.number(),
  /** Share of the allowance of every year since the first display used. */
  totalUsed: z.number(),
});
export const homeAnalysisSchema = z.object({
  id: z.number(),
  pieceId: z.number(),
  accessionNumber: z.string(),
  title: z.string(),
  method: z.string(),
  analysedOn: z.string(),
  laboratory: z.string().nullable(),
  findings: z.number().int(),
  mine: z.boolean(),
});
/**
 * "Near" its allowance: this share of this year's, or of all years', allowance used. 80 % is this product's choice (a
 * warning while there is still room to plan), not a figure from a standard.
 */
export const NEAR_ALLOWANCE = 0.8;

const savedSearches = section(savedSearchSchema);

export const curatorHomeSchema = z.object({
  role: z.literal('curator'),
  drafts: section(homePieceSchema),
  photosWithoutReference: section(homePhotoSchema),
  lightAllowance: section(homeLightSchema),
  savedSearches,
});
export const researcherHomeSchema = z.object({
  role: z.literal('researcher'),
  recentAnalyses: section(homeAnalysisSchema),
  savedSearches,
});
export const dyerHomeSchema = z.object({
  role: z.literal('dyer'),
  trialsInProgress: section(homeTrialSchema),
  bathsDue: section(homeBathSchema),
  plannedSeries: section(homeSeriesSchema),
  savedSearches,
});
export const adminHomeSchema = z.object({
  role: z.literal('admin'),
  team: z.object({ members: z.array(homeMemberCountSchema) }),
  pendingInvitations: section(homeInvitationSchema),
  fixity: homeFixitySchema,
  jobs: homeJobsSchema,
  savedSearches,
});

export const homeResponse = z.discriminatedUnion('role', [
  curatorHomeSchema,
  researcherHomeSchema,
  dyerHomeSchema,
  adminHomeSchema,
]);
z.globalRegistry.add(homeResponse, { id: 'Home' });
export type HomeResponse = z.infer<typeof homeResponse>;
export type CuratorHome = z.infer<typeof curatorHomeSchema>;
export type ResearcherHome = z.infer<typeof researcherHomeSchema>;
export type DyerHome = z.infer<typeof dyerHomeSchema>;
export type AdminHome = z.infer<typeof adminHomeSchema>;
/** How many rows each section lists (its total counts them all). */
export const HOME_LIST_SIZE = 6;
