import { afterAll, describe, expect, it, vi } from 'vitest';
import { sequelize } from '../../server/models/index.ts';
import { makePaletteColour, makePhoto, makePiece } from '../../server/seed/factories.ts';
import { appendChanges, ChangeCursor } from '../../server/search/change-log.ts';
import { SearchEngine, searchEngine } from '../../server/search/engine.ts';
import { installSearchHooks } from '../../server/search/hooks.ts';
import { runSearch, runShade } from '../../server/search/service.ts';
import { searchQuerySchema, shadeQuerySchema } from '../../shared/schemas/search.ts';

// Issue 16: the search change log. AUTO_INCREMENT ids are handed out at insert, not at commit, so a reader must not
// skip an id that a slower transaction commits later; and a change that fails to apply must be retried.
afterAll(() => sequelize.close());

// Entity ids far above anything real, so rows written by other test files running at the same time are told apart.
const fake = () => 2_000_000_000 + Math.floor(Math.random() * 100_000_000);
const mine = (rows: { entityId: number }[], ...ids: number[]) =>
  rows.filter((r) => ids.includes(r.entityId)).map((r) => r.entityId);

async function readUntil(cursor: ChangeCursor, done: (seen: number[]) => boolean, ids: number[]) {
  const seen: number[] = [];
  for (let i = 0; i < 100 && !done(seen); i++) {
    seen.push(...mine((await cursor.read()).rows, ...ids));
    if (!done(seen)) await new Promise((r) => setTimeout(r, 100));
  }
  return seen;
}

describe('search change log', () => {
  it('reads a change committed late, after a later id was already read (a gap), exactly once', async () => {
    const cursor = new ChangeCursor();
    await cursor.start();
    const [slow, fast] = [fake(), fake()];
    const t = await sequelize.transaction();
    await appendChanges('piece', [slow], t); // takes the lower id, not committed yet
    await appendChanges('piece', [fast]); // a higher id, committed at once
    expect(mine((await cursor.read()).rows, slow, fast)).toEqual([fast]);
    expect(cursor.gaps.length).toBeGreaterThan(0);
    await t.commit();
    const later = await readUntil(cursor, (s) => s.includes(slow), [slow, fast]);
    expect(later).toEqual([slow]);
  });

  it('closes the gap of a rolled-back transaction once no transaction that could fill it is running', async () => {
    const cursor = new ChangeCursor();
    await cursor.start();
    const [gone, kept] = [fake(), fake()];
    const t = await sequelize.transaction();
    await appendChanges('piece', [gone], t);
    await appendChanges('piece', [kept]);
    await cursor.read();
    const gap = cursor.gaps.length;
    expect(gap).toBeGreaterThan(0);
    await t.rollback();
    for (let i = 0; i < 100 && cursor.gaps.length; i++) {
      await cursor.read();
      if (cursor.gaps.length) await new Promise((r) => setTimeout(r, 100));
    }
    expect(cursor.gaps).toEqual([]);
  });

  it('logs a write only when its transaction commits', async () => {
    installSearchHooks();
    const cursor = new ChangeCursor();
    await cursor.start();
    const t = await sequelize.transaction();
    const rolledBack = await makePiece({ title: 'Never committed' }, t);
    await t.rollback();
    const committed = await makePiece({ title: 'Committed' });
    const seen = await readUntil(cursor, (s) => s.includes(committed.id), [rolledBack.id, committed.id]);
    expect(seen).toEqual([committed.id]);
  });

  it('keeps a change that failed to apply and applies it on the next try', async () => {
    installSearchHooks();
    await searchEngine.ready();
    const word = `retry${Date.now().toString(36)}`;
    const query = sequelize.query.bind(sequelize);
    const spy = vi.spyOn(sequelize, 'query').mockImplementation(((sql: unknown, opts: unknown) => {
      if (typeof sql === 'string' && sql.includes('FROM pieces WHERE id IN'))
        return Promise.reject(new Error('simulated lost connection'));
      return query(sql as string, opts as never);
    }) as typeof sequelize.query);
    const piece = await makePiece({ title: `Lost ${word} stripe`, status: 'published' });
    await expect(searchEngine.sync()).rejects.toThrow('simulated lost connection');
    expect(searchEngine.status()).toMatchObject({ lastError: 'simulated lost connection' });
    expect(searchEngine.status().pending).toBeGreaterThan(0);
    spy.mockRestore();
    const res = await runSearch({ actor: null, input: searchQuerySchema.parse({ q: word }) });
    expect(res.items.map((i) => i.id)).toEqual([piece.id]);
    expect(searchEngine.status()).toMatchObject({ lastError: null });
  });

  it('a server that is still loading answers search with 503 search_warming and Retry-After, never stale', async () => {
    const engine = new SearchEngine();
    engine.startFollowing();
    try {
      await expect(engine.settled()).rejects.toMatchObject({ status: 503, code: 'search_warming', retryAfterS: 5 });
      await engine.ready();
      await expect(engine.settled()).resolves.toBeUndefined();
    } finally {
      engine.stopFollowing();
    }
  });

  it("indexes each photo's most trustworthy palette only: corrected colours replace the raw ones", async () => {
    installSearchHooks();
    await searchEngine.ready();
    const piece = await makePiece({ status: 'published' });
    const { photo } = await makePhoto({ pieceId: piece.id, hex: '#5d7a3c' });
    const shade = async (hex: string) =>
      (await runShade({ actor: null, input: shadeQuerySchema.parse({ hex, maxDeltaE: 0.5 }) })).items.map(
        (i) => i.pieceId,
      );
    expect(await shade('#5d7a3c')).toContain(piece.id);
    await makePaletteColour({ photoId: photo.id, variant: 'corrected', hex: '#3c5d7a' });
    expect(await shade('#3c5d7a')).toContain(piece.id);
    expect(await shade('#5d7a3c')).not.toContain(piece.id);
  });
});
