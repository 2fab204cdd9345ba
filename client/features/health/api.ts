import { queryOptions, useQuery } from '@tanstack/react-query';
import { http } from '../../lib/http';
import type { Health } from '../../../shared/schemas/health';

export const healthKeys = { all: ['health'] as const };
export const fetchHealth = () => http<Health>('/api/health');
export const healthQuery = () => queryOptions({ queryKey: healthKeys.all, queryFn: fetchHealth, staleTime: 60_000 });
export const useHealth = () => useQuery(healthQuery());
