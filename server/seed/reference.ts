import { readFileSync } from 'node:fs';
import path from 'node:path';
import type { Transaction } from 'sequelize';
import { ROOT_DIR } from '../env.ts';
import { Chemical, Dyestuff, VocabularyTerm } from '../models/index.ts';
import type { ChemicalRole, ChemicalStatus, Vocabulary } from '../models/reference.ts';

const dataFile = (name: string) => JSON.parse(readFileSync(path.join(ROOT_DIR, 'server/seed/data', name), 'utf8'));

type ChemicalRow = {
  name: string;
  role: ChemicalRole;
  formula: string | null;
  metal: string | null;
  status: ChemicalStatus;
  signalWord: 'Danger' | 'Warning' | null;
  hStatements: string[];
  ppe: string;
  caution: string;
  source: string;
  hazardSource: string;
  /** Absent on a row means nobody stated a basis: it is treated as recalled from memory. */
  hazardBasis?: 'harmonised' | 'supplier' | 'memory';
};

/** Reference vocabularies from the data files in server/seed/data; idempotent (upsert by name). */
export async function seedReference(transaction?: Transaction) {
  const vocab = dataFile('vocabularies.json') as Record<
    Vocabulary,
    Array<{ term: string; note?: string; source: string }>
  >;
  for (const [vocabulary, rows] of Object.entries(vocab) as Array<[Vocabulary, typeof vocab.fibre]>) {
    for (const r of rows) {
      await VocabularyTerm.findOrCreate({
        where: { vocabulary, term: r.term },
        defaults: { vocabulary, term: r.term, note: r.note ?? null, source: r.source },
        transaction,
      });
    }
  }
  for (const d of dataFile('dyestuffs.json') as Array<Omit<Dyestuff['_creationAttributes'], 'id'>>) {
    await Dyestuff.findOrCreate({ where: { name: d.name }, defaults: d, transaction });
  }
  for (const c of dataFile('chemicals.json') as ChemicalRow[]) {
    const {
      name,
      role,
      formula,
      metal,
      status,
      signalWord,
      hStatements,
      ppe,
      caution,
      source,
      hazardSource,
      hazardBasis,
    } = c;
    await Chemical.findOrCreate({
      where: { name },
      defaults: {
        name,
        role,
        formula,
        metal,
        status,
        signalWord,
        hStatements,
        ppe,
        caution,
        source,
        hazardSource,
        hazardBasis: hazardBasis ?? 'memory',
      },
      transaction,
    });
  }
}
