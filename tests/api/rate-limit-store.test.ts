import { afterAll, describe, expect, it } from 'vitest';
import type { Options } from 'express-rate-limit';
import { DatabaseRateLimitStore, sweepExpiredRateLimits } from '../../server/auth/rate-limit-store.ts';
import { RateLimit, sequelize } from '../../server/models/index.ts';

afterAll(() => sequelize.close());

const unique = () => `${Date.now().toString(36)}-${Math.random().toString(36).slice(2, 8)}`;
function store(windowMs = 60_000, prefix = `test-${unique()}`) {
  const s = new DatabaseRateLimitStore(prefix);
  s.init({ windowMs } as Options);
  return s;
}
const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

describe('rate-limit counters in MariaDB (express-rate-limit Store)', () => {
  it('counts hits per key, with the window end from the first hit', async () => {
    const s = store(60_000);
    const first = await s.increment('10.0.0.1');
    expect(first.totalHits).toBe(1);
    expect(first.resetTime!.getTime() - Date.now()).toBeGreaterThan(55_000);
    expect(first.resetTime!.getTime() - Date.now()).toBeLessThanOrEqual(61_000);
    expect((await s.increment('10.0.0.1')).totalHits).toBe(2);
    expect((await s.increment('10.0.0.2')).totalHits).toBe(1);
    expect((await s.get('10.0.0.1'))?.totalHits).toBe(2);
    expect(await s.get('never-seen')).toBeUndefined();
  });

  it('keeps limiters apart by prefix, and two stores with the same prefix share counts (two servers)', async () => {
    const prefix = `shared-${unique()}`;
    const a = store(60_000, prefix);
    const b = store(60_000, prefix);
    const other = store(60_000);
    await a.increment('k');
    await a.increment('k');
    expect((await b.increment('k')).totalHits).toBe(3);
    expect((await other.increment('k')).totalHits).toBe(1);
  });

  it('is atomic: concurrent increments each get their own count', async () => {
    const s = store(60_000);
    const counts = await Promise.all(Array.from({ length: 20 }, () => s.increment('burst')));
    expect(counts.map((c) => c.totalHits).sort((x, y) => x - y)).toEqual(Array.from({ length: 20 }, (_, i) => i + 1));
    expect((await s.get('burst'))?.totalHits).toBe(20);
  });

  it('decrements (a skipped successful request) but never below zero, and resets a key', async () => {
    const s = store(60_000);
    await s.increment('d');
    await s.increment('d');
    await s.decrement('d');
    expect((await s.get('d'))?.totalHits).toBe(1);
    await s.decrement('d');
    await s.decrement('d');
    expect((await s.get('d'))?.totalHits).toBe(0);
    await s.increment('d');
    await s.resetKey('d');
    expect(await s.get('d')).toBeUndefined();
    expect((await s.increment('d')).totalHits).toBe(1);
  });

  it('starts a new window once the old one has ended, and sweeps ended rows', async () => {
    const s = store(300);
    await s.increment('w');
    await s.increment('w');
    expect((await s.get('w'))?.totalHits).toBe(2);
    await sleep(450);
    expect(await s.get('w')).toBeUndefined();
    const again = await s.increment('w');
    expect(again.totalHits).toBe(1);
    expect(again.resetTime!.getTime()).toBeGreaterThan(Date.now());
    // A row whose window ended is removed by the sweep; live rows stay.
    const gone = store(200);
    await gone.increment('old');
    const live = store(60_000);
    await live.increment('live');
    await sleep(350);
    expect(await sweepExpiredRateLimits()).toBeGreaterThanOrEqual(1);
    expect((await live.get('live'))?.totalHits).toBe(1);
    expect(await RateLimit.count({ where: sequelize.literal('resetAt <= NOW(3)') })).toBe(0);
  });

  it('stores neither IP nor e-mail addresses, only a SHA-256 of limiter and key', async () => {
    const s = store(60_000);
    await s.increment('email:someone@example.test');
    const rows = await RateLimit.findAll({ raw: true });
    expect(rows.every((r) => /^[0-9a-f]{64}$/.test(r.keyHash))).toBe(true);
  });
});
