import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes, type Sequelize } from 'sequelize';
import { createSequelize } from '../../server/db/sequelize.ts';
import { createMigrator } from '../../server/db/migrator.ts';
import { env } from '../../server/env.ts';

// A database of its own, migrated to just before 0015 and filled the way earlier versions stored pieces.
const dbName = 'tinctoria_accession_migration_test';
let admin: Sequelize;
let db: Sequelize;

beforeAll(async () => {
  admin = createSequelize(env.DATABASE_URL);
  await admin.query(`DROP DATABASE IF EXISTS \`${dbName}\``);
  await admin.query(`CREATE DATABASE \`${dbName}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
  const url = new URL(env.DATABASE_URL);
  url.pathname = `/${dbName}`;
  db = createSequelize(url.toString());
  await createMigrator(db).up({ to: '0013-palette-names' });
});
afterAll(async () => {
  await db?.close();
  await admin.query(`DROP DATABASE IF EXISTS \`${dbName}\``);
  await admin.close();
});

const insert = (accessionNumber: string) =>
  db.query(
    "INSERT INTO pieces (accessionNumber, objectName, title, fibres, techniques, dyestuffs, historicalMordants, status, createdAt, updatedAt) VALUES (?, 'panel', 't', '[]', '[]', '[]', '[]', 'draft', NOW(), NOW())",
    {
      replacements: [accessionNumber],
    },
  );

describe('migration 0015: accession keys', () => {
  it('fills the key and sort columns of existing pieces, then keeps the key unique and the order natural', async () => {
    for (const n of ['1931.4.12', '1931.4.2', 'EX 2021/1', '1931.4.12a-b', 'T.14-1950']) await insert(n);
    await createMigrator(db).up();
    const rows = await db.query<{ accessionNumber: string; accessionKey: string }>(
      'SELECT accessionNumber, accessionKey FROM pieces ORDER BY accessionSort',
      { type: QueryTypes.SELECT },
    );
    expect(rows.map((r) => r.accessionNumber)).toEqual([
      '1931.4.2',
      '1931.4.12',
      '1931.4.12a-b',
      'EX 2021/1',
      'T.14-1950',
    ]);
    expect(rows.find((r) => r.accessionNumber === 'EX 2021/1')?.accessionKey).toBe('ex2021/1');
    await expect(
      db.query(
        "INSERT INTO pieces (accessionNumber, accessionKey, accessionSort, objectName, title, fibres, techniques, dyestuffs, historicalMordants, status, createdAt, updatedAt) VALUES ('ex2021/1', 'ex2021/1', 'x', 'panel', 't', '[]', '[]', '[]', '[]', 'draft', NOW(), NOW())",
      ),
    ).rejects.toMatchObject({
      name: 'SequelizeUniqueConstraintError',
      original: { message: expect.stringContaining('pieces_accession_key') },
    });
  });

  it('names the numbers that differ only in case or spaces instead of failing on the index', async () => {
    await createMigrator(db).down({ to: '0015-accession-keys' });
    await insert('EX2021/1');
    await expect(createMigrator(db).up()).rejects.toThrow(
      /differ only in case or spaces; renumber one of each first: (EX 2021\/1 \/ EX2021\/1|EX2021\/1 \/ EX 2021\/1)/,
    );
  });
});
