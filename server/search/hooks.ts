import type { Model, Transaction } from 'sequelize';
import { PaletteColour, Photo, Piece, RecipeStep, Substitution, Trial } from '../models/index.ts';
import { searchEngine, type Change } from './engine.ts';

/**
 * Keeps the search indexes current from Sequelize model hooks, so routes written
 * by anyone need not call search. Inside a transaction the change is applied
 * after commit (a rolled-back write never reaches the index).
 */
type Opts = { transaction?: Transaction | null; where?: unknown };

function later(options: Opts | undefined, fn: () => void) {
  const t = options?.transaction;
  if (t) t.afterCommit(fn);
  else fn();
}
const send = (options: Opts | undefined, ...changes: Change[]) =>
  later(options, () => changes.forEach((c) => searchEngine.enqueue(c)));

// Ids named in a bulk call's where clause ({ photoId: 3 } or { photoId: [3, 4] }); null when it says something else,
// and then the whole index is reloaded: bulk writes must name ids (README.md, invariant 2).
function idsFrom(where: unknown, key: string): number[] | null {
  const v = (where as Record<string, unknown> | undefined)?.[key];
  if (typeof v === 'number') return [v];
  if (Array.isArray(v) && v.every((x) => typeof x === 'number')) return v;
  return null;
}

let installed = false;

export function installSearchHooks() {
  if (installed) return;
  installed = true;

  const piece = (p: Piece, o?: Opts) => send(o, { kind: 'piece', id: p.id });
  Piece.addHook('afterCreate', 'search', piece);
  Piece.addHook('afterUpdate', 'search', piece);
  Piece.addHook('afterDestroy', 'search', piece);
  Piece.addHook('afterRestore', 'search', piece);
  Piece.addHook('afterBulkCreate', 'search', (ps: Piece[], o: Opts) =>
    send(o, ...ps.map((p) => ({ kind: 'piece' as const, id: p.id }))),
  );
  for (const h of ['afterBulkUpdate', 'afterBulkDestroy', 'afterBulkRestore'] as const)
    Piece.addHook(h, 'search', (o: Opts) => send(o, { kind: 'all-text' }));

  const trialId = (m: Model & { trialId?: number; id?: number }, isTrial: boolean) => (isTrial ? m.id! : m.trialId!);
  for (const [m, isTrial] of [
    [Trial, true],
    [RecipeStep, false],
    [Substitution, false],
  ] as const) {
    // The three models share the hook shapes used here; one loose type keeps the loop readable.
    const model = m as unknown as typeof Trial;
    const one = (m: Model, o?: Opts) => send(o, { kind: 'trial', id: trialId(m as never, isTrial) });
    model.addHook('afterCreate', 'search', one);
    model.addHook('afterUpdate', 'search', one);
    model.addHook('afterDestroy', 'search', one);
    model.addHook('afterBulkCreate', 'search', (ms: Model[], o: Opts) =>
      send(o, ...ms.map((m) => ({ kind: 'trial' as const, id: trialId(m as never, isTrial) }))),
    );
    for (const h of ['afterBulkUpdate', 'afterBulkDestroy'] as const) {
      model.addHook(h, 'search', (o: Opts) => {
        const ids = idsFrom(o.where, isTrial ? 'id' : 'trialId');
        if (ids) send(o, ...ids.map((id) => ({ kind: 'trial' as const, id })));
        else send(o, { kind: 'all-text' });
      });
    }
  }

  // Photo → piece links change the shade index directly; the palette follows the photo.
  const photo = (p: Photo, o?: Opts) => later(o, () => searchEngine.setPhoto(p.id, p.pieceId));
  Photo.addHook('afterCreate', 'search', photo);
  Photo.addHook('afterUpdate', 'search', photo);
  Photo.addHook('afterDestroy', 'search', (p: Photo, o: Opts) => later(o, () => searchEngine.setPhoto(p.id, null)));
  Photo.addHook('afterBulkCreate', 'search', (ps: Photo[], o: Opts) => ps.forEach((p) => photo(p, o)));
  for (const h of ['afterBulkUpdate', 'afterBulkDestroy'] as const)
    Photo.addHook(h, 'search', (o: Opts) => send(o, { kind: 'all-shade' }));

  const palette = (c: PaletteColour, o?: Opts) => {
    const ids = new Set(
      [c.photoId, c.previous('photoId') as number | undefined].filter((x): x is number => typeof x === 'number'),
    );
    send(o, ...[...ids].map((id) => ({ kind: 'photo-palette' as const, id })));
  };
  PaletteColour.addHook('afterCreate', 'search', palette);
  PaletteColour.addHook('afterUpdate', 'search', palette);
  PaletteColour.addHook('afterDestroy', 'search', palette);
  PaletteColour.addHook('afterBulkCreate', 'search', (cs: PaletteColour[], o: Opts) =>
    send(o, ...[...new Set(cs.map((c) => c.photoId))].map((id) => ({ kind: 'photo-palette' as const, id }))),
  );
  for (const h of ['afterBulkUpdate', 'afterBulkDestroy'] as const) {
    PaletteColour.addHook(h, 'search', (o: Opts) => {
      const ids = idsFrom(o.where, 'photoId');
      if (ids) send(o, ...ids.map((id) => ({ kind: 'photo-palette' as const, id })));
      else send(o, { kind: 'all-shade' });
    });
  }
}
