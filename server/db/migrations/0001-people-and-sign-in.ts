// Who may sign in and how: accounts, invitations, API tokens, the sign-in cookie store and the
// audit log. Column names follow the model attributes (camelCase) so models need no mapping.
import { DataTypes } from 'sequelize';
import type { MigrationModule } from '../migrator';

const id = { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true, allowNull: false };
const stamps = {
  createdAt: { type: DataTypes.DATE, allowNull: false },
  updatedAt: { type: DataTypes.DATE, allowNull: false },
};
const userRef = (allowNull: boolean, onDelete: 'CASCADE' | 'SET NULL') => ({
  type: DataTypes.INTEGER,
  allowNull,
  references: { model: 'users', key: 'id' },
  onDelete,
});

export const up: MigrationModule['up'] = async ({ queryInterface: q }) => {
  await q.createTable('users', {
    id,
    email: { type: DataTypes.STRING(254), allowNull: false, unique: true },
    name: { type: DataTypes.STRING(120), allowNull: false },
    role: { type: DataTypes.STRING(16), allowNull: false },
    passwordHash: { type: DataTypes.STRING(100), allowNull: false },
    disabled: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    ...stamps,
  });
  await q.createTable('invitations', {
    id,
    email: { type: DataTypes.STRING(254), allowNull: false },
    role: { type: DataTypes.STRING(16), allowNull: false },
    tokenHash: { type: DataTypes.STRING(64), allowNull: false, unique: true },
    expiresAt: { type: DataTypes.DATE, allowNull: false },
    usedAt: { type: DataTypes.DATE, allowNull: true },
    invitedById: userRef(true, 'SET NULL'),
    ...stamps,
  });
  await q.createTable('api_tokens', {
    id,
    userId: userRef(false, 'CASCADE'),
    name: { type: DataTypes.STRING(80), allowNull: false },
    tokenHash: { type: DataTypes.STRING(64), allowNull: false, unique: true },
    prefix: { type: DataTypes.STRING(16), allowNull: false },
    lastUsedAt: { type: DataTypes.DATE, allowNull: true },
    ...stamps,
  });
  await q.addIndex('api_tokens', ['userId']);
  await q.createTable('web_sessions', {
    sid: { type: DataTypes.STRING(64), primaryKey: true, allowNull: false },
    data: { type: DataTypes.TEXT, allowNull: false },
    expiresAt: { type: DataTypes.DATE, allowNull: false },
    ...stamps,
  });
  await q.addIndex('web_sessions', ['expiresAt']);
  await q.createTable('audit_entries', {
    id,
    userId: userRef(true, 'SET NULL'),
    action: { type: DataTypes.STRING(40), allowNull: false },
    entity: { type: DataTypes.STRING(40), allowNull: false },
    entityId: { type: DataTypes.INTEGER, allowNull: true },
    detail: { type: DataTypes.JSON, allowNull: true },
    at: { type: DataTypes.DATE, allowNull: false },
  });
  await q.addIndex('audit_entries', ['at']);
};

export const down: MigrationModule['down'] = async ({ queryInterface: q }) => {
  for (const table of ['audit_entries', 'web_sessions', 'api_tokens', 'invitations', 'users']) await q.dropTable(table);
};
