import { env } from '../env.ts';
import { sequelize, User } from '../models/index.ts';
import { createMigrator } from './migrator.ts';
import { seedReference } from '../seed/reference.ts';
import { seedDemo } from '../seed/demo.ts';
import { isProduction } from '../env.ts';

export async function migrate() {
  const applied = await createMigrator(sequelize).up();
  return applied.map((m) => m.name);
}

/** Reference vocabularies always; the demo scenario only into an empty database, never in production. */
export async function seed(mode = env.SEED) {
  if (mode === 'none') return { reference: false, demo: false };
  await sequelize.transaction((t) => seedReference(t));
  if (mode !== 'demo') return { reference: true, demo: false };
  if (isProduction) throw new Error('Refusing to seed demo accounts in production mode (set SEED=reference).');
  if ((await User.count()) > 0) return { reference: true, demo: false };
  await sequelize.transaction((t) => seedDemo(t));
  return { reference: true, demo: true };
}
