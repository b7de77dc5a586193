import { DataTypes, Model, type CreationOptional, type ForeignKey, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { Core } from './core.model';
import type { User } from './user.model';

/** A user who is mailed when a session of this core is a regression. */
export class CoreWatcher extends Model<InferAttributes<CoreWatcher>, InferCreationAttributes<CoreWatcher>> {
  declare id: CreationOptional<number>;
  declare coreId: ForeignKey<Core['id']>;
  declare userId: ForeignKey<User['id']>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initCoreWatcher(sequelize: Sequelize) {
  CoreWatcher.init(
    {
      id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
      coreId: { type: DataTypes.INTEGER, allowNull: false },
      userId: { type: DataTypes.INTEGER, allowNull: false },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'core_watchers', modelName: 'CoreWatcher', indexes: [{ unique: true, fields: ['coreId', 'userId'] }] },
  );
}
