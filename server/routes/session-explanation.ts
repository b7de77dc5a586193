import { Router, type Request } from 'express';
import { currentUser, requireRole } from '../auth';
import { BenchSession, Core, SessionExplanation, User } from '../db/models';
import { HttpError, notFound } from '../http-error';
import { validate } from '../middleware/validate';
import { recordAudit } from '../services/audit';
import { applicableConfig, configKeyOf, coreStillDeclared, explainStoredSession, storedExplanation } from '../services/session-explanation';
import type { AnyExplanation } from '../../shared/explain';
import type { RouteDeps } from './deps';
import { paramsOf } from './params';
import { explanationDecisionBody, explanationDecisionReply, explanationParams, explanationReply, type ExplanationDecisionBody } from '../../shared/contract/session-explanation';
import { reply } from './reply';

const withPeople = [
  { model: User, as: 'savedBy', attributes: ['id', 'name'] },
  { model: User, as: 'decidedBy', attributes: ['id', 'name'] },
];

/**
 * /api/sessions/:sessionId/explanation: the search for the configuration or defect that
 * reproduces a session's answers, computed and saved by the server; everyone reads it, engineers
 * run it and decide on a configuration deviation it found.
 */
export function sessionExplanationRouter({ db }: RouteDeps) {
  const router = Router({ mergeParams: true });
  const sessionId = (req: Request) => paramsOf<{ sessionId: number }>(req).sessionId;
  const findStored = async (req: Request) => {
    const row = await SessionExplanation.findOne({ where: { sessionId: sessionId(req) }, include: withPeople });
    if (!row) {
      if (!(await BenchSession.findByPk(sessionId(req), { attributes: ['id'] }))) throw notFound('Session');
      throw notFound('Explanation of this session');
    }
    return row;
  };

  router
    .route('/')
    .get(requireRole('reviewer'), validate({ params: explanationParams }), async (req, res) => {
      reply(res, explanationReply, storedExplanation(await findStored(req)));
    })
    .post(requireRole('engineer'), validate({ params: explanationParams }), async (req, res) => {
      const me = currentUser(req);
      const session = await BenchSession.findByPk(sessionId(req), { attributes: ['id', 'coreId', 'samples'] });
      if (!session) throw notFound('Session');
      const core = await Core.findByPk(session.coreId);
      if (!core) throw notFound('Core');
      // Computed before the transaction opens: the search takes seconds and writes nothing.
      const explanation = explainStoredSession(session, core);
      const stored = explanation as unknown as Record<string, unknown>;
      await db.transaction(async (transaction) => {
        const [row, created] = await SessionExplanation.findOrCreate({
          where: { sessionId: session.id },
          defaults: { sessionId: session.id, explanation: stored, savedById: me.id, decision: null, decidedById: null, decidedAt: null },
          transaction,
        });
        // Run again, it replaces the last one and any decision on it.
        if (!created) await row.update({ explanation: stored, savedById: me.id, decision: null, decidedById: null, decidedAt: null }, { transaction });
        const best = explanation.hypotheses[0];
        await recordAudit(transaction, me.id, 'explain', 'session', session.id, { outcome: explanation.outcome, best: best?.label ?? null, exact: best?.exact ?? 0, answered: explanation.answered });
      });
      const row = await SessionExplanation.findOne({ where: { sessionId: session.id }, include: withPeople });
      reply(res, explanationReply, storedExplanation(row!), 201);
    });

  // Apply the configuration deviation to the core, or keep the core as declared: one audited step.
  router.route('/decision').post(requireRole('engineer'), validate({ params: explanationParams, body: explanationDecisionBody }), async (req, res) => {
    const me = currentUser(req);
    const choice = (req.body as ExplanationDecisionBody).decision;
    const row = await findStored(req);
    if (row.decision) throw new HttpError(409, 'conflict', `The explanation was already ${row.decision === 'applied' ? 'applied to the core' : 'set aside, keeping the core as declared'}`);
    const explanation = row.explanation as unknown as AnyExplanation;
    const config = applicableConfig(explanation);
    if (!config) throw new HttpError(409, 'conflict', 'decision: only a configuration deviation that reproduces every answer can be applied or kept');
    const session = await BenchSession.findByPk(row.sessionId, { attributes: ['id', 'coreId'] });
    const core = session ? await Core.findByPk(session.coreId) : null;
    if (!core) throw notFound('Core');
    const key = configKeyOf(explanation);
    if (choice === 'apply' && !coreStillDeclared(core, explanation)) {
      throw new HttpError(409, 'conflict', `The core’s ${key === 'vectorConfig' ? 'vectoring' : 'model'} configuration has changed since this explanation was saved: explain the session again first`);
    }
    await db.transaction(async (transaction) => {
      if (choice === 'apply') {
        await core.update({ [key]: config }, { transaction });
        await recordAudit(transaction, me.id, 'update', 'core', core.id, { [key]: config, fromExplanationOfSession: row.sessionId, hypothesis: explanation.hypotheses[0].label });
      }
      await row.update({ decision: choice === 'apply' ? 'applied' : 'kept', decidedById: me.id, decidedAt: new Date() }, { transaction });
      await recordAudit(transaction, me.id, choice === 'apply' ? 'apply-explanation' : 'keep-declared', 'session', row.sessionId, { coreId: core.id, hypothesis: explanation.hypotheses[0].label });
    });
    const fresh = await SessionExplanation.findOne({ where: { id: row.id }, include: withPeople });
    reply(res, explanationDecisionReply, { ...storedExplanation(fresh!), core });
  });

  return router;
}
