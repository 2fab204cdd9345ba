import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { SearchResponse, ShadeResponse } from '../../../shared/schemas/search';
import { http } from '../../lib/http';

/** Search parameters exactly as they appear in the page URL (repeated keys for several facet values). */
export type SearchParams = Record<string, string | string[]>;

const FILTER_KEYS = [
  'q',
  'dyestuff',
  'mordant',
  'historicalMordant',
  'modernMordant',
  'fibre',
  'technique',
  'century',
  'place',
  'status',
  'identifiedBy',
] as const;
const SHADE_KEYS = ['hex', 'L', 'a', 'b', 'maxDeltaE', 'limit'] as const;

function toQuery(params: SearchParams, keys: readonly string[]): string {
  const u = new URLSearchParams();
  for (const k of keys) {
    const v = params[k];
    for (const x of Array.isArray(v) ? v : v === undefined ? [] : [v]) if (x !== '') u.append(k, x);
  }
  return u.toString();
}

/** The shade search's own parameters without paging: the CSV export then holds every match. */
export const shadeExportQuery = (p: SearchParams) =>
  toQuery(p, [...FILTER_KEYS, ...SHADE_KEYS.filter((k) => k !== 'limit')]);

export const searchKeys = {
  all: ['search'] as const,
  text: (p: SearchParams) => [...searchKeys.all, 'text', toQuery(p, [...FILTER_KEYS, 'page'])] as const,
  shade: (p: SearchParams) =>
    [...searchKeys.all, 'shade', toQuery(p, [...FILTER_KEYS, ...SHADE_KEYS, 'page'])] as const,
};

export const fetchSearch = (p: SearchParams) =>
  http<SearchResponse>(`/api/search?${toQuery(p, [...FILTER_KEYS, 'page'])}`);
export const fetchShade = (p: SearchParams) =>
  http<ShadeResponse>(`/api/search/shade?${toQuery(p, [...FILTER_KEYS, ...SHADE_KEYS, 'page'])}`);

export const searchQuery = (p: SearchParams) =>
  queryOptions({ queryKey: searchKeys.text(p), queryFn: () => fetchSearch(p), placeholderData: keepPreviousData });
export const shadeQuery = (p: SearchParams) =>
  queryOptions({ queryKey: searchKeys.shade(p), queryFn: () => fetchShade(p), placeholderData: keepPreviousData });

export const useSearch = (p: SearchParams, enabled = true) => useQuery({ ...searchQuery(p), enabled });
export const useShade = (p: SearchParams, enabled: boolean) => useQuery({ ...shadeQuery(p), enabled });
