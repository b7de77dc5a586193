import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import { ROLES, type Role } from '../../../shared/contract/people';

// The roles are the API contract's (one list); the model's column accepts exactly those.
export { ROLES, type Role };

export class User extends Model<InferAttributes<User>, InferCreationAttributes<User>> {
  declare id: CreationOptional<number>;
  declare email: string;
  declare name: string;
  declare role: Role;
  declare passwordHash: string;
  declare disabled: CreationOptional<boolean>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  /** What the API shows of a user: never the password hash. */
  toPublic() {
    return { id: this.id, email: this.email, name: this.name, role: this.role, disabled: this.disabled, createdAt: this.createdAt };
  }
}

export function initUser(sequelize: Sequelize) {
  User.init(
    {
      id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
      email: { type: DataTypes.STRING(254), allowNull: false, unique: true, validate: { isEmail: true } },
      name: { type: DataTypes.STRING(120), allowNull: false, validate: { len: [1, 120] } },
      role: { type: DataTypes.STRING(16), allowNull: false, validate: { isIn: [ROLES as unknown as string[]] } },
      passwordHash: { type: DataTypes.STRING(100), allowNull: false, validate: { notEmpty: true } },
      disabled: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'users', modelName: 'User' },
  );
}
