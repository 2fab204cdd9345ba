import type { Model, ModelStatic, Transaction } from 'sequelize';
import { Analysis, PaletteColour, Photo, Piece, RecipeStep, Substitution, Trial } from '../models/index.ts';
import { appendChanges, type ChangeKind } from './change-log.ts';
import { searchEngine } from './engine.ts';

/**
 * Keeps search current from Sequelize model hooks, so routes written by anyone need not call search: every
 * write to a model search reads appends a row to the search change log *in the same transaction* (a
 * rolled-back write is never logged), and every app server applies the log (engine.ts).
 * Bulk writes (`Model.update(…, { where })`, `Model.destroy({ where })`, `restore`) first read which rows their
 * `where` names, in the same transaction, so the log always names rows and never asks for a whole reload.
 */
type Opts = {
  transaction?: Transaction | null;
  where?: unknown;
  attributes?: Record<string, unknown>;
  fields?: readonly PropertyKey[];
};

async function log(options: Opts | undefined, kind: ChangeKind, ids: Iterable<number | null | undefined>) {
  const t = options?.transaction ?? null;
  const n = await appendChanges(
    kind,
    [...ids].filter((x): x is number => typeof x === 'number'),
    t,
  );
  if (!n) return;
  if (t) t.afterCommit(() => searchEngine.poke());
  else searchEngine.poke();
}

// The keys a bulk call's `where` names, read before the write (WeakMap: the options object is the same for the
// before and after hooks of one call).
const bulkKeys = new WeakMap<object, number[]>();

function followBulk(model: ModelStatic<Model>, kind: ChangeKind, keyAttr: string, matters?: (o: Opts) => boolean) {
  const before = async (o: Opts) => {
    if (matters && !matters(o)) return;
    const rows = (await model.findAll({
      where: o.where as never,
      attributes: [keyAttr],
      transaction: o.transaction ?? undefined,
      paranoid: false,
      raw: true,
    })) as unknown as Record<string, number | null>[];
    const keys = rows.map((r) => r[keyAttr]).filter((x): x is number => typeof x === 'number');
    // An update that moves rows to another parent names the new parent too.
    const moved = o.attributes?.[keyAttr];
    if (typeof moved === 'number') keys.push(moved);
    bulkKeys.set(o, keys);
  };
  const after = async (o: Opts) => {
    const keys = bulkKeys.get(o);
    bulkKeys.delete(o);
    if (keys) await log(o, kind, keys);
  };
  model.addHook('beforeBulkUpdate', 'search', before);
  model.addHook('beforeBulkDestroy', 'search', before);
  model.addHook('afterBulkUpdate', 'search', after);
  model.addHook('afterBulkDestroy', 'search', after);
  if ((model.options as { paranoid?: boolean }).paranoid) {
    model.addHook('beforeBulkRestore', 'search', before);
    model.addHook('afterBulkRestore', 'search', after);
  }
}

function followRows(
  model: ModelStatic<Model>,
  kind: ChangeKind,
  keyAttr: string,
  matters?: (m: Model, o: Opts) => boolean,
) {
  // The key now and, for an update that moved the row, the key it had before.
  const keysOf = (m: Model) => [m.get(keyAttr) as number, m.previous(keyAttr) as number | undefined];
  const one = async (m: Model, o?: Opts) => {
    if (!matters || matters(m, o ?? {})) await log(o, kind, keysOf(m));
  };
  for (const h of ['afterCreate', 'afterUpdate', 'afterDestroy'] as const) model.addHook(h, 'search', one);
  if ((model.options as { paranoid?: boolean }).paranoid) model.addHook('afterRestore', 'search', one);
  model.addHook('afterBulkCreate', 'search', async (ms: Model[], o: Opts) =>
    log(
      o,
      kind,
      ms.map((m) => m.get(keyAttr) as number),
    ),
  );
}

let installed = false;

export function installSearchHooks() {
  if (installed) return;
  installed = true;
  const M = (m: unknown) => m as ModelStatic<Model>;

  followRows(M(Piece), 'piece', 'id');
  followBulk(M(Piece), 'piece', 'id');
  followRows(M(Trial), 'trial', 'id');
  followBulk(M(Trial), 'trial', 'id');
  for (const child of [RecipeStep, Substitution]) {
    followRows(M(child), 'trial', 'trialId');
    followBulk(M(child), 'trial', 'trialId');
  }
  // A photo matters to search only through the piece it belongs to (tile status, names… do not).
  const photoLinkChanged = (fields?: readonly PropertyKey[]) => !fields || fields.includes('pieceId');
  followRows(M(Photo), 'photo', 'id', (_m, o) => photoLinkChanged(o.fields));
  followBulk(M(Photo), 'photo', 'id', (o) => !o.attributes || 'pieceId' in o.attributes);
  followRows(M(PaletteColour), 'photo', 'photoId');
  followBulk(M(PaletteColour), 'photo', 'photoId');
  // An analysis's method is its piece's "identified by" facet value (issue 19): any write of one re-reads its piece.
  followRows(M(Analysis), 'piece', 'pieceId');
  followBulk(M(Analysis), 'piece', 'pieceId');
}
