import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes, type Sequelize } from 'sequelize';
import { createSequelize } from '../../server/db/sequelize.ts';
import { createMigrator } from '../../server/db/migrator.ts';
import { migrations } from '../../server/db/migrations/index.ts';
import { env } from '../../server/env.ts';

// A separate, empty database so up and down run from nothing.
const dbName = 'tinctoria_migrations_test';
let admin: Sequelize;
let db: Sequelize;

beforeAll(async () => {
  admin = createSequelize(env.DATABASE_URL);
  await admin.query(`DROP DATABASE IF EXISTS \`${dbName}\``);
  await admin.query(`CREATE DATABASE \`${dbName}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
  const url = new URL(env.DATABASE_URL);
  url.pathname = `/${dbName}`;
  db = createSequelize(url.toString());
});
afterAll(async () => {
  await db.close();
  await admin.query(`DROP DATABASE IF EXISTS \`${dbName}\``);
  await admin.close();
});

const tables = async () =>
  (
    await db.query<{ t: string }>('SELECT table_name AS t FROM information_schema.tables WHERE table_schema = ?', {
      replacements: [dbName],
      type: QueryTypes.SELECT,
    })
  )
    .map((r) => r.t)
    .sort();

describe('migrations', () => {
  it('run up on an empty database, creating InnoDB utf8mb4 tables that all have a primary key', async () => {
    const applied = await createMigrator(db).up();
    expect(applied.map((m) => m.name)).toEqual(migrations.map((m) => m.name));
    const names = await tables();
    for (const t of [
      'users',
      'pieces',
      'photos',
      'regions',
      'palette_colours',
      'colour_measurements',
      'dyestuffs',
      'chemicals',
      'trials',
      'recipe_steps',
      'substitutions',
      'mordant_batches',
      'batch_events',
      'audit_events',
      'sessions',
    ]) {
      expect(names).toContain(t);
    }
    const info = await db.query<{ t: string; engine: string; coll: string }>(
      'SELECT table_name AS t, engine, table_collation AS coll FROM information_schema.tables WHERE table_schema = ?',
      { replacements: [dbName], type: QueryTypes.SELECT },
    );
    for (const row of info) {
      expect(row.engine, row.t).toBe('InnoDB');
      expect(row.coll, row.t).toMatch(/^utf8mb4/);
    }
    const withoutPk = await db.query<{ t: string }>(
      `SELECT t.table_name AS t FROM information_schema.tables t
       LEFT JOIN information_schema.table_constraints c ON c.table_schema = t.table_schema AND c.table_name = t.table_name AND c.constraint_type = 'PRIMARY KEY'
       WHERE t.table_schema = ? AND c.constraint_name IS NULL`,
      { replacements: [dbName], type: QueryTypes.SELECT },
    );
    expect(withoutPk).toEqual([]);
  });

  it('run down to nothing and up again', async () => {
    await createMigrator(db).down({ to: 0 });
    expect((await tables()).filter((t) => t !== 'schema_migrations')).toEqual([]);
    await createMigrator(db).up();
    expect(await tables()).toContain('pieces');
  });
});
