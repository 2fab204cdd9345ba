import { Router } from 'express';
import { searchQuerySchema, shadeQuerySchema } from '../../../shared/schemas/search.ts';
import { actorOf } from '../../http/auth.ts';
import { forbidden } from '../../http/errors.ts';
import { parseQuery } from '../../http/validate.ts';
import { can } from '../../policies/index.ts';
import { runSearch, runShade } from '../../search/service.ts';

// Open to everyone (search:run); what each role may see is decided inside the service.
export const searchRouter = Router();

searchRouter.get('/', async (req, res) => {
  const input = parseQuery(searchQuerySchema, req);
  const actor = actorOf(req);
  if (!can(actor, 'search:run')) throw forbidden();
  res.json(await runSearch({ actor, input }));
});

searchRouter.get('/shade', async (req, res) => {
  const input = parseQuery(shadeQuerySchema, req);
  const actor = actorOf(req);
  if (!can(actor, 'search:run')) throw forbidden();
  res.json(await runShade({ actor, input }));
});
