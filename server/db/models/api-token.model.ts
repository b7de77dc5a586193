import { DataTypes, Model, type CreationOptional, type ForeignKey, type InferAttributes, type InferCreationAttributes, type NonAttribute, type Sequelize } from 'sequelize';
import type { User } from './user.model';

/** A personal token for the runner. Stored as its SHA-256; `prefix` lets the owner recognise it. */
export class ApiToken extends Model<InferAttributes<ApiToken>, InferCreationAttributes<ApiToken>> {
  declare id: CreationOptional<number>;
  declare userId: ForeignKey<User['id']>;
  declare name: string;
  declare tokenHash: string;
  declare prefix: string;
  declare lastUsedAt: Date | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare user?: NonAttribute<User>;

  toPublic() {
    return { id: this.id, name: this.name, prefix: this.prefix, lastUsedAt: this.lastUsedAt, createdAt: this.createdAt };
  }
}

export function initApiToken(sequelize: Sequelize) {
  ApiToken.init(
    {
      id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
      userId: { type: DataTypes.INTEGER, allowNull: false },
      name: { type: DataTypes.STRING(80), allowNull: false, validate: { len: [1, 80] } },
      tokenHash: { type: DataTypes.STRING(64), allowNull: false, unique: true, validate: { is: /^[0-9a-f]{64}$/ } },
      prefix: { type: DataTypes.STRING(16), allowNull: false },
      lastUsedAt: { type: DataTypes.DATE, allowNull: true },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'api_tokens', modelName: 'ApiToken' },
  );
}
