import * as mariadb from 'mariadb';

// Sequelize 6 deletes `rows.meta` after raw queries, but mariadb 3.1+ defines
// `meta` as non-configurable, so the delete throws. Hand Sequelize a copy of each
// array result whose `meta` is configurable.
function configurableMeta<T>(rows: T): T {
  if (Array.isArray(rows) && 'meta' in rows) {
    const copy = rows.slice();
    Object.defineProperty(copy, 'meta', {
      value: (rows as unknown as { meta: unknown }).meta,
      configurable: true,
      writable: true,
      enumerable: false,
    });
    return copy as T;
  }
  return rows;
}

export const dialectModule = {
  ...mariadb,
  async createConnection(config: mariadb.ConnectionConfig) {
    const conn = await mariadb.createConnection(config);
    const query = conn.query.bind(conn);
    (conn as { query: unknown }).query = (...args: Parameters<typeof query>) => query(...args).then(configurableMeta);
    return conn;
  },
};
