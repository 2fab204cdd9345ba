import { DataTypes } from 'sequelize';
import type { MigrationFn } from 'umzug';
import type { MigrationContext } from '../migrator.ts';

// Ingest as a job (issue 18): a photo's processing after its master is stored (EXIF, derivatives, palette, tiles)
// runs as one `ingest-photo` job, and the photo records the stage it has reached and why it failed. The stage
// replaces tileStatus (tiles are the last step): tiled photos are done, failed ones failed, the rest queued; queued
// and running `tile-photo` jobs become `ingest-photo` jobs with the same payload ({ photoId }), whose steps skip
// what a photo already has (its derivatives).
const STAGES = ['queued', 'reading', 'palette', 'tiles', 'done', 'failed'];

export const up: MigrationFn<MigrationContext> = async ({ context: { queryInterface: qi, sequelize } }) => {
  await qi.addColumn('photos', 'ingestStage', {
    type: DataTypes.ENUM(...STAGES),
    allowNull: false,
    defaultValue: 'queued',
  });
  await qi.addColumn('photos', 'ingestError', { type: DataTypes.STRING(2000), allowNull: true });
  await sequelize.query("UPDATE photos SET ingestStage = 'done' WHERE tileStatus = 'done'");
  await sequelize.query(
    "UPDATE photos SET ingestStage = 'failed', ingestError = 'Building the deep-zoom tiles failed.' WHERE tileStatus = 'failed'",
  );
  await sequelize.query("UPDATE jobs SET type = 'ingest-photo' WHERE type = 'tile-photo'");
  await qi.removeColumn('photos', 'tileStatus');
};

export const down: MigrationFn<MigrationContext> = async ({ context: { queryInterface: qi, sequelize } }) => {
  await qi.addColumn('photos', 'tileStatus', {
    type: DataTypes.ENUM('none', 'queued', 'running', 'done', 'failed'),
    allowNull: false,
    defaultValue: 'none',
  });
  await sequelize.query(
    "UPDATE photos SET tileStatus = CASE ingestStage WHEN 'done' THEN 'done' WHEN 'failed' THEN 'failed' ELSE 'queued' END",
  );
  await sequelize.query("UPDATE jobs SET type = 'tile-photo' WHERE type = 'ingest-photo'");
  await qi.removeColumn('photos', 'ingestError');
  await qi.removeColumn('photos', 'ingestStage');
};
