import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes, type Sequelize } from 'sequelize';
import { createSequelize } from '../../server/db/sequelize.ts';
import { createMigrator } from '../../server/db/migrator.ts';
import { env } from '../../server/env.ts';

// A database of its own, migrated to just before 0017 and holding chemical rows as earlier seeds wrote them.
const dbName = 'tinctoria_hazard_migration_test';
let admin: Sequelize;
let db: Sequelize;

const OLD_SOURCE =
  'CLP Annex VI harmonised entry — recalled from memory, verify against the supplier SDS and the ECHA C&L Inventory';
const OLD_LEAD = [
  'H360Df May damage the unborn child. Suspected of damaging fertility.',
  'H373 May cause damage to organs through prolonged or repeated exposure.',
  'H400 Very toxic to aquatic life.',
  'H410 Very toxic to aquatic life with long lasting effects.',
];

beforeAll(async () => {
  admin = createSequelize(env.DATABASE_URL);
  await admin.query(`DROP DATABASE IF EXISTS \`${dbName}\``);
  await admin.query(`CREATE DATABASE \`${dbName}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
  const url = new URL(env.DATABASE_URL);
  url.pathname = `/${dbName}`;
  db = createSequelize(url.toString());
  await createMigrator(db).up({ to: '0016-series-target' });
});
afterAll(async () => {
  await db?.close();
  await admin.query(`DROP DATABASE IF EXISTS \`${dbName}\``);
  await admin.close();
});

const insert = (name: string, formula: string, hStatements: string[], hazardSource: string) =>
  db.query(
    "INSERT INTO chemicals (name, role, formula, metal, status, signalWord, hStatements, ppe, caution, source, hazardSource, createdAt, updatedAt) VALUES (?, 'mordant', ?, NULL, 'permitted', 'Danger', ?, NULL, NULL, 'seed', ?, NOW(), NOW())",
    {
      replacements: [name, formula, JSON.stringify(hStatements), hazardSource],
    },
  );
type Row = { name: string; hStatements: string | string[]; hazardSource: string; hazardBasis?: string | null };
// Later migrations add reference rows of their own (0018: thickeners): read back only the two inserted here.
const rows = () =>
  db.query<Row>(
    "SELECT * FROM chemicals WHERE name IN ('lead(II) acetate (sugar of lead)', 'sodium carbonate (soda ash)') ORDER BY name",
    { type: QueryTypes.SELECT },
  );
const statements = (r: Row) => (typeof r.hStatements === 'string' ? JSON.parse(r.hStatements) : r.hStatements);

describe('migration 0017: hazard provenance', () => {
  it('adds the basis, updates seeded texts (lead acetate gains H362) and leaves an admin-edited source alone; down restores', async () => {
    await insert('lead(II) acetate (sugar of lead)', 'Pb(CH3COO)2·3H2O', OLD_LEAD, OLD_SOURCE);
    await insert(
      'sodium carbonate (soda ash)',
      'Na2CO3',
      ['H319 Causes serious eye irritation.'],
      'our own supplier SDS, 2024',
    );
    await createMigrator(db).up();
    const [lead, soda] = await rows();
    expect(lead.hazardBasis).toBe('harmonised');
    expect(lead.hazardSource).toMatch(/Annex VI index 082-005-00-8/);
    expect(statements(lead).map((h: string) => h.split(' ')[0])).toEqual(['H360Df', 'H362', 'H373', 'H400', 'H410']);
    // Edited by an admin since the seed: neither the source nor the basis is touched.
    expect(soda).toMatchObject({ hazardSource: 'our own supplier SDS, 2024', hazardBasis: null });

    await createMigrator(db).down({ to: '0017-hazard-provenance' });
    const [leadBack, sodaBack] = await rows();
    expect(leadBack.hazardSource).toBe(OLD_SOURCE);
    expect(statements(leadBack)).toEqual(OLD_LEAD);
    expect(leadBack).not.toHaveProperty('hazardBasis');
    expect(sodaBack.hazardSource).toBe('our own supplier SDS, 2024');
  });
});
