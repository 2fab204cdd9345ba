import { QueryTypes } from 'sequelize';
import { sequelize } from '../models/index.ts';
import { env, isTest } from '../env.ts';
import { HttpError } from '../http/errors.ts';
import { fairTurn } from '../http/fair-turns.ts';
import { logger } from '../log/index.ts';
import { ChangeCursor, pruneChanges, type ChangeRow } from './change-log.ts';
import { loadAll, loadPieces, loadTrials } from './docs.ts';
import { readShade } from './read.ts';
import { facetTableFor } from './facet-table.ts';
import { ShadeIndex, type ShadeRow } from './shade-index.ts';
import { TextIndex } from './text-index.ts';
import { VARIANT_TRUST } from '../../shared/schemas/chart.ts';

/**
 * The search engine: the text index and the shade index, loaded from MariaDB and then kept current by the
 * search change log (change-log.ts), which every write that affects search appends to in its own transaction
 * (hooks.ts). Every app server follows the log: it polls every SEARCH_POLL_MS, and every search first catches
 * up (`settled()`: one read of the log, shared by the searches waiting at that moment), so a search sees every
 * write committed before it on any server. A change that fails to apply stays pending and is retried.
 */
const SYNC_WAIT_MS = env.SEARCH_SYNC_WAIT_MS ?? (isTest ? 60_000 : 1_000);
/** Above these, a batch of changes is applied by reloading that index (an import of thousands of rows). */
const PIECE_BATCH_RELOAD = 20_000;
const PHOTO_BATCH_RELOAD = 500;
/** Seconds a client is asked to wait while the indexes load after a start (common practice: a few seconds). */
export const WARMING_RETRY_AFTER_S = 5;

const key = (c: { kind: string; entityId: number }) => `${c.kind}:${c.entityId}`;

/**
 * Palette variants from most to least trustworthy: shade search indexes only each photo's best one (a photo with a
 * grey-patch correction is found by its corrected colours, not also by the raw ones it replaces).
 */
const trustRank = (v: string) => {
  const i = (VARIANT_TRUST as readonly string[]).indexOf(v);
  return i < 0 ? VARIANT_TRUST.length : i;
};
type VariantRow = ShadeRow & { variant: string };

/** Keep each photo's colours of its most trustworthy variant only. */
export function bestVariantOnly(rows: VariantRow[]): ShadeRow[] {
  const best = new Map<number, number>();
  for (const r of rows) {
    const k = trustRank(r.variant);
    if (k < (best.get(r.photoId) ?? Infinity)) best.set(r.photoId, k);
  }
  return rows.filter((r) => trustRank(r.variant) === best.get(r.photoId));
}

export class SearchEngine {
  readonly text = new TextIndex();
  readonly shade = new ShadeIndex();
  private cursor = new ChangeCursor();
  private loading: Promise<void> | null = null;
  private loaded = false;
  /** Read from the log, not yet applied (a failed apply leaves them here for the next try). */
  private pending = new Map<string, ChangeRow>();
  private syncing: Promise<void> | null = null;
  private nextSync: Promise<void> | null = null;
  private timer: NodeJS.Timeout | null = null;
  /** Started by the running server: searches answer 503 until the indexes are loaded instead of waiting. */
  private background = false;
  private lastSyncAt: number | null = null;
  private lastPruneAt = 0;
  private lastError: string | null = null;
  /** Bumped on every change to the piece documents; caches key on it. */
  version = 0;
  /** Bumped on every change to either index (answer-cache.ts keys whole answers on it). */
  generation = 0;
  /** When each index was last loaded or changed (ms since epoch; null before its first load), for /api/health. */
  textUpdatedAt: number | null = null;
  shadeUpdatedAt: number | null = null;

  /** What /api/health reports: whether each index is loaded, when it last changed, and how far behind the log. */
  status() {
    return {
      textUpdatedAt: this.textUpdatedAt,
      shadeUpdatedAt: this.shadeUpdatedAt,
      pending: this.pending.size,
      logPosition: this.cursor.high,
      sinceSyncMs: this.lastSyncAt === null ? null : Math.max(0, Date.now() - this.lastSyncAt),
      lastError: this.lastError,
    };
  }

  /** Load both indexes (once); later calls wait for the same load. */
  ready(): Promise<void> {
    this.loading ??= this.load().catch((err) => {
      this.loading = null;
      throw err;
    });
    return this.loading;
  }

  get started() {
    return this.loading !== null;
  }

  private async load() {
    // The log position first: whatever commits during the load is read from the log afterwards (applying a
    // change twice is harmless: each one re-reads its row as it stands).
    await this.cursor.start();
    await Promise.all([this.reloadText(), this.reloadShade()]);
    this.loaded = true;
    this.lastSyncAt = Date.now();
  }

  /**
   * The running server (server/index.ts): load in the background and follow the log every SEARCH_POLL_MS.
   * Until the load ends, searches answer 503 search_warming with Retry-After rather than wait or answer stale.
   */
  startFollowing() {
    this.background = true;
    const t0 = Date.now();
    this.ready().then(
      () => logger.info({ ms: Date.now() - t0 }, '[search] indexes loaded'),
      (err) => {
        logger.error({ err }, '[search] index load failed; retrying in 5 s');
        setTimeout(() => this.startFollowing(), 5_000).unref();
      },
    );
    this.timer ??= setInterval(() => {
      if (this.loaded) this.sync().catch(() => {});
    }, env.SEARCH_POLL_MS);
    this.timer.unref();
  }

  stopFollowing() {
    if (this.timer) clearInterval(this.timer);
    this.timer = null;
  }

  /** Read everything again from MariaDB (the benchmark between data sets). */
  async reloadAll() {
    if (!this.loading) return this.ready();
    await this.cursor.start();
    await Promise.all([this.reloadText(), this.reloadShade()]);
  }

  private async reloadText() {
    const { pieces, trials } = await loadAll();
    this.text.load(pieces, trials);
    this.version++;
    this.generation++;
    // Built here rather than by the first search after start-up (about a second at 170,000 pieces).
    facetTableFor(this.text, this.version);
    this.textUpdatedAt = Date.now();
  }

  private async reloadShade() {
    const { colours, photos } = await readShade();
    this.shade.load(colours, photos);
    this.shadeUpdatedAt = Date.now();
    this.generation++;
  }

  /** A write committed on this server: catch up soon rather than at the next tick. */
  poke() {
    if (this.loaded) setImmediate(() => this.sync().catch(() => {}));
  }

  /**
   * Read the log and apply it. Calls that arrive while a read is under way share the *next* read (which starts
   * after the current one ends), so each caller sees every write committed before it called, and the database
   * gets one log read at a time however many searches are waiting.
   */
  sync(): Promise<void> {
    if (!this.syncing) {
      this.syncing = this.catchUp().finally(() => {
        this.syncing = null;
      });
      return this.syncing;
    }
    this.nextSync ??= this.syncing
      .catch(() => {})
      .then(() => {
        this.nextSync = null;
        return this.sync();
      });
    return this.nextSync;
  }

  private async catchUp() {
    try {
      const stale =
        this.lastSyncAt !== null && Date.now() - this.lastSyncAt > (env.SEARCH_LOG_KEEP_HOURS * 3_600_000) / 2;
      if (stale) {
        // Asleep for longer than the log is sure to be kept (a paused process): start again from the database.
        logger.warn('[search] behind the change log for too long; reloading the indexes');
        await this.reloadAll();
        this.pending.clear();
      }
      for (;;) {
        const { rows, more, gapsGivenUp } = await this.cursor.read();
        if (gapsGivenUp) logger.warn({ gapsGivenUp }, '[search] too many open gaps in the change log; oldest given up');
        for (const r of rows) this.pending.set(key(r), r);
        if (!more) break;
      }
      await this.apply();
      this.lastSyncAt = Date.now();
      this.lastError = null;
      if (Date.now() - this.lastPruneAt > 3_600_000) {
        this.lastPruneAt = Date.now();
        await pruneChanges(env.SEARCH_LOG_KEEP_HOURS).catch((err) => logger.warn({ err }, '[search] log prune'));
      }
    } catch (err) {
      this.lastError = err instanceof Error ? err.message : String(err);
      logger.error({ err, pending: this.pending.size }, '[search] change log not applied; retrying');
      throw err;
    }
  }

  /** Apply the pending changes; each one is dropped only once it is in the index. */
  private async apply() {
    if (!this.pending.size) return;
    const of = (kind: string) => [...this.pending.values()].filter((c) => c.kind === kind).map((c) => c.entityId);
    const done = (kind: string, ids: Iterable<number>) => {
      for (const id of ids) this.pending.delete(`${kind}:${id}`);
    };
    const trials = of('trial');
    const pieces = new Set(of('piece'));
    const photos = of('photo');
    if (trials.length + pieces.size > PIECE_BATCH_RELOAD) {
      await this.reloadText();
      done('trial', trials);
      done('piece', pieces);
    } else {
      // A trial's modern mordants and dyestuffs are facets of its piece: its piece (before and after) follows.
      for (let i = 0; i < trials.length; i += 5000) {
        const ids = trials.slice(i, i + 5000);
        const docs = await loadTrials(ids);
        for (const id of ids) {
          const before = this.text.trials.get(id)?.pieceId;
          const doc = docs.get(id) ?? null;
          this.text.setTrial(id, doc);
          for (const p of [before, doc?.pieceId]) if (p != null) pieces.add(p);
        }
        done('trial', ids);
        this.version++;
        this.generation++;
        this.textUpdatedAt = Date.now();
      }
      const all = [...pieces];
      for (let i = 0; i < all.length; i += 5000) {
        const ids = all.slice(i, i + 5000);
        const docs = await loadPieces(ids);
        for (const id of ids) this.text.setPiece(id, docs.get(id) ?? null);
        done('piece', ids);
        this.version++;
        this.generation++;
        this.textUpdatedAt = Date.now();
      }
    }
    if (photos.length > PHOTO_BATCH_RELOAD) {
      await this.reloadShade();
      done('photo', photos);
    } else if (photos.length) {
      const links = await sequelize.query<{ id: number; pieceId: number | null }>(
        'SELECT id, pieceId FROM photos WHERE id IN (?)',
        { replacements: [photos], type: QueryTypes.SELECT },
      );
      const colours = await sequelize.query<VariantRow>(
        'SELECT id, photoId, L, a, b, hex, share, variant FROM palette_colours WHERE photoId IN (?) AND background = 0',
        { replacements: [photos], type: QueryTypes.SELECT },
      );
      const pieceOf = new Map(links.map((l) => [l.id, l.pieceId]));
      for (const id of photos) {
        this.shade.setPhoto(id, pieceOf.get(id) ?? null);
        this.shade.removePhoto(id);
      }
      this.shade.add(bestVariantOnly(colours));
      done('photo', photos);
      this.shadeUpdatedAt = Date.now();
      this.generation++;
    }
  }

  /**
   * Before a search: load if needed (tests and scripts) or refuse while loading (the running server), then catch
   * up with the log. The wait is bounded (SEARCH_SYNC_WAIT_MS): a database that does not answer makes the search
   * answer from the index as it is, never hang.
   */
  async settled() {
    if (!this.loaded) {
      if (this.background)
        throw new HttpError(
          503,
          'search_warming',
          'Search is starting up. Try again in a few seconds.',
          undefined,
          WARMING_RETRY_AFTER_S,
        );
      await this.ready();
    }
    if ((await this.catchUpBounded()) === 'late')
      logger.warn({ waitMs: SYNC_WAIT_MS }, '[search] answered before catching up with the log');
    // Every search waiting on that catch-up continues now: take turns rather than all in one go (fair-turns.ts).
    await fairTurn();
  }

  /** One catch-up that started after this call, waited for at most SYNC_WAIT_MS. */
  private async catchUpBounded(): Promise<'done' | 'failed' | 'late'> {
    let timer: NodeJS.Timeout | undefined;
    const late = new Promise<'late'>((resolve) => {
      timer = setTimeout(() => resolve('late'), SYNC_WAIT_MS);
    });
    try {
      return await Promise.race([
        this.sync().then(
          () => 'done' as const,
          () => 'failed' as const,
        ),
        late,
      ]);
    } finally {
      clearTimeout(timer);
    }
  }

  /**
   * For answers cached outside the indexes (the archive list, server/routes/pieces/list-cache.ts): after a catch-up
   * with the log that started after this call, the count of log rows read so far (`ChangeCursor.seen`). Every write
   * that affects a piece, its photos or its publication appends to the log in its own transaction, so while the
   * count stands still nothing such has been committed since an answer cached under it was read. Null when the
   * indexes are not loaded or the catch-up failed or was late: then answer from MariaDB, uncached.
   */
  async logMark(): Promise<number | null> {
    if (!this.loaded) return null;
    const r = await this.catchUpBounded();
    await fairTurn();
    return r === 'done' ? this.cursor.seen : null;
  }
}

export const searchEngine = new SearchEngine();
