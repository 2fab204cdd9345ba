import { QueryTypes } from 'sequelize';
import { sequelize } from '../models/index.ts';
import { loadAll, loadPiece, loadTrial } from './docs.ts';
import { facetTableFor } from './facet-table.ts';
import { ShadeIndex, type ShadeRow } from './shade-index.ts';
import { TextIndex } from './text-index.ts';
import { logger } from '../log/index.ts';

/**
 * The search engine: the text index and the shade index, loaded from MariaDB
 * once and then kept current by hooks.ts. Changes are applied asynchronously
 * after commit; every search first awaits `settled()` so a request always sees
 * the writes committed before it.
 */
export type Change = { kind: 'piece' | 'trial' | 'photo-palette'; id: number } | { kind: 'all-text' | 'all-shade' };

class SearchEngine {
  readonly text = new TextIndex();
  readonly shade = new ShadeIndex();
  private loading: Promise<void> | null = null;
  private pending: Change[] = [];
  private flushing: Promise<void> = Promise.resolve();
  /** Bumped on every change to the piece documents; caches key on it. */
  version = 0;
  /** When each index was last loaded or changed (ms since epoch; null before its first load), for /api/health. */
  textUpdatedAt: number | null = null;
  shadeUpdatedAt: number | null = null;

  /** What /api/health reports: whether each index is loaded, when it last changed, and changes not yet applied. */
  status() {
    return { textUpdatedAt: this.textUpdatedAt, shadeUpdatedAt: this.shadeUpdatedAt, pending: this.pending.length };
  }

  /** Load both indexes (once); later calls wait for the same load. */
  ready(): Promise<void> {
    this.loading ??= Promise.all([this.reloadText(), this.reloadShade()])
      .then(() => undefined)
      .catch((err) => {
        this.loading = null;
        throw err;
      });
    return this.loading;
  }

  get started() {
    return this.loading !== null;
  }

  /** Read everything again from MariaDB (start-up, and the benchmark between data sets). */
  async reloadAll() {
    const load = Promise.all([this.reloadText(), this.reloadShade()]).then(() => undefined);
    this.loading ??= load;
    await load;
  }

  private async reloadText() {
    const { pieces, trials } = await loadAll();
    this.text.load(pieces, trials);
    this.version++;
    // Built here rather than by the first search after start-up (about a second at 170,000 pieces).
    facetTableFor(this.text, this.version);
    this.textUpdatedAt = Date.now();
  }

  private async reloadShade() {
    const photos = await sequelize.query<{ id: number; pieceId: number | null }>('SELECT id, pieceId FROM photos', {
      type: QueryTypes.SELECT,
    });
    // In keyset-paged chunks: one 1M-row result set can stall past the server's net_write_timeout.
    const rows: ShadeRow[] = [];
    for (let after = 0; ;) {
      const chunk = await sequelize.query<ShadeRow>(
        'SELECT id, photoId, L, a, b, hex, share FROM palette_colours WHERE background = 0 AND id > ? ORDER BY id LIMIT 50000',
        { replacements: [after], type: QueryTypes.SELECT },
      );
      for (const r of chunk) rows.push(r);
      if (chunk.length < 50_000) break;
      after = chunk[chunk.length - 1].id;
    }
    this.shade.load(rows, photos);
    this.shadeUpdatedAt = Date.now();
  }

  /** A committed change; applied in order, off the request path. */
  enqueue(change: Change) {
    if (!this.started) return;
    this.pending.push(change);
    this.flushing = this.flushing
      .then(() => this.flush())
      .catch((err) => logger.error({ err }, '[search] index update failed'));
  }

  /** Resolves once every change enqueued so far is in the indexes. */
  async settled() {
    await this.ready();
    await this.flushing;
  }

  setPhoto(photoId: number, pieceId: number | null) {
    if (this.started) this.shade.setPhoto(photoId, pieceId);
  }

  private async flush() {
    await this.ready();
    const batch = this.pending.splice(0);
    if (!batch.length) return;
    const seen = new Set<string>();
    for (const c of batch) {
      const key = 'id' in c ? `${c.kind}:${c.id}` : c.kind;
      if (seen.has(key)) continue;
      seen.add(key);
      if (c.kind === 'all-text') await this.reloadText();
      else if (c.kind === 'all-shade') await this.reloadShade();
      else if (c.kind === 'piece') {
        const { piece } = await loadPiece(c.id);
        this.text.setPiece(c.id, piece);
        this.version++;
        this.textUpdatedAt = Date.now();
      } else if (c.kind === 'trial') {
        const before = this.text.trials.get(c.id)?.pieceId ?? null;
        const trial = await loadTrial(c.id);
        this.text.setTrial(c.id, trial);
        // A trial's modern mordants are facets of its piece.
        for (const pid of new Set([before, trial?.pieceId ?? null]))
          if (pid != null) this.text.setPiece(pid, (await loadPiece(pid)).piece);
        this.version++;
        this.textUpdatedAt = Date.now();
      } else if (c.kind === 'photo-palette') {
        const rows = await sequelize.query<ShadeRow>(
          'SELECT id, photoId, L, a, b, hex, share FROM palette_colours WHERE photoId = ? AND background = 0',
          {
            replacements: [c.id],
            type: QueryTypes.SELECT,
          },
        );
        this.shade.removePhoto(c.id);
        this.shade.add(rows);
        this.shadeUpdatedAt = Date.now();
      }
    }
  }
}

export const searchEngine = new SearchEngine();
