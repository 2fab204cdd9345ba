import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ChemicalView, DyestuffView, Paged } from '../../../shared/schemas/reference';
import { http } from '../../lib/http';

// The reference changes rarely (admins edit it), so it is cached for a while.
const STALE = 10 * 60_000;

export const referenceKeys = {
  all: ['reference'] as const,
  chemicals: () => [...referenceKeys.all, 'chemicals'] as const,
  chemical: (id: number) => [...referenceKeys.chemicals(), id] as const,
  dyestuffs: () => [...referenceKeys.all, 'dyestuffs'] as const,
};

export const fetchChemicals = () => http<Paged<ChemicalView>>('/api/chemicals?pageSize=200');
export const fetchChemical = (id: number) => http<ChemicalView>(`/api/chemicals/${id}`);
export const fetchDyestuffs = () => http<Paged<DyestuffView>>('/api/dyestuffs?pageSize=200');

export const chemicalsQuery = () => queryOptions({ queryKey: referenceKeys.chemicals(), queryFn: fetchChemicals, staleTime: STALE });
export const chemicalQuery = (id: number) => queryOptions({ queryKey: referenceKeys.chemical(id), queryFn: () => fetchChemical(id), staleTime: STALE });
export const dyestuffsQuery = () => queryOptions({ queryKey: referenceKeys.dyestuffs(), queryFn: fetchDyestuffs, staleTime: STALE });

export const useChemicals = () => useQuery(chemicalsQuery());
export const useChemical = (id: number) => useQuery(chemicalQuery(id));
export const useDyestuffs = () => useQuery(dyestuffsQuery());
