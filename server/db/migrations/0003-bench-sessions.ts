// Bench sessions and their comments. Samples are one packed BLOB per session (angle, cos, sin
// codes), never a row per sample; the indices serve the session list's filters and its default
// newest-first order.
import { DataTypes } from 'sequelize';
import type { MigrationModule } from '../migrator';

const id = { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true, allowNull: false };
const stamps = {
  createdAt: { type: DataTypes.DATE, allowNull: false },
  updatedAt: { type: DataTypes.DATE, allowNull: false },
};
const ref = (model: string, allowNull: boolean, onDelete: 'CASCADE' | 'SET NULL' | 'RESTRICT') => ({
  type: DataTypes.INTEGER,
  allowNull,
  references: { model, key: 'id' },
  onDelete,
});

export const up: MigrationModule['up'] = async ({ queryInterface: q }) => {
  await q.createTable('sessions', {
    id,
    coreId: ref('cores', false, 'CASCADE'),
    buildId: ref('builds', true, 'SET NULL'),
    boardId: ref('boards', true, 'SET NULL'),
    operatorId: ref('users', true, 'SET NULL'),
    startedAt: { type: DataTypes.DATE, allowNull: false },
    endedAt: { type: DataTypes.DATE, allowNull: true },
    plan: { type: DataTypes.JSON, allowNull: false },
    transport: { type: DataTypes.JSON, allowNull: false },
    deviceInfo: { type: DataTypes.JSON, allowNull: true },
    stats: { type: DataTypes.JSON, allowNull: false },
    verdict: { type: DataTypes.JSON, allowNull: false },
    passed: { type: DataTypes.BOOLEAN, allowNull: false },
    regression: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    sampleCount: { type: DataTypes.INTEGER, allowNull: false },
    samples: { type: DataTypes.BLOB, allowNull: false },
    archive: { type: DataTypes.BLOB, allowNull: true },
    notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    tags: { type: DataTypes.JSON, allowNull: false },
    ...stamps,
  });
  for (const column of ['coreId', 'buildId', 'boardId', 'operatorId', 'passed', 'regression', 'startedAt']) {
    await q.addIndex('sessions', [column]);
  }
  await q.createTable('comments', {
    id,
    sessionId: ref('sessions', false, 'CASCADE'),
    authorId: ref('users', true, 'SET NULL'),
    body: { type: DataTypes.TEXT, allowNull: false },
    ...stamps,
  });
  await q.addIndex('comments', ['sessionId']);
};

export const down: MigrationModule['down'] = async ({ queryInterface: q }) => {
  await q.dropTable('comments');
  await q.dropTable('sessions');
};
