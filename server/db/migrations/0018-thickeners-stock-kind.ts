import { DataTypes, QueryTypes } from 'sequelize';
import type { MigrationFn } from 'umzug';
import type { MigrationContext } from '../migrator.ts';

// Issue 14: a batch kind 'stock' (a solution only drawn from, like a print paste), and the thickeners
// the paste check knows by kind (shared/compute/thickeners.ts) that earlier installs lack. A fresh
// install gets the same rows from the reference seed (server/seed/data/chemicals.json, appended rows).
const KINDS = ['mordant-bath', 'print-paste', 'dye-bath', 'vat'] as const;

const common = {
  role: 'thickener',
  formula: null,
  metal: null,
  status: 'permitted',
  signalWord: null,
  hStatements: '[]',
  source: 'formula: IUPAC nomenclature; role and status: common practice',
  hazardSource: 'typical supplier classification: not classified',
  ppe: 'eye protection when handling powders',
};
const THICKENERS_0018 = [
  { ...common, name: 'sodium alginate', caution: 'Low hazard.' },
  { ...common, name: 'gum tragacanth', caution: 'Low hazard.' },
  {
    ...common,
    name: 'British gum (dextrin)',
    caution: 'Low hazard; fine dust can form explosive mixtures in air, as with flour or starch.',
  },
];

export const up: MigrationFn<MigrationContext> = async ({ context: { queryInterface: qi, sequelize } }) => {
  await qi.changeColumn('mordant_batches', 'kind', { type: DataTypes.ENUM(...KINDS, 'stock'), allowNull: false });
  // Only an install whose reference data is already seeded needs the rows; the seed adds them elsewhere.
  const [{ n }] = await sequelize.query<{ n: number }>('SELECT COUNT(*) AS n FROM chemicals', {
    type: QueryTypes.SELECT,
  });
  if (!Number(n)) return;
  const now = new Date();
  for (const row of THICKENERS_0018) {
    const found = await sequelize.query('SELECT id FROM chemicals WHERE name = ?', {
      replacements: [row.name],
      type: QueryTypes.SELECT,
    });
    if (found.length) continue;
    await qi.bulkInsert('chemicals', [{ ...row, createdAt: now, updatedAt: now }]);
  }
};

export const down: MigrationFn<MigrationContext> = async ({ context: { queryInterface: qi, sequelize } }) => {
  // A stock goes back to the nearest older kind: a print paste is the other kind only drawn from.
  await sequelize.query("UPDATE mordant_batches SET kind = 'print-paste' WHERE kind = 'stock'");
  await qi.changeColumn('mordant_batches', 'kind', { type: DataTypes.ENUM(...KINDS), allowNull: false });
  await qi.bulkDelete('chemicals', { name: THICKENERS_0018.map((r) => r.name) });
};
