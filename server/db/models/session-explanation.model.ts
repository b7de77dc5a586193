import { DataTypes, Model, type CreationOptional, type ForeignKey, type InferAttributes, type InferCreationAttributes, type NonAttribute, type Sequelize } from 'sequelize';
import type { BenchSession } from './session.model';
import type { User } from './user.model';

/** What an engineer did with a configuration deviation that explains every answer. */
export const EXPLANATION_DECISIONS = ['applied', 'kept'] as const;
export type ExplanationDecision = (typeof EXPLANATION_DECISIONS)[number];

/**
 * The explanation of a session's answers, as the server computed it (shared/explain's
 * Explanation, stored as JSON); one per session. `decision` is null until an engineer applies
 * the deviation it found to the core, or keeps the core as declared.
 */
export class SessionExplanation extends Model<InferAttributes<SessionExplanation>, InferCreationAttributes<SessionExplanation>> {
  declare id: CreationOptional<number>;
  declare sessionId: ForeignKey<BenchSession['id']>;
  declare explanation: Record<string, unknown>;
  declare savedById: ForeignKey<User['id']> | null;
  declare decision: ExplanationDecision | null;
  declare decidedById: ForeignKey<User['id']> | null;
  declare decidedAt: Date | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare savedBy?: NonAttribute<User | null>;
  declare decidedBy?: NonAttribute<User | null>;
}

export function initSessionExplanation(sequelize: Sequelize) {
  SessionExplanation.init(
    {
      id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
      sessionId: { type: DataTypes.INTEGER, allowNull: false, unique: true },
      explanation: { type: DataTypes.JSON, allowNull: false },
      savedById: { type: DataTypes.INTEGER, allowNull: true },
      decision: { type: DataTypes.STRING(10), allowNull: true, validate: { isIn: [EXPLANATION_DECISIONS as unknown as string[]] } },
      decidedById: { type: DataTypes.INTEGER, allowNull: true },
      decidedAt: { type: DataTypes.DATE, allowNull: true },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'session_explanations', modelName: 'SessionExplanation' },
  );
}
