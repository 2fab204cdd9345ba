import { createHash } from 'node:crypto';
import { QueryTypes, type Sequelize } from 'sequelize';
import type { ClientRateLimitInfo, IncrementResponse, Options, Store } from 'express-rate-limit';
import { RateLimit, sequelize as defaultSequelize } from '../models/index.ts';

/** How often one process sweeps rows whose window has ended (common practice: cheap, bounded table growth). */
const SWEEP_EVERY_MS = 60_000;

/**
 * An express-rate-limit Store (its documented Store interface: init, get, increment, decrement, resetKey) that keeps
 * the counters in MariaDB, so every app server sharing the database sees the same counts and a restart forgets
 * nothing. Times come from the database clock (NOW(3)), so servers with drifting clocks still agree on windows.
 * Each limiter needs its own store (express-rate-limit refuses a shared one); `prefix` keeps their keys apart.
 */
export class DatabaseRateLimitStore implements Store {
  readonly prefix: string;
  readonly localKeys = false;
  private windowMs = 60_000;
  private lastSweep = 0;
  private readonly sequelize: Sequelize;

  constructor(prefix: string, sequelize: Sequelize = defaultSequelize) {
    this.prefix = prefix;
    this.sequelize = sequelize;
  }

  init(options: Options) {
    this.windowMs = options.windowMs;
  }

  /** Only a SHA-256 of limiter and key is stored: no IP or e-mail address sits in the table. */
  private hash(key: string) {
    return createHash('sha256').update(`${this.prefix}\u0000${key}`).digest('hex');
  }

  private static info(hits: number, msLeft: number): ClientRateLimitInfo {
    return { totalHits: Number(hits), resetTime: new Date(Date.now() + Math.max(0, Number(msLeft))) };
  }

  async get(key: string): Promise<ClientRateLimitInfo | undefined> {
    const [row] = await this.sequelize.query<{ hits: number; msLeft: number }>(
      'SELECT hits, TIMESTAMPDIFF(MICROSECOND, NOW(3), resetAt) / 1000 AS msLeft FROM rate_limits WHERE keyHash = ? AND resetAt > NOW(3)',
      { replacements: [this.hash(key)], type: QueryTypes.SELECT },
    );
    return row ? DatabaseRateLimitStore.info(row.hits, row.msLeft) : undefined;
  }

  /**
   * One atomic upsert: a new key or one whose window has ended starts again at 1 with a fresh window; otherwise
   * hits + 1. The row lock taken by the upsert is held until the read in the same transaction, so the count read
   * back is this request's own. (MariaDB applies the SET list left to right: hits is decided before resetAt moves.)
   */
  async increment(key: string): Promise<IncrementResponse> {
    const keyHash = this.hash(key);
    const micros = this.windowMs * 1000;
    const row = await this.sequelize.transaction(async (transaction) => {
      await this.sequelize.query(
        `INSERT INTO rate_limits (keyHash, hits, resetAt) VALUES (?, 1, NOW(3) + INTERVAL ? MICROSECOND)
         ON DUPLICATE KEY UPDATE
           hits = IF(resetAt <= NOW(3), 1, hits + 1),
           resetAt = IF(resetAt <= NOW(3), NOW(3) + INTERVAL ? MICROSECOND, resetAt)`,
        { replacements: [keyHash, micros, micros], transaction },
      );
      const [r] = await this.sequelize.query<{ hits: number; msLeft: number }>(
        'SELECT hits, TIMESTAMPDIFF(MICROSECOND, NOW(3), resetAt) / 1000 AS msLeft FROM rate_limits WHERE keyHash = ?',
        { replacements: [keyHash], type: QueryTypes.SELECT, transaction },
      );
      return r;
    });
    this.maybeSweep();
    return DatabaseRateLimitStore.info(row.hits, row.msLeft);
  }

  /** Undo one hit (express-rate-limit calls this for skipped successful requests); never below zero. */
  async decrement(key: string): Promise<void> {
    await this.sequelize.query(
      'UPDATE rate_limits SET hits = IF(hits > 0, hits - 1, 0) WHERE keyHash = ? AND resetAt > NOW(3)',
      { replacements: [this.hash(key)] },
    );
  }

  async resetKey(key: string): Promise<void> {
    await RateLimit.destroy({ where: { keyHash: this.hash(key) } });
  }

  /** Delete rows whose window ended, at most once a minute per process; a failure only delays the sweep. */
  private maybeSweep() {
    const now = Date.now();
    if (now - this.lastSweep < SWEEP_EVERY_MS) return;
    this.lastSweep = now;
    void sweepExpiredRateLimits(this.sequelize).catch(() => {});
  }
}

/** Remove every counter whose window has ended (they would be restarted at 1 anyway). Returns rows removed. */
export async function sweepExpiredRateLimits(sequelize: Sequelize = defaultSequelize): Promise<number> {
  const removed: unknown = await sequelize.query('DELETE FROM rate_limits WHERE resetAt <= NOW(3)', {
    type: QueryTypes.BULKDELETE,
  });
  return Number(removed) || 0;
}
