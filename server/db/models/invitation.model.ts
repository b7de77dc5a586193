import { DataTypes, Model, type CreationOptional, type ForeignKey, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import { ROLES, type Role, type User } from './user.model';

/** A one-time invitation; only the SHA-256 of its token is stored, the token itself is mailed. */
export class Invitation extends Model<InferAttributes<Invitation>, InferCreationAttributes<Invitation>> {
  declare id: CreationOptional<number>;
  declare email: string;
  /** Who it is for, as the admin wrote it (optional). */
  declare name: CreationOptional<string | null>;
  declare role: Role;
  declare tokenHash: string;
  declare expiresAt: Date;
  declare usedAt: Date | null;
  declare invitedById: ForeignKey<User['id']> | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  toPublic() {
    return { id: this.id, email: this.email, name: this.name ?? null, role: this.role, expiresAt: this.expiresAt, usedAt: this.usedAt, invitedById: this.invitedById, createdAt: this.createdAt };
  }
}

export function initInvitation(sequelize: Sequelize) {
  Invitation.init(
    {
      id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
      email: { type: DataTypes.STRING(254), allowNull: false, validate: { isEmail: true } },
      name: { type: DataTypes.STRING(120), allowNull: true },
      role: { type: DataTypes.STRING(16), allowNull: false, validate: { isIn: [ROLES as unknown as string[]] } },
      tokenHash: { type: DataTypes.STRING(64), allowNull: false, unique: true, validate: { is: /^[0-9a-f]{64}$/ } },
      expiresAt: { type: DataTypes.DATE, allowNull: false },
      usedAt: { type: DataTypes.DATE, allowNull: true },
      invitedById: { type: DataTypes.INTEGER, allowNull: true },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'invitations', modelName: 'Invitation' },
  );
}
