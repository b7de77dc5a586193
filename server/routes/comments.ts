import { Router, type Request } from 'express';
import { z } from 'zod';
import { currentUser, hasRole, requireRole } from '../auth';
import { BenchSession, Comment, User } from '../db/models';
import { HttpError, notFound } from '../http-error';
import { validate } from '../middleware/validate';
import { recordAudit } from '../services/audit';
import type { RouteDeps } from './deps';
import { id, idParams, paramsOf } from './params';
import { commentBody, commentListReply, commentReply } from '../../shared/contract/misc';
import { reply } from './reply';

const sessionParams = z.strictObject({ sessionId: id });
const withAuthor = [{ model: User, as: 'author', attributes: ['id', 'name'] }];

/** /api/sessions/:sessionId/comments: everyone signed in reads and writes remarks on a session. */
export function sessionCommentsRouter({ db }: RouteDeps) {
  const router = Router({ mergeParams: true });
  const findSession = async (req: Request) => {
    const session = await BenchSession.findByPk(paramsOf<{ sessionId: number }>(req).sessionId, { attributes: ['id'] });
    if (!session) throw notFound('Session');
    return session;
  };

  router
    .route('/')
    .get(requireRole('reviewer'), validate({ params: sessionParams }), async (req, res) => {
      const session = await findSession(req);
      const comments = await Comment.findAll({ where: { sessionId: session.id }, include: withAuthor, order: [['id', 'ASC']] });
      reply(res, commentListReply, { comments: comments as Array<Comment & { author: User | null }> });
    })
    .post(requireRole('reviewer'), validate({ params: sessionParams, body: commentBody }), async (req, res) => {
      const me = currentUser(req);
      const session = await findSession(req);
      const comment = await db.transaction(async (transaction) => {
        const row = await Comment.create({ sessionId: session.id, authorId: me.id, body: req.body.body }, { transaction });
        await recordAudit(transaction, me.id, 'create', 'comment', row.id, { sessionId: session.id });
        return row;
      });
      reply(res, commentReply, { comment }, 201);
    });

  return router;
}

/** /api/comments/:id: the author (or an admin) removes a comment. */
export function commentsRouter({ db }: RouteDeps) {
  const router = Router();
  router.route('/:id').delete(requireRole('reviewer'), validate({ params: idParams }), async (req, res) => {
    const me = currentUser(req);
    await db.transaction(async (transaction) => {
      const comment = await Comment.findByPk(paramsOf<{ id: number }>(req).id, { transaction });
      if (!comment) throw notFound('Comment');
      if (comment.authorId !== me.id && !hasRole(me.role, 'admin')) throw new HttpError(403, 'forbidden', 'Only its author or an admin removes a comment');
      await comment.destroy({ transaction });
      await recordAudit(transaction, me.id, 'delete', 'comment', comment.id, { sessionId: comment.sessionId });
    });
    res.status(204).end();
  });
  return router;
}
