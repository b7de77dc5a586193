import { DataTypes, Model, type CreationOptional, type ForeignKey, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { Conditions, SoakRecord } from '../../../shared/soak';
import type { BenchSession } from './session.model';

/**
 * A session's operating conditions and soak books (migration 0010). The named conditions are
 * columns so ranges filter with indices; `unstableCodes` and `soakPasses` repeat the soak's
 * figures so lists and the condition grid need not read the JSON.
 */
export class SessionConditions extends Model<InferAttributes<SessionConditions>, InferCreationAttributes<SessionConditions>> {
  declare id: CreationOptional<number>;
  declare sessionId: ForeignKey<BenchSession['id']>;
  declare temperatureC: number | null;
  declare vccintV: number | null;
  declare clockMhz: number | null;
  declare other: Record<string, string> | null;
  declare soakPasses: number | null;
  declare unstableCodes: number | null;
  declare soak: SoakRecord | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  /** The conditions in the API's shape (shared/soak conditionsSchema). */
  conditions(): Conditions {
    const c: Conditions = {};
    if (this.temperatureC !== null) c.temperature_c = this.temperatureC;
    if (this.vccintV !== null) c.vccint_v = this.vccintV;
    if (this.clockMhz !== null) c.clock_mhz = this.clockMhz;
    if (this.other && Object.keys(this.other).length > 0) c.other = this.other;
    return c;
  }
}

export function initSessionConditions(sequelize: Sequelize) {
  SessionConditions.init(
    {
      id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
      sessionId: { type: DataTypes.INTEGER, allowNull: false, unique: true },
      temperatureC: { type: DataTypes.DOUBLE, allowNull: true },
      vccintV: { type: DataTypes.DOUBLE, allowNull: true },
      clockMhz: { type: DataTypes.DOUBLE, allowNull: true },
      other: { type: DataTypes.JSON, allowNull: true },
      soakPasses: { type: DataTypes.INTEGER, allowNull: true },
      unstableCodes: { type: DataTypes.INTEGER, allowNull: true },
      soak: { type: DataTypes.JSON, allowNull: true },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'session_conditions', modelName: 'SessionConditions' },
  );
}
