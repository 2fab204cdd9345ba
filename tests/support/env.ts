import { env } from '../../server/env.ts';

// The test tools' own knobs, read once here (the app reads its configuration only in server/env.ts; lint keeps
// process.env out of everything else). SCREENSHOT_DIR: where browser tests save pictures for a human to look at.
export const testEnv = {
  screenshotDir: process.env.SCREENSHOT_DIR || null,
  screensDir: `${env.DATA_DIR}/screens`,
  benchSize: Number(process.env.BENCH_SIZE ?? 1),
  benchParts: (process.env.BENCH_PARTS ?? 'uniform,clustered,load,text').split(','),
  /** Seconds each load run lasts (tests/bench/load.bench.ts); the figures are for 60 s. */
  benchLoadSeconds: Number(process.env.BENCH_LOAD_SECONDS ?? 60),
  /** Which load runs to do (comma-separated labels, e.g. "search-visitor,list-researcher"); all by default. */
  benchLoadRuns: process.env.BENCH_LOAD_RUNS ? process.env.BENCH_LOAD_RUNS.split(',') : null,
};

/** The environment for an app server started as a child process by a test (tests/support/server.ts), with overrides. */
export const childEnv = (overrides: Record<string, string>): NodeJS.ProcessEnv => ({ ...process.env, ...overrides });
