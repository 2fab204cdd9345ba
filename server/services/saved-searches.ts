import type { SavedSearchCreateInput } from '../../shared/schemas/saved-search.ts';
import { SAVED_SEARCHES_MAX } from '../../shared/schemas/saved-search.ts';
import { conflict } from '../http/errors.ts';
import { SavedSearch } from '../models/index.ts';
import { audit } from './audit.ts';
import type { SignedInCtx } from './context.ts';

/** Save a search under a name; each name once per person, and a bounded number each. */
export async function saveSearch({ actor, transaction, input }: SignedInCtx<SavedSearchCreateInput>) {
  const mine = await SavedSearch.findAll({
    where: { userId: actor.id },
    attributes: ['id', 'name'],
    transaction,
    lock: transaction.LOCK.UPDATE,
  });
  if (mine.some((s) => s.name.toLowerCase() === input.name.toLowerCase())) {
    const message = `You already have a search called “${input.name}”; choose another name.`;
    throw conflict(message, { fields: { name: [message] } });
  }
  if (mine.length >= SAVED_SEARCHES_MAX)
    throw conflict(`You have ${SAVED_SEARCHES_MAX} saved searches; delete one before saving another.`);
  const saved = await SavedSearch.create({ userId: actor.id, name: input.name, query: input.query }, { transaction });
  await audit({ actor, transaction }, 'saved-search', saved.id, 'create', {
    name: { from: null, to: saved.name },
    query: { from: null, to: saved.query },
  });
  return saved;
}

export async function deleteSavedSearch({ actor, transaction, input }: SignedInCtx<{ saved: SavedSearch }>) {
  await input.saved.destroy({ transaction });
  await audit({ actor, transaction }, 'saved-search', input.saved.id, 'delete', {
    name: { from: input.saved.name, to: null },
  });
}
