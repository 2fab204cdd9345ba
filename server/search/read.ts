import type { Connection } from 'mariadb';
import { sequelize } from '../models/index.ts';
import { ShadeColours } from './shade-index.ts';

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

/** Every palette colour the shade index holds (not background ones) and every photo's piece. */
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
      await eachPage(
        conn,
        'SELECT id, photoId, L, a, b, hex, share FROM palette_colours WHERE background = 0 AND id > ? ORDER BY id LIMIT ?',
        10_000,
        (rows) => {
          for (const r of rows)
            colours.add(
              r[0] as number,
              r[1] as number,
              r[2] as number,
              r[3] as number,
              r[4] as number,
              r[5] as string,
              r[6] as number,
            );
        },
      );
      return { colours, photos };
    }),
  );
}
