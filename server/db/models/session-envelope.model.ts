import { DataTypes, Model, type CreationOptional, type ForeignKey, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { BenchSession } from './session.model';

/**
 * The compare view's error envelope of an uploaded or imported session (lowest and highest signed
 * error per bin of the code range, null where no answer fell; server/services/error-envelope.ts),
 * scored once at intake so comparing never scores the samples again. Kept beside the sessions
 * table, not in it, so the list never reads it. Sessions without one are scored when compared.
 */
export class SessionEnvelope extends Model<InferAttributes<SessionEnvelope>, InferCreationAttributes<SessionEnvelope>> {
  declare sessionId: ForeignKey<BenchSession['id']>;
  declare bounds: { lo: (number | null)[]; hi: (number | null)[] };
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initSessionEnvelope(sequelize: Sequelize) {
  SessionEnvelope.init(
    {
      sessionId: { type: DataTypes.INTEGER, primaryKey: true },
      bounds: { type: DataTypes.JSON, allowNull: false },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'session_envelopes', modelName: 'SessionEnvelope' },
  );
}
