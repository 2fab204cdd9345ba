import { Op, QueryTypes } from 'sequelize';
import {
  HOME_LIST_SIZE,
  NEAR_ALLOWANCE,
  type AdminHome,
  type CuratorHome,
  type DyerHome,
  type HomeResponse,
  type ResearcherHome,
} from '../../../shared/schemas/home.ts';
import type { Role } from '../../../shared/roles.ts';
import { FIXITY_JOB } from '../../jobs/handlers/fixity-check.ts';
import {
  Analysis,
  AuthToken,
  DisplayPeriod,
  Job,
  MordantBatch,
  Photo,
  Piece,
  SavedSearch,
  Trial,
  TrialSeries,
  sequelize,
} from '../../models/index.ts';
import { presentSavedSearch } from '../../presenters/saved-search.ts';
import { dueForCheck } from '../../services/batches/index.ts';
import { asInput, doseOf } from '../../services/records/displays.ts';
import { fixityReportSchema } from '../../../shared/schemas/fixity.ts';

// Each section is one count and one short list (or one GROUP BY), all run side by side: a fixed handful of
// queries per answer whatever the archive's size, never one per row.
const N = HOME_LIST_SIZE;
const iso = (d: Date) => d.toISOString();
const today = () => new Date().toISOString().slice(0, 10);
type Me = { id: number; role: Role };

async function savedSearchesOf(me: Me) {
  const { rows, count } = await SavedSearch.findAndCountAll({
    where: { userId: me.id },
    order: [
      ['updatedAt', 'DESC'],
      ['id', 'DESC'],
    ],
    limit: N,
  });
  return { total: count, items: rows.map(presentSavedSearch) };
}

/**
 * Pieces near their light allowance (NEAR_ALLOWANCE of this year's or of all years' allowance used), most used first.
 * Two queries: every display period (a short table beside pieces: a piece has a few a decade), then the pieces that
 * have any; each piece's dose is the piece page's own (services/records/displays.ts, doseOf).
 */
async function nearLightAllowance(): Promise<CuratorHome['lightAllowance']> {
  const periods = await DisplayPeriod.findAll({
    attributes: ['pieceId', 'fromDate', 'toDate', 'lux', 'hoursPerDay'],
    order: [['id', 'ASC']],
  });
  if (!periods.length) return { total: 0, items: [] };
  const byPiece = new Map<number, DisplayPeriod[]>();
  for (const d of periods) byPiece.set(d.pieceId, [...(byPiece.get(d.pieceId) ?? []), d]);
  // Only pieces still in the archive (Piece is paranoid).
  const pieces = await Piece.findAll({
    where: { id: [...byPiece.keys()] },
    attributes: ['id', 'accessionNumber', 'title', 'dyestuffs'],
  });
  const near = pieces
    .map((p) => {
      const dose = doseOf(p, byPiece.get(p.id)!.map(asInput));
      return {
        id: p.id,
        accessionNumber: p.accessionNumber,
        title: p.title,
        categoryLabel: dose.categoryLabel,
        luxHours: dose.luxHours,
        thisYearUsed: dose.thisYear.usedFraction ?? 0,
        totalUsed: dose.totalUsedFraction ?? 0,
      };
    })
    .filter((x) => x.thisYearUsed >= NEAR_ALLOWANCE || x.totalUsed >= NEAR_ALLOWANCE)
    .sort(
      (a, b) =>
        Math.max(b.thisYearUsed, b.totalUsed) - Math.max(a.thisYearUsed, a.totalUsed) ||
        a.accessionNumber.localeCompare(b.accessionNumber),
    );
  return { total: near.length, items: near.slice(0, N) };
}

/** The newest analyses of pieces still in the archive (by date analysed, then as recorded), the reader's own marked. */
async function recentAnalyses(me: Me): Promise<ResearcherHome['recentAnalyses']> {
  const { rows, count } = await Analysis.findAndCountAll({
    attributes: ['id', 'pieceId', 'method', 'analysedOn', 'laboratory', 'findings', 'createdById'],
    include: [{ model: Piece, as: 'piece', attributes: ['id', 'accessionNumber', 'title'], required: true }],
    order: [
      ['analysedOn', 'DESC'],
      ['id', 'DESC'],
    ],
    limit: N,
  });
  return {
    total: count,
    items: rows.map((a) => {
      const piece = (a as Analysis & { piece: Piece }).piece;
      return {
        id: a.id,
        pieceId: piece.id,
        accessionNumber: piece.accessionNumber,
        title: piece.title,
        method: a.method,
        analysedOn: a.analysedOn,
        laboratory: a.laboratory,
        findings: a.findings.length,
        mine: a.createdById === me.id,
      };
    }),
  };
}

async function curatorHome(me: Me): Promise<CuratorHome> {
  const photoWhere = { pieceId: { [Op.ne]: null }, referencePatch: { [Op.is]: null } };
  // Only photos of pieces still in the archive (the inner join leaves out deleted pieces: Piece is paranoid).
  const pieceJoin = { model: Piece, as: 'piece', attributes: ['id', 'accessionNumber', 'title'], required: true };
  const [drafts, photos, photoCount, lightAllowance, savedSearches] = await Promise.all([
    Piece.findAndCountAll({
      where: { status: 'draft' },
      attributes: ['id', 'accessionNumber', 'title', 'updatedAt'],
      order: [
        ['updatedAt', 'DESC'],
        ['id', 'DESC'],
      ],
      limit: N,
    }),
    Photo.findAll({
      where: photoWhere,
      attributes: ['id', 'pieceId', 'view'],
      include: [pieceJoin],
      order: [['id', 'DESC']],
      limit: N,
    }),
    Photo.count({ where: photoWhere, include: [pieceJoin] }),
    nearLightAllowance(),
    savedSearchesOf(me),
  ]);
  return {
    role: 'curator',
    drafts: {
      total: drafts.count,
      items: drafts.rows.map((p) => ({
        id: p.id,
        accessionNumber: p.accessionNumber,
        title: p.title,
        updatedAt: iso(p.updatedAt),
      })),
    },
    photosWithoutReference: {
      total: photoCount,
      items: photos.map((ph) => {
        const piece = (ph as Photo & { piece: Piece }).piece;
        return {
          id: ph.id,
          pieceId: piece.id,
          accessionNumber: piece.accessionNumber,
          title: piece.title,
          view: ph.view,
          thumbUrl: `/media/photos/${ph.id}/thumb`,
        };
      }),
    },
    lightAllowance,
    savedSearches,
  };
}

async function dyerHome(me: Me): Promise<DyerHome> {
  const trialWhere = { dyerId: me.id, status: 'in-progress' as const };
  const [trials, baths, mySeries, savedSearches] = await Promise.all([
    Trial.findAndCountAll({
      where: trialWhere,
      attributes: ['id', 'code', 'status', 'startedOn', 'pieceId', 'updatedAt'],
      include: [{ model: Piece, as: 'piece', attributes: ['id', 'accessionNumber'], required: false }],
      order: [
        ['updatedAt', 'DESC'],
        ['id', 'DESC'],
      ],
      limit: N,
    }),
    // "Due a check" is the baths page's own rule (dueForCheck: active and check-by today or earlier).
    MordantBatch.findAndCountAll({
      where: dueForCheck(today()),
      attributes: ['id', 'code', 'name', 'kind', 'checkBy', 'madeById'],
      order: [
        ['checkBy', 'ASC'],
        ['id', 'ASC'],
      ],
      limit: N,
    }),
    TrialSeries.findAll({
      where: { ownerId: me.id },
      attributes: ['id', 'code', 'title', 'cells', 'updatedAt'],
      order: [
        ['updatedAt', 'DESC'],
        ['id', 'DESC'],
      ],
    }),
    savedSearchesOf(me),
  ]);
  // Trial counts per series and status in one GROUP BY.
  const counts = mySeries.length
    ? await sequelize.query<{ seriesId: number; status: string; n: number }>(
        'SELECT seriesId, status, COUNT(*) AS n FROM trials WHERE seriesId IN (:ids) GROUP BY seriesId, status',
        { replacements: { ids: mySeries.map((s) => s.id) }, type: QueryTypes.SELECT },
      )
    : [];
  const count = (id: number, status: string) =>
    Number(counts.find((c) => c.seriesId === id && c.status === status)?.n ?? 0);
  // A series is still planned work while some of its cells have no trial yet, or a trial is planned or in progress.
  const open = mySeries
    .map((s) => {
      const made = counts.filter((c) => c.seriesId === s.id).reduce((n, c) => n + Number(c.n), 0);
      const planned = count(s.id, 'planned') + Math.max(0, s.cells.length - made);
      return {
        id: s.id,
        code: s.code,
        title: s.title,
        cells: s.cells.length,
        planned,
        inProgress: count(s.id, 'in-progress'),
        finished: count(s.id, 'finished'),
      };
    })
    .filter((s) => s.planned > 0 || s.inProgress > 0);
  return {
    role: 'dyer',
    trialsInProgress: {
      total: trials.count,
      items: trials.rows.map((t) => {
        const piece = (t as Trial & { piece: Piece | null }).piece;
        return {
          id: t.id,
          code: t.code,
          status: t.status,
          startedOn: t.startedOn,
          pieceId: t.pieceId,
          accessionNumber: piece?.accessionNumber ?? null,
          updatedAt: iso(t.updatedAt),
        };
      }),
    },
    bathsDue: {
      total: baths.count,
      items: baths.rows.map((b) => ({
        id: b.id,
        code: b.code,
        name: b.name,
        kind: b.kind,
        checkBy: b.checkBy!,
        mine: b.madeById === me.id,
      })),
    },
    plannedSeries: { total: open.length, items: open.slice(0, N) },
    savedSearches,
  };
}

async function adminHome(me: Me): Promise<AdminHome> {
  const invitationWhere = { purpose: 'invitation' as const, usedAt: null, expiresAt: { [Op.gt]: new Date() } };
  const [members, invitations, latestFixity, lastDoneFixity, jobStates, failures, savedSearches] = await Promise.all([
    sequelize.query<{ role: Role; active: number; n: number }>(
      'SELECT role, active, COUNT(*) AS n FROM users GROUP BY role, active',
      { type: QueryTypes.SELECT },
    ),
    AuthToken.findAndCountAll({
      where: invitationWhere,
      attributes: ['email', 'role', 'expiresAt'],
      order: [['expiresAt', 'ASC']],
      limit: N,
    }),
    Job.findOne({ where: { type: FIXITY_JOB }, order: [['id', 'DESC']], attributes: ['state', 'finishedAt'] }),
    Job.findOne({ where: { type: FIXITY_JOB, state: 'done' }, order: [['id', 'DESC']], attributes: ['result'] }),
    sequelize.query<{ state: string; n: number }>('SELECT state, COUNT(*) AS n FROM jobs GROUP BY state', {
      type: QueryTypes.SELECT,
    }),
    Job.findAll({
      where: { state: 'failed' },
      attributes: ['id', 'type', 'subjectType', 'subjectId', 'error', 'finishedAt'],
      order: [['id', 'DESC']],
      limit: N,
    }),
    savedSearchesOf(me),
  ]);
  const report = lastDoneFixity?.result ? fixityReportSchema.safeParse(lastDoneFixity.result) : null;
  const r = report?.success ? report.data : null;
  const jobs = (state: string) => Number(jobStates.find((j) => j.state === state)?.n ?? 0);
  const roles = ['admin', 'curator', 'researcher', 'dyer'] as const;
  return {
    role: 'admin',
    team: {
      members: roles.map((role) => ({
        role,
        active: Number(members.find((m) => m.role === role && Number(m.active) === 1)?.n ?? 0),
        inactive: Number(members.find((m) => m.role === role && Number(m.active) === 0)?.n ?? 0),
      })),
    },
    pendingInvitations: {
      total: invitations.count,
      items: invitations.rows.map((t) => ({ email: t.email, role: t.role, expiresAt: iso(t.expiresAt) })),
    },
    fixity: {
      state: latestFixity ? latestFixity.state : 'never',
      checkedAt: r?.checkedAt ?? null,
      masters: r?.masters ?? null,
      problems: r ? r.mismatches.length + r.missing.length : null,
    },
    jobs: {
      queued: jobs('queued'),
      running: jobs('running'),
      failed: jobs('failed'),
      recentFailures: failures.map((j) => ({
        id: j.id,
        type: j.type,
        subject: j.subjectType && j.subjectId != null ? { type: j.subjectType, id: j.subjectId } : null,
        error: j.error,
        finishedAt: j.finishedAt ? iso(j.finishedAt) : null,
      })),
    },
    savedSearches,
  };
}

/** The landing page's data for the signed-in person's role. */
export async function loadHome(me: Me): Promise<HomeResponse> {
  switch (me.role) {
    case 'curator':
      return curatorHome(me);
    case 'dyer':
      return dyerHome(me);
    case 'admin':
      return adminHome(me);
    case 'researcher': {
      const [analyses, savedSearches] = await Promise.all([recentAnalyses(me), savedSearchesOf(me)]);
      return { role: 'researcher', recentAnalyses: analyses, savedSearches };
    }
  }
}
