import { queryOptions, useQuery } from '@tanstack/react-query';
import type { HomeResponse } from '../../../shared/schemas/home';
import { http } from '../../lib/http';

// The saved-searches feature invalidates ['home'] when one is saved or deleted.
export const homeKeys = { all: ['home'] as const };
export const fetchHome = () => http<HomeResponse>('/api/home');
export const homeQuery = () => queryOptions({ queryKey: homeKeys.all, queryFn: fetchHome });
export const useHome = (enabled: boolean) => useQuery({ ...homeQuery(), enabled });
