import { Link } from 'react-router-dom';
import { paths } from '../../../paths';
import { useDeleteSavedSearch, type SavedSearch } from '../api';

/** Saved searches as links that open /search again; each may be deleted. */
export function SavedSearchLinks({ items, empty }: { items: SavedSearch[]; empty: string }) {
  const remove = useDeleteSavedSearch();
  if (!items.length) return <p className="text-sm text-ink-soft">{empty}</p>;
  return (
    <ul className="space-y-1" data-testid="saved-search-list">
      {items.map((s) => (
        <li key={s.id} className="flex items-baseline justify-between gap-2 min-w-0">
          <Link to={paths.savedSearch(s.query)} className="min-w-0 truncate text-action hover:underline">
            {s.name}
          </Link>
          <button
            type="button"
            className="shrink-0 text-xs text-ink-faint hover:text-danger hover:underline"
            aria-label={`Delete the saved search ${s.name}`}
            disabled={remove.isPending}
            onClick={() => remove.mutate(s.id)}
          >
            Delete
          </button>
        </li>
      ))}
    </ul>
  );
}
