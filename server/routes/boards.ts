import { Router } from 'express';
import { currentUser, requireRole } from '../auth';
import { Board } from '../db/models';
import { notFound } from '../http-error';
import { validate } from '../middleware/validate';
import { recordAudit } from '../services/audit';
import type { RouteDeps } from './deps';
import { idParams, paramsOf } from './params';
import { boardBody, boardListReply, boardPatchBody, boardReply } from '../../shared/contract/boards';
import { reply } from './reply';


/** /api/boards: read by everyone signed in, written by engineers, deleted by admins. */
export function boardsRouter({ db }: RouteDeps) {
  const router = Router();

  router
    .route('/')
    .get(requireRole('reviewer'), async (_req, res) => {
      reply(res, boardListReply, { boards: await Board.findAll({ order: [['name', 'ASC']] }) });
    })
    .post(requireRole('engineer'), validate({ body: boardBody }), async (req, res) => {
      const me = currentUser(req);
      const board = await db.transaction(async (transaction) => {
        const row = await Board.create(req.body, { transaction });
        await recordAudit(transaction, me.id, 'create', 'board', row.id, req.body);
        return row;
      });
      reply(res, boardReply, { board }, 201);
    });

  router
    .route('/:id')
    .get(requireRole('reviewer'), validate({ params: idParams }), async (req, res) => {
      const board = await Board.findByPk(paramsOf<{ id: number }>(req).id);
      if (!board) throw notFound('Board');
      reply(res, boardReply, { board });
    })
    .patch(requireRole('engineer'), validate({ params: idParams, body: boardPatchBody }), async (req, res) => {
      const me = currentUser(req);
      const board = await db.transaction(async (transaction) => {
        const row = await Board.findByPk(paramsOf<{ id: number }>(req).id, { transaction });
        if (!row) throw notFound('Board');
        await row.update(req.body, { transaction });
        await recordAudit(transaction, me.id, 'update', 'board', row.id, req.body);
        return row;
      });
      reply(res, boardReply, { board });
    })
    .delete(requireRole('admin'), validate({ params: idParams }), async (req, res) => {
      const me = currentUser(req);
      await db.transaction(async (transaction) => {
        const row = await Board.findByPk(paramsOf<{ id: number }>(req).id, { transaction });
        if (!row) throw notFound('Board');
        await row.destroy({ transaction });
        await recordAudit(transaction, me.id, 'delete', 'board', row.id, { name: row.name });
      });
      res.status(204).end();
    });

  return router;
}
