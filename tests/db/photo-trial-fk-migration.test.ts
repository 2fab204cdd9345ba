import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes, type Sequelize } from 'sequelize';
import { createSequelize } from '../../server/db/sequelize.ts';
import { createMigrator } from '../../server/db/migrator.ts';
import { env } from '../../server/env.ts';

// A database of its own, migrated to just before 0020, with a swatch photo whose trial was deleted underneath it.
const dbName = 'tinctoria_photo_trial_fk_test';
let admin: Sequelize;
let db: Sequelize;

beforeAll(async () => {
  admin = createSequelize(env.DATABASE_URL);
  await admin.query(`DROP DATABASE IF EXISTS \`${dbName}\``);
  await admin.query(`CREATE DATABASE \`${dbName}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
  const url = new URL(env.DATABASE_URL);
  url.pathname = `/${dbName}`;
  db = createSequelize(url.toString());
  await createMigrator(db).up({ to: '0019-trial-checks' });
});
afterAll(async () => {
  await db?.close();
  await admin.query(`DROP DATABASE IF EXISTS \`${dbName}\``);
  await admin.close();
});

const trial = async (code: string) => {
  await db.query('INSERT INTO trials (code, dryMassG, createdAt, updatedAt) VALUES (?, 10, NOW(), NOW())', {
    replacements: [code],
  });
  return (
    await db.query<{ id: number }>('SELECT id FROM trials WHERE code = ?', {
      replacements: [code],
      type: QueryTypes.SELECT,
    })
  )[0].id;
};
const photo = async (trialId: number) => {
  await db.query(
    "INSERT INTO photos (trialId, sha256, format, bytes, width, height, view, exif, derivatives, createdAt, updatedAt) VALUES (?, REPEAT('a', 64), 'png', 1, 1, 1, 'swatch', '{}', '{}', NOW(), NOW())",
    { replacements: [trialId] },
  );
  return (await db.query<{ id: number }>('SELECT MAX(id) AS id FROM photos', { type: QueryTypes.SELECT }))[0].id;
};
const trialOf = async (photoId: number) =>
  (
    await db.query<{ trialId: number | null }>('SELECT trialId FROM photos WHERE id = ?', {
      replacements: [photoId],
      type: QueryTypes.SELECT,
    })
  )[0].trialId;

describe('migration 0020: photos.trialId foreign key', () => {
  it('unlinks photos of trials that no longer exist, then refuses to delete a trial that still has photos', async () => {
    const kept = await trial('T-2026-901');
    const gone = await trial('T-2026-902');
    const keptPhoto = await photo(kept);
    const orphan = await photo(gone);
    await db.query('DELETE FROM trials WHERE id = ?', { replacements: [gone] });
    await createMigrator(db).up();
    expect(await trialOf(keptPhoto)).toBe(kept);
    expect(await trialOf(orphan)).toBeNull();
    await expect(db.query('DELETE FROM trials WHERE id = ?', { replacements: [kept] })).rejects.toMatchObject({
      name: 'SequelizeForeignKeyConstraintError',
    });
    await expect(photo(999999)).rejects.toMatchObject({ name: 'SequelizeForeignKeyConstraintError' });
  });

  it('goes down and up again', async () => {
    await createMigrator(db).down({ to: '0020-photo-trial-fk' });
    await photo(999999);
    await db.query('DELETE FROM photos WHERE trialId = 999999');
    await createMigrator(db).up();
  });
});
