import type { MigrationFn } from 'umzug';
import type { MigrationContext } from '../migrator.ts';

// photos.trialId gets the foreign key it lacked (photos was created before trials in 0001). ON DELETE RESTRICT:
// a trial is deleted through its service, which removes its swatch photos first and their files and tiles after
// the commit (server/services/trials/trials.ts deleteTrial); a bare DELETE of a trial that still has photos is refused.
// Orphans first: a photo pointing at a trial that no longer exists loses that dangling link (its rows are kept;
// nothing is deleted by the migration).
const NAME = 'photos_trial_fk';

export const up: MigrationFn<MigrationContext> = async ({ context: { queryInterface: qi, sequelize } }) => {
  await sequelize.query(
    'UPDATE photos p LEFT JOIN trials t ON t.id = p.trialId SET p.trialId = NULL WHERE p.trialId IS NOT NULL AND t.id IS NULL',
  );
  await qi.addConstraint('photos', {
    type: 'foreign key',
    name: NAME,
    fields: ['trialId'],
    references: { table: 'trials', field: 'id' },
    onDelete: 'RESTRICT',
    onUpdate: 'CASCADE',
  });
};

export const down: MigrationFn<MigrationContext> = async ({ context: { queryInterface: qi } }) => {
  await qi.removeConstraint('photos', NAME);
  // MariaDB keeps the index it made for the key; it is harmless but removed so down leaves 0019's schema.
  const indexes = (await qi.showIndex('photos')) as Array<{ name: string }>;
  if (indexes.some((i) => i.name === NAME)) await qi.removeIndex('photos', NAME);
};
