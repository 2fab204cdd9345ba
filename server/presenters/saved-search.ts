import type { SavedSearchOut } from '../../shared/schemas/saved-search.ts';
import type { SavedSearch } from '../models/index.ts';

export function presentSavedSearch(s: SavedSearch): SavedSearchOut {
  return {
    id: s.id,
    name: s.name,
    query: s.query,
    href: `/search?${s.query}`,
    createdAt: s.createdAt.toISOString(),
  };
}
