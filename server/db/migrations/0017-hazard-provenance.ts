import { DataTypes, QueryTypes } from 'sequelize';
import type { MigrationFn } from 'umzug';
import type { MigrationContext } from '../migrator.ts';

// Hazard data with its provenance (issue 14). Adds chemicals.hazardBasis ('harmonised' = EU CLP Annex VI
// entry, 'supplier', 'memory') and brings existing installs' seeded chemical rows in line with
// server/seed/data/chemicals.json: a shorter per-chemical hazard source, lead(II) acetate with H362, and the
// boric-acid note for aluminium acetate. The reference seed only findOrCreates, so without this an existing
// install would keep the old texts. A field an admin has since edited (it no longer holds the old seed
// text) is left alone, and then so is the basis, since nobody knows what the edited source says.
// The classifications were recalled from memory: check them against the current Annex VI and the SDS.

type Change<T> = { from: T; to: T };
type Row = {
  name: string;
  hazardBasis: 'harmonised' | 'supplier' | 'memory';
  hazardSource?: Change<string>;
  hStatements?: Change<string[]>;
  caution?: Change<string>;
};

const ROWS: Row[] = [
  {
    name: 'potash alum',
    hazardBasis: 'memory',
    hazardSource: {
      from: 'supplier self-classification — recalled from memory, verify against the supplier SDS and the ECHA C&L Inventory',
      to: 'typical supplier classification; most suppliers: not classified, some list H319',
    },
  },
  {
    name: 'aluminium sulfate',
    hazardBasis: 'memory',
    hazardSource: {
      from: 'supplier self-classification — recalled from memory, verify against the supplier SDS and the ECHA C&L Inventory',
      to: 'typical supplier classification (Eye Dam. 1); no harmonised entry known',
    },
  },
  {
    name: 'aluminium sulfate octadecahydrate',
    hazardBasis: 'memory',
    hazardSource: {
      from: 'supplier self-classification — recalled from memory, verify against the supplier SDS and the ECHA C&L Inventory',
      to: 'typical supplier classification (Eye Dam. 1); no harmonised entry known',
    },
  },
  {
    name: 'aluminium acetate (basic)',
    hazardBasis: 'memory',
    hazardSource: {
      from: 'supplier self-classification — recalled from memory, verify against the supplier SDS and the ECHA C&L Inventory',
      to: "typical supplier classification; some grades are stabilised with boric acid (Annex VI: Repr. 1B H360FD), check the grade's SDS",
    },
    caution: {
      from: 'Irritant dust: avoid eye contact and inhalation.',
      to: "Irritant dust: avoid eye contact and inhalation. Some commercial grades are stabilised with boric acid, itself classified toxic for reproduction (H360FD): check the supplier's SDS for the grade you buy.",
    },
  },
  {
    name: 'iron(II) sulfate (copperas)',
    hazardBasis: 'harmonised',
    hazardSource: {
      from: 'CLP Annex VI harmonised entry — recalled from memory, verify against the supplier SDS and the ECHA C&L Inventory',
      to: 'Annex VI index 026-003-00-7, iron(II) sulphate: Acute Tox. 4, Eye Irrit. 2, Skin Irrit. 2 (as recalled; check the current Annex VI)',
    },
  },
  {
    name: 'iron(II) acetate',
    hazardBasis: 'memory',
    hazardSource: {
      from: 'supplier self-classification — recalled from memory, verify against the supplier SDS and the ECHA C&L Inventory',
      to: 'typical supplier classification',
    },
  },
  {
    name: 'lead(II) acetate (sugar of lead)',
    hazardBasis: 'harmonised',
    hazardSource: {
      from: 'CLP Annex VI harmonised entry — recalled from memory, verify against the supplier SDS and the ECHA C&L Inventory',
      to: 'Annex VI index 082-005-00-8, lead di(acetate): Repr. 1A, Lact., STOT RE 2, Aquatic Acute 1 and Chronic 1 (as recalled; check the current Annex VI)',
    },
    hStatements: {
      from: [
        'H360Df May damage the unborn child. Suspected of damaging fertility.',
        'H373 May cause damage to organs through prolonged or repeated exposure.',
        'H400 Very toxic to aquatic life.',
        'H410 Very toxic to aquatic life with long lasting effects.',
      ],
      to: [
        'H360Df May damage the unborn child. Suspected of damaging fertility.',
        'H362 May cause harm to breast-fed children.',
        'H373 May cause damage to organs through prolonged or repeated exposure.',
        'H400 Very toxic to aquatic life.',
        'H410 Very toxic to aquatic life with long lasting effects.',
      ],
    },
    caution: {
      from: 'Reproductive toxicant and cumulative poison (lead). Historical mordant only: do not use for dyeing; no food-use vessels; keep away from children and pregnant people; collect as hazardous waste, never pour to drain.',
      to: 'Reproductive toxicant, harmful to breast-fed children and a cumulative poison (lead). Historical mordant only: do not use for dyeing; no food-use vessels; keep away from children and from people who are pregnant or breast-feeding; collect as hazardous waste, never pour to drain.',
    },
  },
  {
    name: 'potassium dichromate',
    hazardBasis: 'harmonised',
    hazardSource: {
      from: 'CLP Annex VI harmonised entry — recalled from memory, verify against the supplier SDS and the ECHA C&L Inventory',
      to: 'Annex VI index 024-002-00-6, potassium dichromate (as recalled; check the current Annex VI)',
    },
  },
  {
    name: 'copper(II) sulfate',
    hazardBasis: 'harmonised',
    hazardSource: {
      from: 'CLP Annex VI harmonised entry — recalled from memory, verify against the supplier SDS and the ECHA C&L Inventory',
      to: 'Annex VI index 029-004-00-0, copper sulphate: Acute Tox. 4, Eye Irrit. 2, Skin Irrit. 2, Aquatic Acute 1 and Chronic 1 (as recalled; a later revision may differ)',
    },
  },
  {
    name: 'tin(II) chloride',
    hazardBasis: 'memory',
    hazardSource: {
      from: 'supplier self-classification — recalled from memory, verify against the supplier SDS and the ECHA C&L Inventory',
      to: 'typical supplier classification; no harmonised entry known',
    },
  },
  {
    name: 'calcium hydroxide (slaked lime)',
    hazardBasis: 'memory',
    hazardSource: {
      from: 'supplier self-classification — recalled from memory, verify against the supplier SDS and the ECHA C&L Inventory',
      to: "typical supplier classification (REACH registrants' classification); no harmonised entry known",
    },
  },
  {
    name: 'calcium carbonate (chalk)',
    hazardBasis: 'memory',
    hazardSource: {
      from: 'supplier self-classification — recalled from memory, verify against the supplier SDS and the ECHA C&L Inventory',
      to: 'typical supplier classification: not classified',
    },
  },
  {
    name: 'sodium carbonate (soda ash)',
    hazardBasis: 'harmonised',
    hazardSource: {
      from: 'CLP Annex VI harmonised entry — recalled from memory, verify against the supplier SDS and the ECHA C&L Inventory',
      to: 'Annex VI index 011-005-00-2, sodium carbonate: Eye Irrit. 2 (as recalled; check the current Annex VI)',
    },
  },
  {
    name: 'oxalic acid',
    hazardBasis: 'harmonised',
    hazardSource: {
      from: 'CLP Annex VI harmonised entry — recalled from memory, verify against the supplier SDS and the ECHA C&L Inventory',
      to: 'Annex VI index 607-006-00-8, oxalic acid: Acute Tox. 4 oral and dermal (as recalled); many suppliers add Eye Dam. 1 H318',
    },
  },
  {
    name: 'tannic acid',
    hazardBasis: 'memory',
    hazardSource: {
      from: 'supplier self-classification — recalled from memory, verify against the supplier SDS and the ECHA C&L Inventory',
      to: 'typical supplier classification: generally not classified',
    },
  },
  {
    name: 'calcium acetate',
    hazardBasis: 'memory',
    hazardSource: {
      from: 'recalled from memory (typical supplier SDS), verify against the supplier SDS and the ECHA C&L Inventory',
      to: 'typical supplier classification: generally not classified',
    },
  },
  {
    name: 'acetic acid (vinegar, 5 %)',
    hazardBasis: 'memory',
    hazardSource: {
      from: 'recalled from memory (typical supplier SDS), verify against the supplier SDS and the ECHA C&L Inventory',
      to: 'typical supplier classification: 5 % is below the concentration limits of the Annex VI entry for acetic acid (607-002-00-6)',
    },
  },
  {
    name: 'sodium hydroxide (caustic soda)',
    hazardBasis: 'harmonised',
    hazardSource: {
      from: 'recalled from memory (typical supplier SDS), verify against the supplier SDS and the ECHA C&L Inventory',
      to: 'Annex VI index 011-002-00-6, sodium hydroxide: Skin Corr. 1A (as recalled); suppliers add Met. Corr. 1 H290',
    },
  },
  {
    name: 'calcium oxide (quicklime)',
    hazardBasis: 'memory',
    hazardSource: {
      from: 'recalled from memory (typical supplier SDS), verify against the supplier SDS and the ECHA C&L Inventory',
      to: "typical supplier classification (REACH registrants' classification); no harmonised entry known",
    },
  },
  {
    name: 'sodium dithionite (hydrosulfite)',
    hazardBasis: 'harmonised',
    hazardSource: {
      from: 'recalled from memory (typical supplier SDS), verify against the supplier SDS and the ECHA C&L Inventory',
      to: 'Annex VI index 016-028-00-1, sodium dithionite: Self-heat. 1, Acute Tox. 4, EUH031 (as recalled; check the current Annex VI)',
    },
  },
  {
    name: 'thiourea dioxide',
    hazardBasis: 'memory',
    hazardSource: {
      from: 'recalled from memory (typical supplier SDS), verify against the supplier SDS and the ECHA C&L Inventory',
      to: 'typical supplier classification',
    },
  },
  {
    name: 'sodium arsenite',
    hazardBasis: 'memory',
    hazardSource: {
      from: 'recalled from memory (typical supplier SDS), verify against the supplier SDS and the ECHA C&L Inventory',
      to: 'typical supplier classification; arsenic compounds carry an Annex VI group entry: check how it covers sodium arsenite',
    },
  },
  {
    name: 'guar gum',
    hazardBasis: 'memory',
    hazardSource: {
      from: 'recalled from memory (typical supplier SDS), verify against the supplier SDS and the ECHA C&L Inventory',
      to: 'typical supplier classification: not classified',
    },
  },
  {
    name: 'gum arabic',
    hazardBasis: 'memory',
    hazardSource: {
      from: 'recalled from memory (typical supplier SDS), verify against the supplier SDS and the ECHA C&L Inventory',
      to: 'typical supplier classification: not classified',
    },
  },
  {
    name: 'wheat starch',
    hazardBasis: 'memory',
    hazardSource: {
      from: 'recalled from memory (typical supplier SDS), verify against the supplier SDS and the ECHA C&L Inventory',
      to: 'typical supplier classification: not classified',
    },
  },
  {
    name: 'potassium hydrogen tartrate (cream of tartar)',
    hazardBasis: 'memory',
    hazardSource: {
      from: 'recalled from memory (typical supplier SDS), verify against the supplier SDS and the ECHA C&L Inventory',
      to: 'typical supplier classification: not classified',
    },
  },
];

type Db = { id: number; hazardSource: string | null; hStatements: string | string[] | null; caution: string | null };
const statements = (v: Db['hStatements']): string[] => (typeof v === 'string' ? JSON.parse(v) : (v ?? []));
const same = (a: unknown, b: unknown) => JSON.stringify(a) === JSON.stringify(b);

async function apply(sequelize: MigrationContext['sequelize'], direction: 'up' | 'down') {
  for (const r of ROWS) {
    const [row] = await sequelize.query<Db>(
      'SELECT id, hazardSource, hStatements, caution FROM chemicals WHERE name = ?',
      { replacements: [r.name], type: QueryTypes.SELECT },
    );
    if (!row) continue;
    const sets: string[] = [];
    const values: unknown[] = [];
    const swap = <T>(field: 'hazardSource' | 'caution' | 'hStatements', change: Change<T> | undefined, current: T) => {
      if (!change) return true;
      const [want, give] = direction === 'up' ? [change.from, change.to] : [change.to, change.from];
      if (same(current, give)) return true;
      if (!same(current, want)) return false;
      sets.push(`${field} = ?`);
      values.push(field === 'hStatements' ? JSON.stringify(give) : give);
      return true;
    };
    const sourceOk = swap('hazardSource', r.hazardSource, row.hazardSource);
    swap('hStatements', r.hStatements, statements(row.hStatements));
    swap('caution', r.caution, row.caution);
    if (direction === 'up' && sourceOk) {
      sets.push('hazardBasis = ?');
      values.push(r.hazardBasis);
    }
    if (sets.length)
      await sequelize.query(`UPDATE chemicals SET ${sets.join(', ')} WHERE id = ?`, {
        replacements: [...values, row.id],
      });
  }
}

export const up: MigrationFn<MigrationContext> = async ({ context: { queryInterface: qi, sequelize } }) => {
  await qi.addColumn('chemicals', 'hazardBasis', {
    type: DataTypes.ENUM('harmonised', 'supplier', 'memory'),
    allowNull: true,
    defaultValue: null,
  });
  await apply(sequelize, 'up');
};

export const down: MigrationFn<MigrationContext> = async ({ context: { queryInterface: qi, sequelize } }) => {
  await apply(sequelize, 'down');
  await qi.removeColumn('chemicals', 'hazardBasis');
};
