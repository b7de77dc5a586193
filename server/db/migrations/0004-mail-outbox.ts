// Messages caught by the local SMTP catcher, for the admins' outbox page.
import { DataTypes } from 'sequelize';
import type { MigrationModule } from '../migrator';

export const up: MigrationModule['up'] = async ({ queryInterface: q }) => {
  await q.createTable('outbox_messages', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true, allowNull: false },
    to: { type: DataTypes.TEXT, allowNull: false },
    from: { type: DataTypes.TEXT, allowNull: false },
    subject: { type: DataTypes.TEXT, allowNull: false },
    text: { type: DataTypes.TEXT, allowNull: false },
    html: { type: DataTypes.TEXT, allowNull: true },
    receivedAt: { type: DataTypes.DATE, allowNull: false },
  });
  await q.addIndex('outbox_messages', ['receivedAt']);
};

export const down: MigrationModule['down'] = async ({ queryInterface: q }) => {
  await q.dropTable('outbox_messages');
};
