import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** A message the local SMTP catcher received. */
export class OutboxMessage extends Model<InferAttributes<OutboxMessage>, InferCreationAttributes<OutboxMessage>> {
  declare id: CreationOptional<number>;
  declare to: string;
  declare from: string;
  declare subject: string;
  declare text: string;
  declare html: string | null;
  declare receivedAt: CreationOptional<Date>;
}

export function initOutboxMessage(sequelize: Sequelize) {
  OutboxMessage.init(
    {
      id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
      to: { type: DataTypes.TEXT, allowNull: false },
      from: { type: DataTypes.TEXT, allowNull: false },
      subject: { type: DataTypes.TEXT, allowNull: false },
      text: { type: DataTypes.TEXT, allowNull: false },
      html: { type: DataTypes.TEXT, allowNull: true },
      receivedAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
    },
    { sequelize, tableName: 'outbox_messages', modelName: 'OutboxMessage', timestamps: false },
  );
}
