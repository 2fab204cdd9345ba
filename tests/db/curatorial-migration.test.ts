import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes, type Sequelize } from 'sequelize';
import { createSequelize } from '../../server/db/sequelize.ts';
import { createMigrator } from '../../server/db/migrator.ts';
import { env } from '../../server/env.ts';

// Migrations 0032 (curatorial fields of a piece) and 0033 (saved searches) on an install that already has pieces.
const dbName = 'tinctoria_curatorial_migration_test';
let admin: Sequelize;
let db: Sequelize;

beforeAll(async () => {
  admin = createSequelize(env.DATABASE_URL);
  await admin.query(`DROP DATABASE IF EXISTS \`${dbName}\``);
  await admin.query(`CREATE DATABASE \`${dbName}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
  const url = new URL(env.DATABASE_URL);
  url.pathname = `/${dbName}`;
  db = createSequelize(url.toString());
  await createMigrator(db).up({ to: '0024-import-previews' });
});
afterAll(async () => {
  await db?.close();
  await admin.query(`DROP DATABASE IF EXISTS \`${dbName}\``);
  await admin.close();
});

const columns = async () =>
  (
    await db.query<{ c: string }>(
      "SELECT column_name AS c FROM information_schema.columns WHERE table_schema = ? AND table_name = 'pieces'",
      { replacements: [dbName], type: QueryTypes.SELECT },
    )
  ).map((r) => r.c);
const hasTable = async (t: string) =>
  (
    await db.query('SELECT 1 FROM information_schema.tables WHERE table_schema = ? AND table_name = ?', {
      replacements: [dbName, t],
      type: QueryTypes.SELECT,
    })
  ).length === 1;

describe('migrations 0032 and 0033', () => {
  it('give existing pieces empty makers and marks, add saved searches, and go down and up again', async () => {
    await db.query(
      "INSERT INTO pieces (accessionNumber, accessionKey, accessionSort, objectName, title, fibres, techniques, dyestuffs, historicalMordants, status, createdAt, updatedAt) VALUES ('1.2.3', '1.2.3', '1.2.3', 'panel', 't', '[]', '[]', '[]', '[]', 'draft', NOW(), NOW())",
    );
    await createMigrator(db).up();
    const [row] = await db.query<{ makers: unknown; marks: unknown; objectRights: string | null }>(
      'SELECT makers, marks, objectRights FROM pieces',
      { type: QueryTypes.SELECT },
    );
    // The driver may hand JSON columns back parsed or as text.
    const list = (v: unknown) => (typeof v === 'string' ? JSON.parse(v) : v);
    expect(list(row.makers)).toEqual([]);
    expect(list(row.marks)).toEqual([]);
    expect(row.objectRights).toBeNull();
    expect(await hasTable('saved_searches')).toBe(true);

    await createMigrator(db).down({ to: '0032-piece-curatorial' });
    expect(await hasTable('saved_searches')).toBe(false);
    const cols = await columns();
    for (const c of ['makers', 'marks', 'patternName', 'storageLocation', 'objectRights', 'imageRights'])
      expect(cols).not.toContain(c);
    await createMigrator(db).up();
    expect(await columns()).toEqual(expect.arrayContaining(['makers', 'imageRights']));
  });
});
