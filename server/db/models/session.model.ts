import { DataTypes, Model, type CreationOptional, type ForeignKey, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { Board } from './board.model';
import type { Build } from './build.model';
import type { Core } from './core.model';
import type { User } from './user.model';

import type { SessionPlan, SessionTransport, StoredStats, Verdict } from '../../../shared/contract/sessions';

/**
 * One recorded bench session. Named BenchSession in code so it is never confused with the
 * sign-in session (express-session); its table is `sessions`, as in the API.
 * `samples` packs the angle, cos and sin codes of every result; `archive` is the recorder's raw
 * capture when one was uploaded.
 */
export class BenchSession extends Model<InferAttributes<BenchSession>, InferCreationAttributes<BenchSession>> {
  declare id: CreationOptional<number>;
  declare coreId: ForeignKey<Core['id']>;
  declare buildId: ForeignKey<Build['id']> | null;
  declare boardId: ForeignKey<Board['id']> | null;
  declare operatorId: ForeignKey<User['id']> | null;
  declare startedAt: Date;
  declare endedAt: Date | null;
  // The JSON columns, typed from the API contract (shared/contract/sessions.ts).
  declare plan: SessionPlan;
  declare transport: SessionTransport;
  declare deviceInfo: Record<string, unknown> | null;
  declare stats: StoredStats;
  declare verdict: Verdict;
  /** Largest |error| in LSB per 1/64 of the code range (-1: no answer there); null for old rows. */
  declare profile: CreationOptional<number[] | null>;
  declare passed: boolean;
  declare regression: CreationOptional<boolean>;
  declare sampleCount: number;
  declare samples: Buffer;
  declare archive: Buffer | null;
  declare notes: CreationOptional<string>;
  declare tags: CreationOptional<string[]>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initBenchSession(sequelize: Sequelize) {
  BenchSession.init(
    {
      id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
      coreId: { type: DataTypes.INTEGER, allowNull: false },
      buildId: { type: DataTypes.INTEGER, allowNull: true },
      boardId: { type: DataTypes.INTEGER, allowNull: true },
      operatorId: { type: DataTypes.INTEGER, allowNull: true },
      startedAt: { type: DataTypes.DATE, allowNull: false },
      endedAt: { type: DataTypes.DATE, allowNull: true },
      plan: { type: DataTypes.JSON, allowNull: false },
      transport: { type: DataTypes.JSON, allowNull: false },
      deviceInfo: { type: DataTypes.JSON, allowNull: true },
      stats: { type: DataTypes.JSON, allowNull: false },
      verdict: { type: DataTypes.JSON, allowNull: false },
      profile: { type: DataTypes.JSON, allowNull: true },
      passed: { type: DataTypes.BOOLEAN, allowNull: false },
      regression: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
      sampleCount: { type: DataTypes.INTEGER, allowNull: false, validate: { min: 0 } },
      samples: { type: DataTypes.BLOB, allowNull: false },
      archive: { type: DataTypes.BLOB, allowNull: true },
      notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
      tags: { type: DataTypes.JSON, allowNull: false, defaultValue: [] },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'sessions', modelName: 'BenchSession' },
  );
}
