import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** A physical bench board: its FPGA, the UART adapter wired to it and where it lives. */
export class Board extends Model<InferAttributes<Board>, InferCreationAttributes<Board>> {
  declare id: CreationOptional<number>;
  declare name: string;
  declare serial: string;
  declare fpgaPart: string;
  declare adapter: string;
  declare location: string;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initBoard(sequelize: Sequelize) {
  Board.init(
    {
      id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
      name: { type: DataTypes.STRING(120), allowNull: false, validate: { len: [1, 120] } },
      serial: { type: DataTypes.STRING(80), allowNull: false },
      fpgaPart: { type: DataTypes.STRING(80), allowNull: false },
      adapter: { type: DataTypes.STRING(120), allowNull: false },
      location: { type: DataTypes.STRING(120), allowNull: false },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'boards', modelName: 'Board' },
  );
}
