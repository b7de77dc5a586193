// Failed sign-ins counted in the database rather than in each server's memory, so the limit
// holds for every instance serving one database (server/auth/sign-in-attempt-store.ts). One row
// per client key: hits in the current window and when that window ends (epoch milliseconds, a
// plain integer both dialects compare the same way).
import { DataTypes } from 'sequelize';
import type { MigrationModule } from '../migrator';

export const up: MigrationModule['up'] = async ({ queryInterface: q }) => {
  await q.createTable('sign_in_attempts', {
    client: { type: DataTypes.STRING(255), primaryKey: true, allowNull: false },
    hits: { type: DataTypes.INTEGER, allowNull: false },
    resetMs: { type: DataTypes.BIGINT, allowNull: false },
  });
  await q.addIndex('sign_in_attempts', ['resetMs']);
};

export const down: MigrationModule['down'] = async ({ queryInterface: q }) => {
  await q.dropTable('sign_in_attempts');
};
