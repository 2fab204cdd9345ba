import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes, type Sequelize } from 'sequelize';
import { createSequelize } from '../../server/db/sequelize.ts';
import { createMigrator } from '../../server/db/migrator.ts';
import { env } from '../../server/env.ts';

// A database of its own: 0027 widens the palette variants to 'calibrated' and adds photos.chart; its down drops the
// calibrated rows (and keeps raw and corrected) so the narrower ENUM holds; 0029's fading pairs go with their piece.
const dbName = 'tinctoria_photo_chart_migration_test';
let admin: Sequelize;
let db: Sequelize;

beforeAll(async () => {
  admin = createSequelize(env.DATABASE_URL);
  await admin.query(`DROP DATABASE IF EXISTS \`${dbName}\``);
  await admin.query(`CREATE DATABASE \`${dbName}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
  const url = new URL(env.DATABASE_URL);
  url.pathname = `/${dbName}`;
  db = createSequelize(url.toString());
  await createMigrator(db).up();
});
afterAll(async () => {
  await db?.close();
  await admin.query(`DROP DATABASE IF EXISTS \`${dbName}\``);
  await admin.close();
});

const variants = async () =>
  (
    await db.query<{ variant: string }>('SELECT variant FROM palette_colours ORDER BY id', { type: QueryTypes.SELECT })
  ).map((r) => r.variant);

describe('migrations 0027 and 0029: colour chart and fading pairs', () => {
  it('stores calibrated rows and a chart; down removes only the calibrated rows and the column', async () => {
    await db.query(
      "INSERT INTO photos (sha256, format, bytes, width, height, view, exif, derivatives, chart, createdAt, updatedAt) VALUES (REPEAT('b', 64), 'png', 1, 10, 10, 'recto', '{}', '{}', '{\"corners\":[]}', NOW(), NOW())",
    );
    const [{ id }] = await db.query<{ id: number }>('SELECT MAX(id) AS id FROM photos', { type: QueryTypes.SELECT });
    for (const v of ['raw', 'corrected', 'calibrated'])
      await db.query(
        "INSERT INTO palette_colours (photoId, variant, `rank`, L, a, b, hex, share, spread, name, background, createdAt, updatedAt) VALUES (?, ?, 0, 50, 0, 0, '#777777', 1, 0, 'grey', 0, NOW(), NOW())",
        { replacements: [id, v] },
      );
    expect(await variants()).toEqual(['raw', 'corrected', 'calibrated']);
    await createMigrator(db).down({ to: '0027-photo-chart' });
    expect(await variants()).toEqual(['raw', 'corrected']);
    const cols = await db.query<{ c: string }>(
      "SELECT column_name AS c FROM information_schema.columns WHERE table_schema = ? AND table_name = 'photos'",
      { replacements: [dbName], type: QueryTypes.SELECT },
    );
    expect(cols.map((r) => r.c)).not.toContain('chart');
    await createMigrator(db).up();
    expect(await variants()).toEqual(['raw', 'corrected']);
  });
});
