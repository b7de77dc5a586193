import { DataTypes, Model, type CreationOptional, type ForeignKey, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { Core } from './core.model';

/** Expected codes from RTL simulation, packed like session samples (angle, cos, sin per entry). */
export class GoldenVectorSet extends Model<InferAttributes<GoldenVectorSet>, InferCreationAttributes<GoldenVectorSet>> {
  declare id: CreationOptional<number>;
  declare coreId: ForeignKey<Core['id']>;
  declare name: string;
  declare count: number;
  declare codes: Buffer;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initGoldenVectorSet(sequelize: Sequelize) {
  GoldenVectorSet.init(
    {
      id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
      coreId: { type: DataTypes.INTEGER, allowNull: false },
      name: { type: DataTypes.STRING(120), allowNull: false, validate: { len: [1, 120] } },
      count: { type: DataTypes.INTEGER, allowNull: false, validate: { min: 0 } },
      codes: { type: DataTypes.BLOB, allowNull: false },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'golden_vector_sets', modelName: 'GoldenVectorSet' },
  );
}
