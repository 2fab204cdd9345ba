import { formatDate } from '../../../../shared/format';
import { Link } from 'react-router-dom';
import { PIECE_SORTS } from '../../../../shared/schemas/piece';
import { paths } from '../../../paths';
import type { ListParams, PieceRow } from '../api';

type Sort = (typeof PIECE_SORTS)[number];
// `wide`: shown from the lg breakpoint only, so the table fits a tablet held upright without scrolling sideways.
const columns: { key: Sort | null; label: string; wide?: boolean }[] = [
  { key: 'accessionNumber', label: 'Accession no.' },
  { key: 'title', label: 'Title' },
  { key: 'objectName', label: 'Object' },
  { key: 'earliestYear', label: 'Date' },
  { key: null, label: 'Fibres' },
  { key: null, label: 'Status' },
  { key: 'updatedAt', label: 'Last changed', wide: true },
];

export const yearsOf = (p: { dateText: string | null; earliestYear: number | null; latestYear: number | null }) =>
  p.dateText ??
  (p.earliestYear != null
    ? p.latestYear != null && p.latestYear !== p.earliestYear
      ? `${p.earliestYear}–${p.latestYear}`
      : `${p.earliestYear}`
    : '—');

export function StatusBadge({ status, deleted }: { status: string; deleted?: boolean }) {
  if (deleted) return <span className="rounded bg-danger-tint px-2 py-0.5 text-xs text-danger">deleted</span>;
  return status === 'published' ? (
    <span className="rounded bg-ok-tint px-2 py-0.5 text-xs text-ok">published</span>
  ) : (
    <span className="rounded bg-warn-tint px-2 py-0.5 text-xs text-warn">draft</span>
  );
}

export function ArchiveTable({
  rows,
  params,
  onSort,
}: {
  rows: PieceRow[];
  params: ListParams;
  onSort: (sort: Sort, dir: 'asc' | 'desc') => void;
}) {
  const sort = params.sort ?? 'accessionNumber';
  const dir = params.dir ?? 'asc';
  return (
    <div className="overflow-x-auto rounded-lg border border-rule bg-sheet">
      <table className="w-full text-sm">
        <thead className="bg-paper text-left">
          <tr>
            {columns.map((c) => (
              <th
                key={c.label}
                scope="col"
                className={`px-3 py-2 font-medium whitespace-nowrap ${c.wide ? 'hidden lg:table-cell' : ''}`}
                aria-sort={c.key === sort ? (dir === 'asc' ? 'ascending' : 'descending') : undefined}
              >
                {c.key ? (
                  <button
                    type="button"
                    className="hover:underline"
                    onClick={() => onSort(c.key!, c.key === sort && dir === 'asc' ? 'desc' : 'asc')}
                  >
                    {c.label} {c.key === sort ? (dir === 'asc' ? '▲' : '▼') : ''}
                  </button>
                ) : (
                  c.label
                )}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {rows.map((p) => (
            <tr key={p.id} className="border-t border-rule">
              <td className="px-3 py-2 font-mono whitespace-nowrap">
                <Link to={paths.piece(p.id)} className="text-action hover:underline">
                  {p.accessionNumber}
                </Link>
              </td>
              <td className="px-3 py-2">{p.title}</td>
              <td className="px-3 py-2">{p.objectName}</td>
              <td className="px-3 py-2 num whitespace-nowrap">{yearsOf(p)}</td>
              <td className="px-3 py-2">{p.fibres.join(', ') || '—'}</td>
              <td className="px-3 py-2">
                <StatusBadge status={p.status} deleted={p.deletedAt != null} />
              </td>
              <td className="hidden px-3 py-2 num whitespace-nowrap lg:table-cell">{formatDate(p.updatedAt)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

export function ArchiveGrid({ rows }: { rows: PieceRow[] }) {
  return (
    <ul className="grid gap-4 grid-cols-2 sm:grid-cols-3 lg:grid-cols-5">
      {rows.map((p) => (
        <li key={p.id}>
          <Link
            to={paths.piece(p.id)}
            className="block rounded-lg border border-rule bg-sheet overflow-hidden hover:border-rule-strong"
          >
            <div className="aspect-square bg-neutral-light flex items-center justify-center">
              {p.thumbUrl ? (
                <img
                  src={p.thumbUrl}
                  alt={`${p.accessionNumber}, ${p.title}`}
                  className="max-h-full max-w-full object-contain"
                  loading="lazy"
                />
              ) : (
                <span className="text-xs text-ink-faint">no photo yet</span>
              )}
            </div>
            <div className="p-2 text-sm">
              <div className="font-mono text-xs text-ink-soft">{p.accessionNumber}</div>
              <div className="line-clamp-2">{p.title}</div>
            </div>
          </Link>
        </li>
      ))}
    </ul>
  );
}
