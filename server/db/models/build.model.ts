import { DataTypes, Model, type CreationOptional, type ForeignKey, type InferAttributes, type InferCreationAttributes, type NonAttribute, type Sequelize } from 'sequelize';
import type { Core } from './core.model';
import type { Review } from './review.model';
import type { User } from './user.model';

/** One bitstream of a core. The file fields stay null until a bitstream is uploaded. */
export class Build extends Model<InferAttributes<Build>, InferCreationAttributes<Build>> {
  declare id: CreationOptional<number>;
  declare coreId: ForeignKey<Core['id']>;
  declare label: string;
  declare sourceRevision: string;
  declare toolVersion: string;
  declare clockMHz: number;
  declare notes: CreationOptional<string>;
  declare fileName: CreationOptional<string | null>;
  declare fileSize: CreationOptional<number | null>;
  declare sha256: CreationOptional<string | null>;
  declare createdById: ForeignKey<User['id']> | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare reviews?: NonAttribute<Review[]>;
  declare createdBy?: NonAttribute<User | null>;
}

export function initBuild(sequelize: Sequelize) {
  Build.init(
    {
      id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
      coreId: { type: DataTypes.INTEGER, allowNull: false },
      label: { type: DataTypes.STRING(120), allowNull: false, validate: { len: [1, 120] } },
      sourceRevision: { type: DataTypes.STRING(80), allowNull: false },
      toolVersion: { type: DataTypes.STRING(80), allowNull: false },
      clockMHz: { type: DataTypes.FLOAT, allowNull: false, validate: { min: 0.001, max: 10_000 } },
      notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
      fileName: { type: DataTypes.STRING(255), allowNull: true },
      fileSize: { type: DataTypes.INTEGER, allowNull: true, validate: { min: 0 } },
      sha256: { type: DataTypes.STRING(64), allowNull: true, validate: { is: /^[0-9a-f]{64}$/ } },
      createdById: { type: DataTypes.INTEGER, allowNull: true },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'builds', modelName: 'Build' },
  );
}
