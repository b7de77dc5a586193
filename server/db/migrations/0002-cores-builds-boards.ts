// What is tested and on what: cores (with watchers and golden vectors), builds (bitstreams) with
// their reviews, and boards. The baseline session is a plain integer here: the sessions table
// comes in the next migration and SQLite cannot add a foreign key to an existing table.
import { DataTypes } from 'sequelize';
import type { MigrationModule } from '../migrator';

const id = { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true, allowNull: false };
const stamps = {
  createdAt: { type: DataTypes.DATE, allowNull: false },
  updatedAt: { type: DataTypes.DATE, allowNull: false },
};
const ref = (model: string, allowNull: boolean, onDelete: 'CASCADE' | 'SET NULL') => ({
  type: DataTypes.INTEGER,
  allowNull,
  references: { model, key: 'id' },
  onDelete,
});

export const up: MigrationModule['up'] = async ({ queryInterface: q }) => {
  await q.createTable('cores', {
    id,
    name: { type: DataTypes.STRING(120), allowNull: false },
    slug: { type: DataTypes.STRING(64), allowNull: false, unique: true },
    linkProfile: { type: DataTypes.JSON, allowNull: false },
    modelConfig: { type: DataTypes.JSON, allowNull: false },
    limits: { type: DataTypes.JSON, allowNull: false },
    baselineSessionId: { type: DataTypes.INTEGER, allowNull: true },
    ...stamps,
  });
  await q.createTable('core_watchers', {
    id,
    coreId: ref('cores', false, 'CASCADE'),
    userId: ref('users', false, 'CASCADE'),
    ...stamps,
  });
  await q.addIndex('core_watchers', ['coreId', 'userId'], { unique: true });
  await q.createTable('boards', {
    id,
    name: { type: DataTypes.STRING(120), allowNull: false },
    serial: { type: DataTypes.STRING(80), allowNull: false },
    fpgaPart: { type: DataTypes.STRING(80), allowNull: false },
    adapter: { type: DataTypes.STRING(120), allowNull: false },
    location: { type: DataTypes.STRING(120), allowNull: false },
    ...stamps,
  });
  await q.createTable('builds', {
    id,
    coreId: ref('cores', false, 'CASCADE'),
    label: { type: DataTypes.STRING(120), allowNull: false },
    sourceRevision: { type: DataTypes.STRING(80), allowNull: false },
    toolVersion: { type: DataTypes.STRING(80), allowNull: false },
    clockMHz: { type: DataTypes.FLOAT, allowNull: false },
    notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    fileName: { type: DataTypes.STRING(255), allowNull: true },
    fileSize: { type: DataTypes.INTEGER, allowNull: true },
    sha256: { type: DataTypes.STRING(64), allowNull: true },
    createdById: ref('users', true, 'SET NULL'),
    ...stamps,
  });
  await q.addIndex('builds', ['coreId']);
  await q.createTable('reviews', {
    id,
    buildId: ref('builds', false, 'CASCADE'),
    reviewerId: ref('users', true, 'SET NULL'),
    decision: { type: DataTypes.STRING(16), allowNull: false },
    note: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    ...stamps,
  });
  await q.addIndex('reviews', ['buildId']);
  await q.createTable('golden_vector_sets', {
    id,
    coreId: ref('cores', false, 'CASCADE'),
    name: { type: DataTypes.STRING(120), allowNull: false },
    count: { type: DataTypes.INTEGER, allowNull: false },
    codes: { type: DataTypes.BLOB, allowNull: false },
    ...stamps,
  });
  await q.addIndex('golden_vector_sets', ['coreId']);
};

export const down: MigrationModule['down'] = async ({ queryInterface: q }) => {
  for (const table of ['golden_vector_sets', 'reviews', 'builds', 'boards', 'core_watchers', 'cores']) await q.dropTable(table);
};
