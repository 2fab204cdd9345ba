import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type {
  ChemicalCreate,
  ChemicalList,
  ChemicalView,
  DyestuffCreate,
  DyestuffList,
  DyestuffView,
} from '../../../shared/schemas/reference';
import { http } from '../../lib/http';

// The reference changes rarely (admins edit it), so it is cached for a while.
const STALE = 10 * 60_000;

export const referenceKeys = {
  all: ['reference'] as const,
  chemicals: () => [...referenceKeys.all, 'chemicals'] as const,
  chemical: (id: number) => [...referenceKeys.chemicals(), id] as const,
  dyestuffs: () => [...referenceKeys.all, 'dyestuffs'] as const,
};

export const fetchChemicals = () => http<ChemicalList>('/api/chemicals?pageSize=200');
export const fetchChemical = (id: number) => http<ChemicalView>(`/api/chemicals/${id}`);
export const fetchDyestuffs = () => http<DyestuffList>('/api/dyestuffs?pageSize=200');

export const chemicalsQuery = () =>
  queryOptions({ queryKey: referenceKeys.chemicals(), queryFn: fetchChemicals, staleTime: STALE });
export const chemicalQuery = (id: number) =>
  queryOptions({ queryKey: referenceKeys.chemical(id), queryFn: () => fetchChemical(id), staleTime: STALE });
export const dyestuffsQuery = () =>
  queryOptions({ queryKey: referenceKeys.dyestuffs(), queryFn: fetchDyestuffs, staleTime: STALE });

export const useChemicals = () => useQuery(chemicalsQuery());
export const useChemical = (id: number) => useQuery(chemicalQuery(id));
export const useDyestuffs = () => useQuery(dyestuffsQuery());

// Admins add to the reference; the lists are fetched again afterwards.
export const createChemical = (input: ChemicalCreate) =>
  http<ChemicalView>('/api/chemicals', { method: 'POST', json: input });
export const createDyestuff = (input: DyestuffCreate) =>
  http<DyestuffView>('/api/dyestuffs', { method: 'POST', json: input });

export function useCreateChemical() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: createChemical,
    onSuccess: () => qc.invalidateQueries({ queryKey: referenceKeys.all }),
  });
}
export function useCreateDyestuff() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: createDyestuff,
    onSuccess: () => qc.invalidateQueries({ queryKey: referenceKeys.all }),
  });
}
