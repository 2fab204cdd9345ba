import { Link, useSearchParams } from 'react-router-dom';
import { Page } from '../components/Page';
import { useCan } from '../features/auth/api';
import { usePieces, type ListParams } from '../features/pieces/api';
import { ArchiveFilters } from '../features/pieces/components/ArchiveFilters';
import { ArchiveGrid, ArchiveTable } from '../features/pieces/components/ArchiveTable';
import { DownloadLink } from '../features/export/components/DownloadLink';
import { exportUrls } from '../features/export/urls';
import { paths } from '../paths';

const KEYS = ['q', 'status', 'fibre', 'technique', 'dyestuff', 'sort', 'dir', 'deleted'] as const;

export function Archive() {
  const can = useCan();
  const [search, setSearch] = useSearchParams();
  const params: ListParams = { page: Number(search.get('page') ?? 1), pageSize: 25 };
  for (const k of KEYS) if (search.get(k)) Object.assign(params, { [k]: search.get(k) });
  const view = search.get('view') === 'grid' ? 'grid' : 'table';
  const list = usePieces(params);

  const update = (next: ListParams, nextView: string = view) => {
    const s = new URLSearchParams();
    for (const [k, v] of Object.entries(next))
      if (v != null && v !== '' && !(k === 'page' && v === 1) && k !== 'pageSize') s.set(k, String(v));
    if (nextView === 'grid') s.set('view', 'grid');
    setSearch(s, { replace: true });
  };
  const pages = list.data ? Math.max(1, Math.ceil(list.data.total / list.data.pageSize)) : 1;

  return (
    <Page
      title="Archive"
      lead="Catalogued pieces with their photos and measured palettes."
      actions={
        <>
          {can('export:run') ? (
            <DownloadLink href={exportUrls.piecesCsv()} hint="Every piece as a CSV that the import reads back">
              Export pieces (CSV)
            </DownloadLink>
          ) : null}
          <DownloadLink
            href={exportUrls.palettesCsv()}
            hint="Every palette colour of the pieces you may see: photo, region, variant, L*a*b* (image estimate, D65/2°), hex and share"
          >
            Export palettes (CSV)
          </DownloadLink>
          {can('import:run') ? (
            <Link
              to={paths.importPieces()}
              className="rounded-md border border-rule-strong bg-sheet px-3 py-1.5 text-sm hover:bg-paper"
            >
              Import CSV
            </Link>
          ) : null}
          {can('piece:create') ? (
            <Link
              to={paths.pieceNew()}
              className="rounded-md bg-action px-4 py-2 text-sm font-medium text-white hover:bg-action-strong"
            >
              Catalogue a piece
            </Link>
          ) : null}
        </>
      }
    >
      <ArchiveFilters
        value={params}
        onChange={update}
        canSeeDrafts={can('piece:list-drafts')}
        canSeeDeleted={can('piece:delete')}
      />
      <div className="my-4 flex flex-wrap items-center justify-between gap-3 text-sm">
        <p aria-live="polite" className="text-ink-soft">
          {list.isPending
            ? 'Loading…'
            : list.isError
              ? list.error.message
              : `${list.data.total} piece${list.data.total === 1 ? '' : 's'}`}
        </p>
        <div role="group" aria-label="View" className="flex rounded-md border border-rule-strong overflow-hidden">
          {(['table', 'grid'] as const).map((v) => (
            <button
              key={v}
              type="button"
              aria-pressed={view === v}
              className={`px-3 py-1 ${view === v ? 'bg-neutral-light font-medium' : 'bg-sheet'}`}
              onClick={() => update(params, v)}
            >
              {v === 'table' ? 'Table' : 'Thumbnails'}
            </button>
          ))}
        </div>
      </div>
      {list.data ? (
        view === 'grid' ? (
          <ArchiveGrid rows={list.data.items} />
        ) : (
          <ArchiveTable
            rows={list.data.items}
            params={params}
            onSort={(sort, dir) => update({ ...params, sort, dir, page: 1 })}
          />
        )
      ) : null}
      {pages > 1 ? (
        <nav aria-label="Pages" className="mt-4 flex items-center gap-3 text-sm">
          <button
            type="button"
            className="rounded border border-rule-strong px-3 py-1 disabled:opacity-50"
            disabled={params.page! <= 1}
            onClick={() => update({ ...params, page: params.page! - 1 })}
          >
            Previous
          </button>
          <span className="num">
            Page {params.page} of {pages}
          </span>
          <button
            type="button"
            className="rounded border border-rule-strong px-3 py-1 disabled:opacity-50"
            disabled={params.page! >= pages}
            onClick={() => update({ ...params, page: params.page! + 1 })}
          >
            Next
          </button>
        </nav>
      ) : null}
    </Page>
  );
}
