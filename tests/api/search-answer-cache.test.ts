import { afterAll, describe, expect, it } from 'vitest';
import { sequelize } from '../../server/models/index.ts';
import { makePaletteColour, makePhoto, makePiece } from '../../server/seed/factories.ts';
import { searchEngine } from '../../server/search/engine.ts';
import { installSearchHooks } from '../../server/search/hooks.ts';
import { runSearch, runShade } from '../../server/search/service.ts';
import { searchQuerySchema, shadeQuerySchema } from '../../shared/schemas/search.ts';

// server/search/answer-cache.ts: equal questions asked while the indexes stay as they are share one answer; any
// change applied to either index (searchEngine.generation) makes the next answer fresh, and what the asker may see
// is part of the question.
afterAll(() => sequelize.close());
const curator = { id: 1, role: 'curator' as const };
const word = () => `zc${Date.now().toString(36)}${Math.random().toString(36).slice(2, 6)}`;

describe('search answer cache', () => {
  it('shares an answer until a write is applied, then answers afresh with it', async () => {
    installSearchHooks();
    const w = word();
    const piece = await makePiece({ title: `Cached ${w} chintz`, status: 'published' });
    const ask = (actor: typeof curator | null) => runSearch({ actor, input: searchQuerySchema.parse({ q: w }) });
    const first = await ask(null);
    expect(first.items.map((i) => i.id)).toEqual([piece.id]);
    expect(await ask(null)).toBe(first);
    // Another audience is another question.
    const staff = await ask(curator);
    expect(staff).not.toBe(first);

    const draft = await makePiece({ title: `Cached ${w} draft`, status: 'draft' });
    const g = searchEngine.generation;
    const visitor = await ask(null);
    expect(searchEngine.generation).toBeGreaterThan(g);
    expect(visitor).not.toBe(first);
    expect(visitor.items.map((i) => i.id)).toEqual([piece.id]);
    expect((await ask(curator)).items.map((i) => i.id).sort()).toEqual([piece.id, draft.id].sort());

    await piece.update({ status: 'draft' });
    expect((await ask(null)).items).toEqual([]);
  });

  it('shade answers follow a new photo at once', async () => {
    installSearchHooks();
    const piece = await makePiece({ status: 'published' });
    const q = shadeQuerySchema.parse({ L: 31.23, a: 11.11, b: -7.77, maxDeltaE: 0.5 });
    const before = await runShade({ actor: null, input: q });
    expect(await runShade({ actor: null, input: q })).toBe(before);
    const { photo } = await makePhoto({ pieceId: piece.id });
    await makePaletteColour({ photoId: photo.id, L: 31.23, a: 11.11, b: -7.77 });
    const after = await runShade({ actor: null, input: q });
    expect(after.items.map((i) => i.pieceId)).toContain(piece.id);
  });
});
