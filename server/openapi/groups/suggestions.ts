import {
  recipeSuggestionQuery,
  recipeSuggestionsResponse,
  suggestionTrialSchema,
} from '../../../shared/schemas/suggestions.ts';
import { trialSavedAnswer } from '../../../shared/schemas/trial.ts';
import { defineRoutes } from '../registry.ts';

export default defineRoutes('suggestions', [
  {
    method: 'get',
    path: '/api/suggestions/recipes',
    summary:
      'Recipes to try for a target colour (typed L*a*b*, a palette colour, a region or a reading), from the nearest finished trials and from ladders interpolated in strength',
    roles: 'any signed-in role',
    query: recipeSuggestionQuery,
    responses: { 200: recipeSuggestionsResponse },
  },
  {
    method: 'post',
    path: '/api/suggestions/recipes/trials',
    summary: 'Make a planned trial from a suggestion: its recipe, its target and the evidence as notes, in one go',
    roles: 'dyer, admin',
    body: suggestionTrialSchema,
    responses: { 201: trialSavedAnswer },
  },
]);
