import { Router } from 'express';
import { actorOf, requireUser } from '../../http/auth.ts';
import { loadHome } from './load.ts';

// GET /api/home: the signed-in person's landing page, one answer per role (shared/schemas/home.ts).
// Each section is what that role may already read elsewhere; visitors keep the public landing page.
export const homeRouter = Router();

homeRouter.get('/', requireUser, async (req, res) => {
  res.json(await loadHome(actorOf(req)!));
});
