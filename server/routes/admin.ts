import { Router } from 'express';
import { z } from 'zod';
import { requireRole } from '../auth';
import { AuditEntry, OutboxMessage } from '../db/models';
import { validate } from '../middleware/validate';
import { pageQuery, queryOf } from './params';
import { auditListReply, outboxListReply } from '../../shared/contract/misc';
import { reply } from './reply';

type Page = z.infer<typeof pageQuery>;

/** /api/audit: who changed what, newest first (admins only). */
export function auditRouter() {
  const router = Router();
  router.route('/').get(requireRole('admin'), validate({ query: pageQuery }), async (req, res) => {
    const { limit, offset } = queryOf<Page>(req);
    const { rows, count } = await AuditEntry.findAndCountAll({ order: [['id', 'DESC']], limit, offset });
    reply(res, auditListReply, { entries: rows, total: count });
  });
  return router;
}

/** /api/outbox: the mail the local catcher received, newest first (admins only). */
export function outboxRouter() {
  const router = Router();
  router.route('/').get(requireRole('admin'), validate({ query: pageQuery }), async (req, res) => {
    const { limit, offset } = queryOf<Page>(req);
    const { rows, count } = await OutboxMessage.findAndCountAll({ order: [['id', 'DESC']], limit, offset });
    reply(res, outboxListReply, { messages: rows, total: count });
  });
  return router;
}
