// Each session keeps the compare view's error envelope (lowest and highest signed error per bin of
// the code range), scored once at ingest, so comparing sessions reads it instead of scoring a
// million samples again. Sessions stored before have none (null) and are scored when compared.
// On SQLite the new column lands after the blobs: the list and detail never select it.
import { DataTypes } from 'sequelize';
import type { MigrationModule } from '../migrator';

export const up: MigrationModule['up'] = async ({ queryInterface: q }) => {
  await q.addColumn('sessions', 'envelope', { type: DataTypes.JSON, allowNull: true });
};

export const down: MigrationModule['down'] = async ({ queryInterface: q }) => {
  await q.removeColumn('sessions', 'envelope');
};
