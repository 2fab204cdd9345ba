import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { RecipeSuggestionsResponse, SuggestionTrialInput } from '../../../shared/schemas/suggestions';
import type { TrialView } from '../../../shared/schemas/trial';
import { http } from '../../lib/http';
import { trialKeys } from '../trials';

/** What the suggestions are for: one target (a palette colour, a region, a reading or typed L*a*b*) and a dry mass. */
export type SuggestionTarget = Partial<
  Record<'paletteColourId' | 'regionId' | 'measurementId' | 'L' | 'a' | 'b', number>
> & { dryMassG?: number };

export const suggestionKeys = {
  all: ['suggestions'] as const,
  recipes: (t: SuggestionTarget) => [...suggestionKeys.all, 'recipes', t] as const,
};

const queryString = (t: SuggestionTarget) =>
  new URLSearchParams(
    Object.entries(t)
      .filter(([, v]) => v != null && Number.isFinite(v))
      .map(([k, v]) => [k, String(v)]),
  ).toString();

export const recipeSuggestionsQuery = (t: SuggestionTarget) =>
  queryOptions({
    queryKey: suggestionKeys.recipes(t),
    queryFn: () => http<RecipeSuggestionsResponse>(`/api/suggestions/recipes?${queryString(t)}`),
  });
export const useRecipeSuggestions = (t: SuggestionTarget, enabled = true) =>
  useQuery({ ...recipeSuggestionsQuery(t), enabled });

/** "Try this": a planned trial with the suggested recipe. */
export function useTrySuggestion() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: SuggestionTrialInput) =>
      http<{ trial: TrialView }>('/api/suggestions/recipes/trials', { method: 'POST', json: input }),
    onSuccess: () =>
      Promise.all([
        qc.invalidateQueries({ queryKey: trialKeys.lists() }),
        qc.invalidateQueries({ queryKey: [...trialKeys.all, 'piece'] }),
      ]),
  });
}
