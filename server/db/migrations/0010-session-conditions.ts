// The operating conditions a session ran under and, for a soak, its books: a table of its own
// (one row per session that has either), so the sessions table and its BLOB order stay as they
// are. The three named conditions are typed columns with indices, so the sessions list filters
// them by range; free-form pairs, the soak's timeline and unstable codes are JSON. Written with
// the query interface only, so every dialect gets the same table.
import { DataTypes } from 'sequelize';
import type { MigrationModule } from '../migrator';

export const up: MigrationModule['up'] = async ({ queryInterface: q }) => {
  await q.createTable('session_conditions', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true, allowNull: false },
    sessionId: { type: DataTypes.INTEGER, allowNull: false, unique: true, references: { model: 'sessions', key: 'id' }, onDelete: 'CASCADE' },
    temperatureC: { type: DataTypes.DOUBLE, allowNull: true },
    vccintV: { type: DataTypes.DOUBLE, allowNull: true },
    clockMhz: { type: DataTypes.DOUBLE, allowNull: true },
    other: { type: DataTypes.JSON, allowNull: true },
    soakPasses: { type: DataTypes.INTEGER, allowNull: true },
    unstableCodes: { type: DataTypes.INTEGER, allowNull: true },
    soak: { type: DataTypes.JSON, allowNull: true },
    createdAt: { type: DataTypes.DATE, allowNull: false },
    updatedAt: { type: DataTypes.DATE, allowNull: false },
  });
  for (const column of ['temperatureC', 'vccintV', 'clockMhz']) await q.addIndex('session_conditions', [column]);
};

export const down: MigrationModule['down'] = async ({ queryInterface: q }) => {
  await q.dropTable('session_conditions');
};
