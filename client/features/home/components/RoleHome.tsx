import { Link } from 'react-router-dom';
import type { AdminHome, CuratorHome, DyerHome, HomeResponse, ResearcherHome } from '../../../../shared/schemas/home';
import { formatDate, formatDateTime } from '../../../../shared/format';
import { NEAR_ALLOWANCE } from '../../../../shared/schemas/home';
import { paths } from '../../../paths';
import { SavedSearchLinks } from '../../saved-searches';
import { useHome } from '../api';
import { Empty, Panel, Rows } from './Panel';

const piece = (accessionNumber: string | null, title?: string) =>
  accessionNumber ? (
    <>
      <span className="font-mono">{accessionNumber}</span>
      {title ? ` ${title}` : ''}
    </>
  ) : null;

function SavedSearches({ data }: { data: HomeResponse['savedSearches'] }) {
  return (
    <Panel
      title="Saved searches"
      total={data.total}
      more={{ to: paths.search(), label: 'Find' }}
      testId="home-saved-searches"
    >
      <SavedSearchLinks
        items={data.items}
        empty="None yet: on Find, choose words, facets or a shade and save the search by name."
      />
    </Panel>
  );
}

const percent = (x: number) => `${Math.round(x * 100)} %`;
const lxh = (n: number) => `${Math.round(n).toLocaleString('en-GB').replace(/,/g, ' ')} lx·h`;

function LightAllowance({ data }: { data: CuratorHome['lightAllowance'] }) {
  return (
    <Panel title="Pieces near their light allowance" total={data.total} testId="home-light">
      {data.items.length ? (
        <Rows>
          {data.items.map((p) => (
            <li key={p.id} className="flex flex-wrap justify-between gap-x-2">
              <Link to={`${paths.piece(p.id)}#light-h`} className="min-w-0 text-action hover:underline">
                {piece(p.accessionNumber, p.title)}
              </Link>
              <span className={`num ${Math.max(p.thisYearUsed, p.totalUsed) >= 1 ? 'text-danger' : 'text-ink-soft'}`}>
                {percent(p.thisYearUsed)} of this year · {percent(p.totalUsed)} of all years ({p.categoryLabel},{' '}
                {lxh(p.luxHours)})
              </span>
            </li>
          ))}
        </Rows>
      ) : (
        <Empty>
          No piece has used {percent(NEAR_ALLOWANCE)} of its light allowance (this year or all years since its first
          display).
        </Empty>
      )}
    </Panel>
  );
}

function RecentAnalyses({ data }: { data: ResearcherHome['recentAnalyses'] }) {
  return (
    <Panel title="Recent analyses" total={data.total} testId="home-analyses">
      {data.items.length ? (
        <Rows>
          {data.items.map((a) => (
            <li key={a.id} className="flex flex-wrap justify-between gap-x-2">
              <Link to={`${paths.piece(a.pieceId)}#analysis-${a.id}`} className="min-w-0 text-action hover:underline">
                {a.method} of {piece(a.accessionNumber, a.title)}
              </Link>
              <span className="text-ink-soft">
                {a.analysedOn}
                {a.laboratory ? ` · ${a.laboratory}` : ''} · {a.findings} {a.findings === 1 ? 'finding' : 'findings'}
                {a.mine ? ' · mine' : ''}
              </span>
            </li>
          ))}
        </Rows>
      ) : (
        <Empty>No analyses yet: record one on a piece's page, under Analyses.</Empty>
      )}
    </Panel>
  );
}

function Curator({ home }: { home: CuratorHome }) {
  return (
    <>
      <Panel
        title="Drafts to publish"
        total={home.drafts.total}
        more={{ to: `${paths.archive()}?status=draft`, label: 'All drafts' }}
        testId="home-drafts"
      >
        {home.drafts.items.length ? (
          <Rows>
            {home.drafts.items.map((p) => (
              <li key={p.id} className="flex flex-wrap justify-between gap-x-2">
                <Link to={paths.piece(p.id)} className="min-w-0 text-action hover:underline">
                  {piece(p.accessionNumber, p.title)}
                </Link>
                <span className="text-ink-faint">{formatDate(p.updatedAt)}</span>
              </li>
            ))}
          </Rows>
        ) : (
          <Empty>No drafts: every piece is published.</Empty>
        )}
      </Panel>
      <Panel title="Photos without a reference patch" total={home.photosWithoutReference.total} testId="home-photos">
        {home.photosWithoutReference.items.length ? (
          <ul className="grid grid-cols-2 gap-3 sm:grid-cols-3 text-sm">
            {home.photosWithoutReference.items.map((ph) => (
              <li key={ph.id} className="min-w-0">
                <Link to={paths.piece(ph.pieceId)} className="block text-action hover:underline">
                  <img
                    src={ph.thumbUrl}
                    alt=""
                    className="aspect-square w-full rounded object-cover bg-paper"
                    loading="lazy"
                  />
                  <span className="mt-1 block truncate">
                    {piece(ph.accessionNumber)} · {ph.view}
                  </span>
                </Link>
              </li>
            ))}
          </ul>
        ) : (
          <Empty>Every photo has a reference patch for its colour correction.</Empty>
        )}
      </Panel>
      <LightAllowance data={home.lightAllowance} />
      <SavedSearches data={home.savedSearches} />
    </>
  );
}

function Researcher({ home }: { home: ResearcherHome }) {
  return (
    <>
      <RecentAnalyses data={home.recentAnalyses} />
      <SavedSearches data={home.savedSearches} />
    </>
  );
}

function Dyer({ home }: { home: DyerHome }) {
  return (
    <>
      <Panel
        title="My trials in progress"
        total={home.trialsInProgress.total}
        more={{ to: paths.trials(), label: 'All trials' }}
        testId="home-trials"
      >
        {home.trialsInProgress.items.length ? (
          <Rows>
            {home.trialsInProgress.items.map((t) => (
              <li key={t.id} className="flex flex-wrap justify-between gap-x-2">
                <Link to={paths.trial(t.id)} className="font-mono text-action hover:underline">
                  {t.code}
                </Link>
                <span className="text-ink-soft">
                  {t.accessionNumber ? <>for {piece(t.accessionNumber)} · </> : null}
                  {t.startedOn ? `started ${t.startedOn}` : 'not started'}
                </span>
              </li>
            ))}
          </Rows>
        ) : (
          <Empty>No trial in progress.</Empty>
        )}
      </Panel>
      <Panel
        title="Baths due a check"
        total={home.bathsDue.total}
        more={{ to: paths.baths(), label: 'All baths' }}
        testId="home-baths"
      >
        {home.bathsDue.items.length ? (
          <Rows>
            {home.bathsDue.items.map((b) => (
              <li key={b.id} className="flex flex-wrap justify-between gap-x-2">
                <Link to={paths.bath(b.id)} className="min-w-0 text-action hover:underline">
                  <span className="font-mono">{b.code}</span> {b.name}
                </Link>
                <span className="text-ink-soft">
                  check by {b.checkBy}
                  {b.mine ? ' · mine' : ''}
                </span>
              </li>
            ))}
          </Rows>
        ) : (
          <Empty>No bath is due a check.</Empty>
        )}
      </Panel>
      <Panel
        title="Planned series"
        total={home.plannedSeries.total}
        more={{ to: paths.series(), label: 'All series' }}
        testId="home-series"
      >
        {home.plannedSeries.items.length ? (
          <Rows>
            {home.plannedSeries.items.map((s) => (
              <li key={s.id} className="flex flex-wrap justify-between gap-x-2">
                <Link to={paths.seriesOne(s.id)} className="min-w-0 text-action hover:underline">
                  <span className="font-mono">{s.code}</span> {s.title}
                </Link>
                <span className="text-ink-soft num">
                  {s.planned} planned · {s.inProgress} in progress · {s.finished} of {s.cells} finished
                </span>
              </li>
            ))}
          </Rows>
        ) : (
          <Empty>No series with work still planned.</Empty>
        )}
      </Panel>
      <SavedSearches data={home.savedSearches} />
    </>
  );
}

function Admin({ home }: { home: AdminHome }) {
  const f = home.fixity;
  return (
    <>
      <Panel title="Team" more={{ to: paths.team(), label: 'Manage the team' }} testId="home-team">
        <Rows>
          {home.team.members.map((m) => (
            <li key={m.role} className="flex justify-between gap-2">
              <span className="capitalize">{m.role}s</span>
              <span className="text-ink-soft num">
                {m.active} active{m.inactive ? ` · ${m.inactive} deactivated` : ''}
              </span>
            </li>
          ))}
        </Rows>
      </Panel>
      <Panel
        title="Pending invitations"
        total={home.pendingInvitations.total}
        more={{ to: paths.team(), label: 'Invitations' }}
        testId="home-invitations"
      >
        {home.pendingInvitations.items.length ? (
          <Rows>
            {home.pendingInvitations.items.map((i) => (
              <li key={i.email} className="flex flex-wrap justify-between gap-x-2">
                <span className="min-w-0 break-all">{i.email}</span>
                <span className="text-ink-soft">
                  {i.role} · until {formatDateTime(i.expiresAt)}
                </span>
              </li>
            ))}
          </Rows>
        ) : (
          <Empty>No invitation is waiting.</Empty>
        )}
      </Panel>
      <Panel title="Fixity" more={{ to: paths.fixity(), label: 'Fixity checks' }} testId="home-fixity">
        <p className="text-sm">
          {f.state === 'never'
            ? 'No check of the masters has been run yet.'
            : f.checkedAt
              ? `Last finished check ${formatDateTime(f.checkedAt)}: ${f.masters} masters, ${f.problems ? `${f.problems} with problems` : 'all intact'}.`
              : `A check is ${f.state}.`}
          {f.state === 'queued' || f.state === 'running' ? ` A new check is ${f.state}.` : ''}
        </p>
      </Panel>
      <Panel title="Job queue" testId="home-jobs">
        <p className="text-sm num">
          {home.jobs.queued} queued · {home.jobs.running} running · {home.jobs.failed} failed
        </p>
        {home.jobs.recentFailures.length ? (
          // Underlined: each link sits in a line of text (the job's error), so colour alone would not mark it.
          <ul className="mt-2 space-y-1 text-sm">
            {home.jobs.recentFailures.map((j) => (
              <li key={j.id} className="min-w-0 break-words">
                {j.subject?.type === 'photo' ? (
                  <Link to={paths.photoZoom(j.subject.id)} className="text-action underline">
                    {j.type} #{j.id}
                  </Link>
                ) : j.type === 'fixity-check' ? (
                  <Link to={paths.fixity()} className="text-action underline">
                    {j.type} #{j.id}
                  </Link>
                ) : (
                  <span>
                    {j.type} #{j.id}
                  </span>
                )}
                {j.error ? <span className="text-ink-soft"> — {j.error}</span> : null}
              </li>
            ))}
          </ul>
        ) : null}
      </Panel>
      <SavedSearches data={home.savedSearches} />
    </>
  );
}

const HEADINGS: Record<HomeResponse['role'], string> = {
  curator: 'Your work as curator',
  researcher: 'Your work as researcher',
  dyer: 'Your work as dyer',
  admin: 'Your work as admin',
};

/** The signed-in person's home page: the sections of their role from GET /api/home. */
export function RoleHome() {
  const home = useHome(true);
  if (home.isPending) return <p className="text-ink-soft">Loading your work…</p>;
  if (home.isError) return <p className="text-danger">{home.error.message}</p>;
  const h = home.data;
  return (
    <div data-testid={`home-${h.role}`}>
      <h2 className="sr-only">{HEADINGS[h.role]}</h2>
      <div className="grid gap-4 md:grid-cols-2">
        {h.role === 'curator' ? (
          <Curator home={h} />
        ) : h.role === 'researcher' ? (
          <Researcher home={h} />
        ) : h.role === 'dyer' ? (
          <Dyer home={h} />
        ) : (
          <Admin home={h} />
        )}
      </div>
    </div>
  );
}
