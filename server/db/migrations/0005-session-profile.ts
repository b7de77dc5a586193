// Each session keeps a 64-bin profile of its error against angle, so the session list can draw a
// sparkline per row without reading the samples. Sessions stored before have none (null).
import { DataTypes } from 'sequelize';
import type { MigrationModule } from '../migrator';

export const up: MigrationModule['up'] = async ({ queryInterface: q }) => {
  await q.addColumn('sessions', 'profile', { type: DataTypes.JSON, allowNull: true });
};

export const down: MigrationModule['down'] = async ({ queryInterface: q }) => {
  await q.removeColumn('sessions', 'profile');
};
