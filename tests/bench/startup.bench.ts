import type { Bench, BenchResult } from './index.ts';
import { clusteredColour, insertPalettes, insertPieces } from './search-data.ts';
import { testEnv } from '../support/env.ts';

/**
 * Issue 16, start fast then warm: an app server process (server/index.ts, as `npm start` runs it) on an archive of
 * 166,667 pieces and 1,000,000 palette colours. Measured from the spawn: the first answer of /api/health (target
 * ≤ 5 s: every route answers, search with 503 search_warming until its indexes are in), what search answers while
 * warming, and when both indexes are loaded (target ≤ 20 s for the load itself).
 */
const SIZE = testEnv.benchSize;
const PIECES = Math.round(166_667 * SIZE);

export const startupBench: Bench = {
  name: 'startup',
  async run() {
    const { migrate } = await import('../../server/db/setup.ts');
    const { freePort, startServerProcess } = await import('../support/server.ts');
    await migrate();
    const photoIds = await insertPieces(PIECES);
    await insertPalettes(photoIds, 6, clusteredColour);
    const port = await freePort();
    const url = `http://127.0.0.1:${port}`;
    const t0 = performance.now();
    const server = await startServerProcess(port, 180_000, {}, { waitForSearch: false });
    const serving = performance.now() - t0;
    let firstHealth = NaN;
    const warming: number[] = [];
    let loaded = NaN;
    try {
      for (;;) {
        const h = await fetch(`${url}/api/health`).catch(() => null);
        if (h && Number.isNaN(firstHealth)) firstHealth = performance.now() - t0;
        const body = h
          ? ((await h.json()) as { search: { text: { loaded: boolean }; shade: { loaded: boolean } } })
          : null;
        if (body?.search.text.loaded && body.search.shade.loaded) {
          loaded = performance.now() - t0;
          break;
        }
        const s = await fetch(`${url}/api/search?q=madder`).catch(() => null);
        if (s) warming.push(s.status);
        await new Promise((r) => setTimeout(r, 250));
      }
    } finally {
      await server.stop();
    }
    const statuses = [...new Set(warming)].join(', ') || 'none (loaded before the first try)';
    const out: BenchResult[] = [
      { metric: 'startup: archive', value: PIECES, unit: `pieces (${PIECES * 6} colours)` },
      { metric: 'startup: listening', value: serving / 1000, unit: 's from spawn' },
      {
        metric: 'startup: first /api/health answer',
        value: firstHealth / 1000,
        unit: 's from spawn',
        target: '≤ 5 s',
        pass: firstHealth <= 5000,
      },
      { metric: 'startup: search while warming', value: warming.length, unit: `answers, status ${statuses}` },
      {
        metric: 'startup: indexes loaded',
        value: loaded / 1000,
        unit: 's from spawn',
        target: '≤ 20 s (load)',
        pass: loaded <= 20_000,
      },
    ];
    return out;
  },
};
