import { Router } from 'express';
import { idParams } from '../../../shared/schemas/common.ts';
import { savedSearchCreateSchema } from '../../../shared/schemas/saved-search.ts';
import { actorOf, requireUser } from '../../http/auth.ts';
import { notFound } from '../../http/errors.ts';
import { parseBody, parseParams } from '../../http/validate.ts';
import { SavedSearch, sequelize } from '../../models/index.ts';
import { presentSavedSearch } from '../../presenters/saved-search.ts';
import { deleteSavedSearch, saveSearch } from '../../services/saved-searches.ts';

// A person's own saved searches: every signed-in role may keep them; another person's answers 404 (admins too,
// since a saved search is a private bookmark, not a record of the archive).
export const savedSearchesRouter = Router();

const signedInActor = (req: Parameters<typeof actorOf>[0]) => actorOf(req)!;

savedSearchesRouter.get('/', requireUser, async (req, res) => {
  const actor = signedInActor(req);
  const rows = await SavedSearch.findAll({
    where: { userId: actor.id },
    order: [
      ['name', 'ASC'],
      ['id', 'ASC'],
    ],
  });
  res.json({ items: rows.map(presentSavedSearch) });
});

savedSearchesRouter.post('/', requireUser, async (req, res) => {
  const actor = signedInActor(req);
  const input = parseBody(savedSearchCreateSchema, req);
  const saved = await sequelize.transaction((transaction) => saveSearch({ actor, transaction, input }));
  res.status(201).json({ savedSearch: presentSavedSearch(saved) });
});

savedSearchesRouter.delete('/:id', requireUser, async (req, res) => {
  const actor = signedInActor(req);
  const { id } = parseParams(idParams, req);
  const saved = await SavedSearch.findOne({ where: { id, userId: actor.id } });
  if (!saved) throw notFound('Saved search');
  await sequelize.transaction((transaction) => deleteSavedSearch({ actor, transaction, input: { saved } }));
  res.status(204).end();
});
