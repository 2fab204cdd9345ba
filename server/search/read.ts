import type { Connection } from 'mariadb';
import { sequelize } from '../models/index.ts';
import { ShadeColours } from './shade-index.ts';
import { VARIANT_TRUST } from '../../shared/schemas/chart.ts';

/**
 * The bulk reads of an index load, on one of Sequelize's pooled connections used directly: the binary protocol
 * (`execute`, so MariaDB sends numbers as numbers rather than formatting a million doubles as text), rows as arrays,
 * and no per-field type-cast callback (Sequelize's costs about as much as parsing the rows). Every value is the same as
 * through `sequelize.query` (checked in tests/api/search-load.test.ts): these columns are integers, doubles and
 * strings, which Sequelize's type cast leaves alone, and MariaDB's text form of a double reads back as the same double.
 */
type Pool = {
  getConnection(o: { type: 'read' | 'write' }): Promise<Connection>;
  releaseConnection(c: Connection): Promise<void>;
};

// The bulk reads in flight (loadAll's and readShade's), so that each load's build waits for the other's reads.
const reading = new Set<Promise<unknown>>();

/**
 * Runs `read` (a load's database reads), then waits until every other load's reads in flight have finished too
 * before answering. The engine loads the text and shade indexes side by side, and each build is seconds of
 * synchronous work: had one index started building while the other's keyset pages were still arriving, that read
 * would stall (at full size the shade read once failed on the 10 s socket timeout, DB_QUERY_TIMEOUT_MS) and the
 * database would sit idle meanwhile. So both read first, overlapped, and then build.
 */
export async function readFirst<T>(read: () => Promise<T>): Promise<T> {
  const mine = read();
  reading.add(mine);
  try {
    const out = await mine;
    for (const other of reading) if (other !== mine) await other.catch(() => undefined);
    return out;
  } finally {
    reading.delete(mine);
  }
}

export async function withConnection<T>(fn: (conn: Connection) => Promise<T>): Promise<T> {
  const pool = sequelize.connectionManager as unknown as Pool;
  const conn = await pool.getConnection({ type: 'read' });
  try {
    return await fn(conn);
  } finally {
    await pool.releaseConnection(conn);
  }
}

/**
 * Every row of `sql` in keyset-paged chunks (one result of a million rows can stall past the server's
 * net_write_timeout while this process is busy building the other index). `sql` takes the last id seen as its one
 * parameter and ends in `ORDER BY <id> LIMIT ?`, with the id as column 0.
 */
export async function eachPage(
  conn: Connection,
  sql: string,
  page: number,
  each: (rows: unknown[][]) => void,
): Promise<void> {
  for (let after = 0; ;) {
    const rows: unknown[][] = await conn.execute({ sql, rowsAsArray: true, typeCast: undefined }, [after, page]);
    each(rows);
    if (rows.length < page) return;
    after = rows[rows.length - 1][0] as number;
  }
}

/** Trust rank by FIELD(): 1 for the most trustworthy variant; 0 (a variant not in the list) ranks last. */
const RANK_SQL = `FIELD(variant, ${VARIANT_TRUST.map((v) => `'${v}'`).join(', ')})`;
const LAST_RANK = VARIANT_TRUST.length + 1;

/**
 * Every palette colour the shade index holds (not background ones) and every photo's piece. Of a photo's palette
 * variants only the most trustworthy one is kept (VARIANT_TRUST: calibrated, then corrected, then raw), as
 * `bestVariantOnly` does for the engine's per-photo updates: a photo with a chart correction is found by its
 * calibrated colours, not also by the raw ones they replace. The rank comes with each row; the columns are compacted
 * once at the end, and only when some photo has more than one variant.
 */
export async function readShade(): Promise<{
  colours: ShadeColours;
  photos: Array<{ id: number; pieceId: number | null }>;
}> {
  return readFirst(() =>
    withConnection(async (conn) => {
      const photos: Array<{ id: number; pieceId: number | null }> = [];
      await eachPage(conn, 'SELECT id, pieceId FROM photos WHERE id > ? ORDER BY id LIMIT ?', 100_000, (rows) => {
        for (const r of rows) photos.push({ id: r[0] as number, pieceId: r[1] as number | null });
      });
      const colours = new ShadeColours();
      let ranks = new Uint8Array(1 << 16);
      const best = new Map<number, number>();
      let mixed = false;
      await eachPage(
        conn,
        `SELECT id, photoId, L, a, b, hex, share, ${RANK_SQL} FROM palette_colours WHERE background = 0 AND id > ? ORDER BY id LIMIT ?`,
        10_000,
        (rows) => {
          for (const r of rows) {
            const photoId = r[1] as number;
            const rank = Number(r[7]) || LAST_RANK;
            if (colours.size >= ranks.length) {
              const next = new Uint8Array(ranks.length * 2);
              next.set(ranks);
              ranks = next;
            }
            ranks[colours.size] = rank;
            const b = best.get(photoId);
            if (b === undefined) best.set(photoId, rank);
            else if (b !== rank) {
              mixed = true;
              if (rank < b) best.set(photoId, rank);
            }
            colours.add(
              r[0] as number,
              photoId,
              r[2] as number,
              r[3] as number,
              r[4] as number,
              r[5] as string,
              r[6] as number,
            );
          }
        },
      );
      if (mixed) {
        const photo = colours.cols.photo;
        colours.retain((j) => ranks[j] === best.get(photo[j]));
      }
      return { colours, photos };
    }),
  );
}
