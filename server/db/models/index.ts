import type { Sequelize } from 'sequelize';
import { ApiToken, initApiToken } from './api-token.model';
import { AuditEntry, initAuditEntry } from './audit-entry.model';
import { Board, initBoard } from './board.model';
import { Build, initBuild } from './build.model';
import { Comment, initComment } from './comment.model';
import { Core, initCore } from './core.model';
import { CoreWatcher, initCoreWatcher } from './core-watcher.model';
import { GoldenVectorSet, initGoldenVectorSet } from './golden-vector-set.model';
import { Invitation, initInvitation } from './invitation.model';
import { OutboxMessage, initOutboxMessage } from './outbox-message.model';
import { Review, initReview } from './review.model';
import { BenchSession, initBenchSession } from './session.model';
import { SessionExplanation, initSessionExplanation } from './session-explanation.model';
import { SessionConditions, initSessionConditions } from './session-conditions.model';
import { SessionEnvelope, initSessionEnvelope } from './session-envelope.model';
import { User, initUser } from './user.model';
import { WebSession, initWebSession } from './web-session.model';

export { ApiToken, AuditEntry, Board, Build, Comment, Core, CoreWatcher, GoldenVectorSet, Invitation, OutboxMessage, Review, BenchSession, User, WebSession };
export { SessionExplanation };
export { SessionConditions };
export { SessionEnvelope };
export { EXPLANATION_DECISIONS, type ExplanationDecision } from './session-explanation.model';
export { ROLES, type Role } from './user.model';
export { DECISIONS, type Decision } from './review.model';

/**
 * Bind every model to `sequelize`, then declare the associations. The model classes are module
 * singletons, so this re-binds them when called with another connection (a test that builds an
 * app over a second database); calling it again with the same connection does nothing.
 */
export function initModels(sequelize: Sequelize) {
  if (User.sequelize === sequelize) return;
  for (const init of [
    initUser, initInvitation, initApiToken, initWebSession, initAuditEntry, initOutboxMessage, initCore, initCoreWatcher,
    initBoard, initBuild, initReview, initGoldenVectorSet, initBenchSession, initComment,
    initSessionExplanation, initSessionConditions, initSessionEnvelope,
  ]) {
    init(sequelize);
  }

  ApiToken.belongsTo(User, { as: 'user', foreignKey: 'userId' });
  User.hasMany(ApiToken, { as: 'apiTokens', foreignKey: 'userId' });
  Invitation.belongsTo(User, { as: 'invitedBy', foreignKey: 'invitedById' });
  AuditEntry.belongsTo(User, { as: 'user', foreignKey: 'userId' });

  Core.belongsToMany(User, { through: CoreWatcher, as: 'watchers', foreignKey: 'coreId', otherKey: 'userId' });
  Core.hasMany(Build, { as: 'builds', foreignKey: 'coreId' });
  Core.hasMany(GoldenVectorSet, { as: 'goldenVectorSets', foreignKey: 'coreId' });
  Build.belongsTo(Core, { as: 'core', foreignKey: 'coreId' });
  Build.belongsTo(User, { as: 'createdBy', foreignKey: 'createdById' });
  Build.hasMany(Review, { as: 'reviews', foreignKey: 'buildId' });
  Review.belongsTo(Build, { as: 'build', foreignKey: 'buildId' });
  Review.belongsTo(User, { as: 'reviewer', foreignKey: 'reviewerId' });
  GoldenVectorSet.belongsTo(Core, { as: 'core', foreignKey: 'coreId' });

  BenchSession.belongsTo(Core, { as: 'core', foreignKey: 'coreId' });
  BenchSession.belongsTo(Build, { as: 'build', foreignKey: 'buildId' });
  BenchSession.belongsTo(Board, { as: 'board', foreignKey: 'boardId' });
  BenchSession.belongsTo(User, { as: 'operator', foreignKey: 'operatorId' });
  BenchSession.hasMany(Comment, { as: 'comments', foreignKey: 'sessionId' });
  Comment.belongsTo(BenchSession, { as: 'session', foreignKey: 'sessionId' });
  Comment.belongsTo(User, { as: 'author', foreignKey: 'authorId' });
  SessionExplanation.belongsTo(User, { as: 'savedBy', foreignKey: 'savedById' });
  BenchSession.hasOne(SessionConditions, { as: 'conditions', foreignKey: 'sessionId' });
  SessionExplanation.belongsTo(User, { as: 'decidedBy', foreignKey: 'decidedById' });
}
