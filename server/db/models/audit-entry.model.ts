import { DataTypes, Model, type CreationOptional, type ForeignKey, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { User } from './user.model';

/** Who changed what, written in the same transaction as the change itself. */
export class AuditEntry extends Model<InferAttributes<AuditEntry>, InferCreationAttributes<AuditEntry>> {
  declare id: CreationOptional<number>;
  declare userId: ForeignKey<User['id']> | null;
  declare action: string;
  declare entity: string;
  declare entityId: number | null;
  declare detail: Record<string, unknown> | null;
  declare at: CreationOptional<Date>;
}

export function initAuditEntry(sequelize: Sequelize) {
  AuditEntry.init(
    {
      id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
      userId: { type: DataTypes.INTEGER, allowNull: true },
      action: { type: DataTypes.STRING(40), allowNull: false, validate: { notEmpty: true } },
      entity: { type: DataTypes.STRING(40), allowNull: false, validate: { notEmpty: true } },
      entityId: { type: DataTypes.INTEGER, allowNull: true },
      detail: { type: DataTypes.JSON, allowNull: true },
      at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
    },
    { sequelize, tableName: 'audit_entries', modelName: 'AuditEntry', timestamps: false },
  );
}
