// Who an invitation is for, as the admin wrote it; the invitee still chooses their own name.
import { DataTypes } from 'sequelize';
import type { MigrationModule } from '../migrator';

export const up: MigrationModule['up'] = async ({ queryInterface: q }) => {
  await q.addColumn('invitations', 'name', { type: DataTypes.STRING(120), allowNull: true });
};

export const down: MigrationModule['down'] = async ({ queryInterface: q }) => {
  await q.removeColumn('invitations', 'name');
};
