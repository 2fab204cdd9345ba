import { loadavg } from 'node:os';
import autocannon from 'autocannon';
import type { Bench, BenchResult } from './index.ts';
import { insertPieces } from './search-data.ts';
import { testEnv } from '../support/env.ts';

/**
 * The read routes under load (issue 16, points 7 and 9): 200 connections for BENCH_LOAD_SECONDS (60 by default) on
 * the text search route and on the archive list, each as a visitor and as a signed-in researcher (session cookie),
 * against a separate app server process (server/index.ts, as in production) on the full-size archive of
 * search-data.ts (166,667 pieces; BENCH_SIZE scales it down). Targets: the list reaches at least half the search
 * route's throughput with p99 under 300 ms and no errors (point 9); no request waits more than 2 s (point 7).
 * The machine's load average is printed beside each run: on a shared 2-core machine the figures are noisy.
 */
const SIZE = testEnv.benchSize;
const PIECES = Math.round(166_667 * SIZE);
const CONNECTIONS = 200;
const SECONDS = testEnv.benchLoadSeconds;
const PASSWORD = 'bench researcher passphrase';

type Run = { label: string; path: string; cookie: boolean };
const RUNS: Run[] = [
  { label: 'search-visitor', path: '/api/search?q=madder', cookie: false },
  { label: 'list-visitor', path: '/api/pieces', cookie: false },
  { label: 'search-researcher', path: '/api/search?q=madder', cookie: true },
  { label: 'list-researcher', path: '/api/pieces', cookie: true },
  // Informational: deep pages and every sort order, as people page through the archive.
  { label: 'list-researcher-mixed', path: '/api/pieces', cookie: true },
];
const SORTS = ['accessionNumber', 'title', 'objectName', 'earliestYear', 'updatedAt', 'createdAt'];

const load = () =>
  loadavg()
    .map((x) => x.toFixed(2))
    .join(' ');

async function prepareData() {
  const { sequelize } = await import('../../server/models/index.ts');
  const [{ n }] = (await sequelize.query('SELECT COUNT(*) AS n FROM pieces', { type: 'SELECT' })) as Array<{
    n: number;
  }>;
  if (Number(n) >= PIECES) return Number(n);
  await insertPieces(PIECES - Number(n));
  // Some drafts (hidden from visitors) and some soft-deleted pieces (hidden from everyone), as an archive has.
  await sequelize.query("UPDATE pieces SET status = 'draft' WHERE id % 20 = 0");
  await sequelize.query('UPDATE pieces SET deletedAt = NOW() WHERE id % 97 = 0');
  // The bench's photos have no files: marked as tiled so the server does not queue 166,667 tiling jobs at start.
  await sequelize.query("UPDATE photos SET ingestStage = 'done'");
  return PIECES;
}

async function signIn(url: string) {
  const { User } = await import('../../server/models/index.ts');
  const { makeUser } = await import('../../server/seed/factories.ts');
  const email = 'bench-researcher@example.test';
  if (!(await User.findOne({ where: { email } }))) await makeUser({ email, role: 'researcher', password: PASSWORD });
  const res = await fetch(`${url}/api/auth/login`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json', Origin: url },
    body: JSON.stringify({ email, password: PASSWORD }),
  });
  if (res.status !== 200) throw new Error(`sign-in: ${res.status} ${await res.text()}`);
  const cookie = res.headers.get('set-cookie')?.split(';')[0];
  if (!cookie) throw new Error('sign-in: no session cookie');
  return cookie;
}

function fire(url: string, run: Run, cookie: string, seconds: number, connections = CONNECTIONS) {
  let n = 0;
  return autocannon({
    url: `${url}${run.path}`,
    connections,
    duration: seconds,
    timeout: 10,
    headers: run.cookie ? { cookie } : {},
    requests:
      run.label === 'list-researcher-mixed'
        ? [
            {
              setupRequest: (req) => {
                n++;
                const sort = SORTS[n % SORTS.length];
                const page = 1 + ((n * 7919) % 400);
                return { ...req, path: `/api/pieces?sort=${sort}&dir=${n % 2 ? 'asc' : 'desc'}&page=${page}` };
              },
            },
          ]
        : undefined,
  });
}

export const loadBench: Bench = {
  name: 'load',
  async run() {
    const { migrate } = await import('../../server/db/setup.ts');
    const { startServerProcess, freePort } = await import('../support/server.ts');
    await migrate();
    const out: BenchResult[] = [];
    const t0 = performance.now();
    const pieces = await prepareData();
    out.push({ metric: 'setup: pieces', value: (performance.now() - t0) / 1000, unit: `s (${pieces} pieces)` });
    const port = await freePort();
    // Production mode: no contract checks on answers (those run in tests only), warnings-only logs.
    const server = await startServerProcess(port, 600_000, {
      NODE_ENV: 'production',
      SESSION_SECRET: 'bench-only-session-secret-0123456789',
      LOG_LEVEL: 'warn',
      SEED: 'none',
    });
    try {
      const cookie = await signIn(server.url);
      const rps: Record<string, number> = {};
      for (const run of RUNS) {
        if (testEnv.benchLoadRuns && !testEnv.benchLoadRuns.includes(run.label)) continue;
        await fire(server.url, run, cookie, 3, 20); // warm-up, untimed
        const before = load();
        const r = await fire(server.url, run, cookie, SECONDS);
        const la = `load avg before ${before}, after ${load()}`;
        rps[run.label] = r.requests.average;
        const bad = r.errors + r.timeouts + r.non2xx;
        out.push(
          { metric: `${run.label}: requests/s`, value: r.requests.average, unit: `req/s (${la})` },
          {
            metric: `${run.label}: latency p50 / p99`,
            value: r.latency.p50,
            unit: `ms / ${r.latency.p99} ms`,
            ...(run.label.startsWith('list') && run.label !== 'list-researcher-mixed'
              ? { target: 'p99 < 300', pass: r.latency.p99 < 300 }
              : {}),
          },
          {
            metric: `${run.label}: slowest request`,
            value: r.latency.max,
            unit: 'ms',
            target: '≤ 2000',
            pass: r.latency.max <= 2000 && r.timeouts === 0,
          },
          {
            metric: `${run.label}: errors / timeouts / non-2xx`,
            value: bad,
            unit: `(${r.errors} errors, ${r.timeouts} timeouts, ${r.non2xx} non-2xx of ${r.requests.total})`,
            target: '0',
            pass: bad === 0,
          },
        );
      }
      for (const who of ['visitor', 'researcher']) {
        const list = rps[`list-${who}`];
        const search = rps[`search-${who}`];
        if (list === undefined || search === undefined) continue;
        out.push({
          metric: `list / search throughput, ${who}`,
          value: list / search,
          unit: `× (${list.toFixed(0)} / ${search.toFixed(0)} req/s)`,
          target: '≥ 0.5',
          pass: list / search >= 0.5,
        });
      }
    } finally {
      await server.stop();
    }
    return out;
  },
};
