import { sequelize } from '../models/index.ts';
import { createMigrator } from './migrator.ts';
import { migrate, seed } from './setup.ts';
import { installSearchHooks } from '../search/hooks.ts';

// npm run db:migrate | db:rollback | db:seed
const command = process.argv[2];
try {
  if (command === 'migrate') console.log('applied:', (await migrate()).join(', ') || 'nothing to do');
  else if (command === 'rollback')
    console.log('reverted:', (await createMigrator(sequelize).down()).map((m) => m.name).join(', ') || 'nothing');
  else if (command === 'seed') {
    // Seeded rows reach the search of app servers already running, through the change log.
    installSearchHooks();
    console.log(await seed());
  } else throw new Error('usage: cli.ts migrate|rollback|seed');
} finally {
  await sequelize.close();
}
