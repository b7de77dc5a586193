import { Router } from 'express';
import { currentUser, requireRole } from '../auth';
import { newSecretToken, sha256Hex } from '../auth/tokens';
import { ApiToken } from '../db/models';
import { notFound } from '../http-error';
import { validate } from '../middleware/validate';
import { recordAudit } from '../services/audit';
import type { RouteDeps } from './deps';
import { idParams, paramsOf } from './params';
import { tokenCreateBody, tokenCreatedReply, tokenListReply } from '../../shared/contract/people';
import { reply } from './reply';


/** /api/tokens: the caller's own API tokens. The secret is returned once, at creation. */
export function tokensRouter({ db }: RouteDeps) {
  const router = Router();

  router
    .route('/')
    .get(requireRole('engineer'), async (req, res) => {
      const tokens = await ApiToken.findAll({ where: { userId: currentUser(req).id }, order: [['id', 'ASC']] });
      reply(res, tokenListReply, { tokens: tokens.map((t) => t.toPublic()) });
    })
    .post(requireRole('engineer'), validate({ body: tokenCreateBody }), async (req, res) => {
      const user = currentUser(req);
      const secret = newSecretToken();
      const token = await db.transaction(async (transaction) => {
        const row = await ApiToken.create(
          { userId: user.id, name: req.body.name, tokenHash: sha256Hex(secret), prefix: secret.slice(0, 10), lastUsedAt: null },
          { transaction },
        );
        await recordAudit(transaction, user.id, 'create', 'api_token', row.id, { name: row.name });
        return row;
      });
      reply(res, tokenCreatedReply, { ...token.toPublic(), token: secret }, 201);
    });

  router.route('/:id').delete(requireRole('engineer'), validate({ params: idParams }), async (req, res) => {
    const user = currentUser(req);
    const { id } = paramsOf<{ id: number }>(req);
    await db.transaction(async (transaction) => {
      const token = await ApiToken.findOne({ where: { id, userId: user.id }, transaction });
      if (!token) throw notFound('API token');
      await token.destroy({ transaction });
      await recordAudit(transaction, user.id, 'delete', 'api_token', id, { name: token.name });
    });
    res.status(204).end();
  });

  return router;
}
