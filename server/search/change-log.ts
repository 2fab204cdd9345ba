import { QueryTypes, type Transaction } from 'sequelize';
import { sequelize } from '../db/sequelize.ts';

/**
 * The search change log (table `search_changes`, migration 0023): every write that affects search appends
 * `(kind, entityId)` in its own transaction (hooks.ts), and every app server reads the log in id order and
 * applies it to its indexes (engine.ts). See README.md, "Several app servers".
 *
 * Ids come from AUTO_INCREMENT, which is handed out at insert time, not at commit: a slow transaction can
 * commit id 90 after id 100 is already visible, and a rolled-back one leaves 90 missing for ever. So the
 * cursor keeps, besides the highest id read, the *gaps* below it (ranges of ids not seen yet) and reads them
 * again on every poll. A gap is closed once no transaction that could still fill it is running: every
 * transaction that took an id in the gap had started before the poll that first saw the gap, so when the
 * oldest transaction InnoDB reports (information_schema.INNODB_TRX) started later than that — checked
 * *before* a read, whose answer then includes everything they committed — the gap is final.
 */
export type ChangeKind = 'piece' | 'trial' | 'photo';
export type ChangeRow = { id: number; kind: ChangeKind; entityId: number };
type Gap = { from: number; to: number; seenAt: number };

const KINDS = new Set<string>(['piece', 'trial', 'photo']);
const READ_LIMIT = 10_000;
/** Without the PROCESS privilege INNODB_TRX is empty or refused; then a gap is given up after an hour. */
const GAP_GIVE_UP_MS = 3_600_000;
const MAX_GAPS = 500;

/** Append changes inside the writer's transaction (so a rolled-back write is never logged). */
export async function appendChanges(kind: ChangeKind, ids: Iterable<number>, transaction?: Transaction | null) {
  const list = [...new Set(ids)].filter((n) => Number.isInteger(n) && n > 0);
  for (let i = 0; i < list.length; i += 1000) {
    const chunk = list.slice(i, i + 1000);
    await sequelize.query(
      `INSERT INTO search_changes (kind, entityId) VALUES ${chunk.map(() => '(?, ?)').join(', ')}`,
      {
        replacements: chunk.flatMap((id) => [kind, id]),
        transaction: transaction ?? undefined,
      },
    );
  }
  return list.length;
}

export class ChangeCursor {
  /** Highest id read so far. */
  high = 0;
  gaps: Gap[] = [];
  /**
   * How many log rows have been read (any kind, gaps filled included), bumped also by every start: a count that
   * changes whenever a write affecting search has been seen. Answer caches keyed on it (the archive list) are valid
   * for as long as it stands still.
   */
  seen = 0;

  /**
   * Position at the log's end before an index load: everything committed now is in the load; ids below the end
   * not yet visible (transactions still running) become gaps, read again until they commit or are known gone.
   */
  async start() {
    const [{ top }] = await sequelize.query<{ top: number | string | null }>(
      'SELECT MAX(id) AS top FROM search_changes',
      { type: QueryTypes.SELECT },
    );
    const end = Number(top ?? 0);
    // Holes among the last ids only: a transaction 100,000 log rows old and still open is not expected.
    const from = Math.max(0, end - 100_000);
    const ids = await sequelize.query<{ id: number | string }>(
      'SELECT id FROM search_changes WHERE id > ? AND id <= ? ORDER BY id',
      { replacements: [from, end], type: QueryTypes.SELECT },
    );
    // Taken after the read: every transaction holding an id in a hole started before this moment.
    const [{ now }] = await sequelize.query<{ now: Date }>('SELECT NOW(3) AS now', { type: QueryTypes.SELECT });
    this.high = from;
    this.gaps = [];
    this.seen++;
    for (const r of ids) this.see(Number(r.id), new Date(now).getTime());
    if (end > this.high) this.gaps.push({ from: this.high + 1, to: end, seenAt: new Date(now).getTime() });
    this.high = end;
  }

  /** Mark an id as read; opens a gap when it jumps past unseen ids, splits a gap when it falls inside one. */
  private see(id: number, now: number) {
    if (id > this.high) {
      if (id > this.high + 1) this.gaps.push({ from: this.high + 1, to: id - 1, seenAt: now });
      this.high = id;
      return;
    }
    const i = this.gaps.findIndex((g) => g.from <= id && id <= g.to);
    if (i < 0) return;
    const g = this.gaps[i];
    const parts: Gap[] = [];
    if (g.from < id) parts.push({ from: g.from, to: id - 1, seenAt: g.seenAt });
    if (id < g.to) parts.push({ from: id + 1, to: g.to, seenAt: g.seenAt });
    this.gaps.splice(i, 1, ...parts);
  }

  /** Bounded: each gap is a clause of every read; past the cap the oldest are given up (logged by the caller). */
  private capGaps() {
    if (this.gaps.length <= MAX_GAPS) return 0;
    const dropped = this.gaps.length - MAX_GAPS;
    this.gaps.sort((x, y) => x.from - y.from).splice(0, dropped);
    return dropped;
  }

  /** The rows committed since the last read (including late ones that fill gaps), in id order. */
  async read(): Promise<{ rows: ChangeRow[]; more: boolean; gapsGivenUp: number }> {
    // 1. Which gaps can no longer be filled (checked before the read; see the comment at the top).
    let closeBefore: number | null = null;
    if (this.gaps.length) {
      try {
        const [r] = await sequelize.query<{ oldest: Date | null; now: Date }>(
          'SELECT (SELECT MIN(trx_started) FROM information_schema.INNODB_TRX) AS oldest, NOW(3) AS now',
          { type: QueryTypes.SELECT },
        );
        closeBefore = r.oldest ? new Date(r.oldest).getTime() : new Date(r.now).getTime();
      } catch {
        closeBefore = Date.now() - GAP_GIVE_UP_MS;
      }
    }
    // 2. Read past the end, and inside the gaps.
    const where = ['id > ?', ...this.gaps.map(() => 'id BETWEEN ? AND ?')].join(' OR ');
    const params = [this.high, ...this.gaps.flatMap((g) => [g.from, g.to])];
    const rows = await sequelize.query<{ id: number | string; kind: string; entityId: number; now: Date }>(
      `SELECT id, kind, entityId, NOW(3) AS now FROM search_changes WHERE ${where} ORDER BY id LIMIT ${READ_LIMIT}`,
      { replacements: params, type: QueryTypes.SELECT },
    );
    const out: ChangeRow[] = [];
    this.seen += rows.length;
    for (const r of rows) {
      const id = Number(r.id);
      this.see(id, new Date(r.now).getTime());
      if (KINDS.has(r.kind)) out.push({ id, kind: r.kind as ChangeKind, entityId: r.entityId });
    }
    const more = rows.length === READ_LIMIT;
    // 3. Close the gaps that were final before the read (a full page may have stopped short of them: keep them then).
    if (closeBefore !== null && !more) this.gaps = this.gaps.filter((g) => g.seenAt >= closeBefore!);
    return { rows: out, more, gapsGivenUp: this.capGaps() };
  }
}

/** Drop log rows older than the keep time (any server may do it; the delete is bounded). */
export async function pruneChanges(keepHours: number) {
  await sequelize.query('DELETE FROM search_changes WHERE createdAt < NOW(3) - INTERVAL ? SECOND LIMIT 10000', {
    replacements: [Math.round(keepHours * 3600)],
  });
}
