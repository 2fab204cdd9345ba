import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes, type Sequelize } from 'sequelize';
import { createSequelize } from '../../server/db/sequelize.ts';
import { createMigrator } from '../../server/db/migrator.ts';
import { env } from '../../server/env.ts';

// A database of its own, migrated to before 0018 and holding reference chemicals as an existing install does.
const dbName = 'tinctoria_thickeners_migration_test';
let admin: Sequelize;
let db: Sequelize;

beforeAll(async () => {
  admin = createSequelize(env.DATABASE_URL);
  await admin.query(`DROP DATABASE IF EXISTS \`${dbName}\``);
  await admin.query(`CREATE DATABASE \`${dbName}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
  const url = new URL(env.DATABASE_URL);
  url.pathname = `/${dbName}`;
  db = createSequelize(url.toString());
  await createMigrator(db).up({ to: '0016-series-target' });
  await db.query(
    "INSERT INTO chemicals (name, role, status, hStatements, source, createdAt, updatedAt) VALUES ('guar gum', 'thickener', 'permitted', '[]', 'common practice', NOW(), NOW())",
  );
});
afterAll(async () => {
  await db?.close();
  await admin.query(`DROP DATABASE IF EXISTS \`${dbName}\``);
  await admin.close();
});

const thickeners = async () =>
  (
    await db.query<{ name: string }>("SELECT name FROM chemicals WHERE role = 'thickener' ORDER BY name", {
      type: QueryTypes.SELECT,
    })
  ).map((r) => r.name);
const batch = (code: string, kind: string) =>
  db.query(
    "INSERT INTO mordant_batches (code, kind, name, ingredients, volumeMl, madeOn, status, uptakePerUse, createdAt, updatedAt) VALUES (?, ?, 'b', '[]', 500, '2024-05-01', 'active', 0, NOW(), NOW())",
    { replacements: [code, kind] },
  );

describe('migration 0018: thickeners and the stock kind', () => {
  it('adds the missing thickeners to an existing install once, and accepts batches of kind stock', async () => {
    await createMigrator(db).up();
    expect(await thickeners()).toEqual(['British gum (dextrin)', 'guar gum', 'gum tragacanth', 'sodium alginate']);
    await batch('ST-1', 'stock');
    expect(
      (
        await db.query<{ kind: string }>("SELECT kind FROM mordant_batches WHERE code = 'ST-1'", {
          type: QueryTypes.SELECT,
        })
      )[0].kind,
    ).toBe('stock');
  });

  it('goes down (a stock becomes a print paste, the added thickeners go) and up again', async () => {
    await createMigrator(db).down({ to: '0018-thickeners-stock-kind' });
    expect(await thickeners()).toEqual(['guar gum']);
    expect(
      (
        await db.query<{ kind: string }>("SELECT kind FROM mordant_batches WHERE code = 'ST-1'", {
          type: QueryTypes.SELECT,
        })
      )[0].kind,
    ).toBe('print-paste');
    await createMigrator(db).up();
    expect(await thickeners()).toHaveLength(4);
  });
});
