import { Router } from 'express';
import { recipeSuggestionQuery, suggestionTrialSchema } from '../../../shared/schemas/suggestions.ts';
import { actorOf, requireUser } from '../../http/auth.ts';
import { forbidden } from '../../http/errors.ts';
import { parseBody, parseQuery } from '../../http/validate.ts';
import { can } from '../../policies/index.ts';
import { withTrialCode } from '../../services/trials/code.ts';
import { createSuggestedTrial, suggestRecipes } from '../../services/suggestions/recipes.ts';
import { loadReadableTrial, presentTrialDetail } from '../trials/load.ts';

// Recipe suggestions rest on the studio's trials: for signed-in people, as trials are.
export const suggestionsRouter = Router();
suggestionsRouter.use(requireUser);

suggestionsRouter.get('/recipes', async (req, res) => {
  const q = parseQuery(recipeSuggestionQuery, req);
  if (!can(actorOf(req), 'trial:read')) throw forbidden();
  res.json(await suggestRecipes(q));
});

/** "Try this": a planned trial with the suggested recipe (dyers, who record trials). */
suggestionsRouter.post('/recipes/trials', async (req, res) => {
  const actor = actorOf(req)!;
  const input = parseBody(suggestionTrialSchema, req);
  if (!can(actor, 'trial:create')) throw forbidden('Only dyers record trials.');
  const created = await withTrialCode((transaction) => createSuggestedTrial({ actor, transaction, input }));
  const trial = await loadReadableTrial(actor, created.id);
  res.status(201).json({ trial: await presentTrialDetail(actor, trial), notified: false });
});
