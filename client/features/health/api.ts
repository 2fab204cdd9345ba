import { queryOptions, useQuery } from '@tanstack/react-query';
import { http } from '../../lib/http';

export type Health = { ok: boolean; db: 'up' | 'down'; version: string };

export const healthKeys = { all: ['health'] as const };
export const fetchHealth = () => http<Health>('/api/health');
export const healthQuery = () => queryOptions({ queryKey: healthKeys.all, queryFn: fetchHealth, staleTime: 60_000 });
export const useHealth = () => useQuery(healthQuery());
