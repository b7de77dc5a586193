// The explanation saved with a session: the server's own search result (one per session, replaced
// when run again) and what an engineer decided about a configuration deviation it found. A table
// of its own rather than a column on sessions, so the sessions table and its BLOB order stay as
// they are; written with the query interface only, so every dialect gets the same table.
import { DataTypes } from 'sequelize';
import type { MigrationModule } from '../migrator';

const ref = (model: string, allowNull: boolean, onDelete: 'CASCADE' | 'SET NULL') => ({ type: DataTypes.INTEGER, allowNull, references: { model, key: 'id' }, onDelete });

export const up: MigrationModule['up'] = async ({ queryInterface: q }) => {
  await q.createTable('session_explanations', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true, allowNull: false },
    sessionId: { ...ref('sessions', false, 'CASCADE'), unique: true },
    explanation: { type: DataTypes.JSON, allowNull: false },
    savedById: ref('users', true, 'SET NULL'),
    decision: { type: DataTypes.STRING(10), allowNull: true },
    decidedById: ref('users', true, 'SET NULL'),
    decidedAt: { type: DataTypes.DATE, allowNull: true },
    createdAt: { type: DataTypes.DATE, allowNull: false },
    updatedAt: { type: DataTypes.DATE, allowNull: false },
  });
};

export const down: MigrationModule['down'] = async ({ queryInterface: q }) => {
  await q.dropTable('session_explanations');
};
