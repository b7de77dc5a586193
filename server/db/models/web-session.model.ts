import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** One express-session record (the sign-in cookie's server side), serialised as JSON. */
export class WebSession extends Model<InferAttributes<WebSession>, InferCreationAttributes<WebSession>> {
  declare sid: string;
  declare data: string;
  declare expiresAt: Date;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initWebSession(sequelize: Sequelize) {
  WebSession.init(
    {
      sid: { type: DataTypes.STRING(64), primaryKey: true, allowNull: false },
      data: { type: DataTypes.TEXT, allowNull: false },
      expiresAt: { type: DataTypes.DATE, allowNull: false },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'web_sessions', modelName: 'WebSession' },
  );
}
