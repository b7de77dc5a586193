import { Router } from 'express';
import { z } from 'zod';
import { currentUser, hasRole, requireRole } from '../auth';
import { User } from '../db/models';
import { HttpError, notFound } from '../http-error';
import { validate } from '../middleware/validate';
import { recordAudit } from '../services/audit';
import type { RouteDeps } from './deps';
import { idParams, paramsOf } from './params';
import { userListReply, userPatchBody, userReply } from '../../shared/contract/people';
import { reply } from './reply';


/** /api/users: admins list and change accounts; everyone may read their own. */
export function usersRouter({ db }: RouteDeps) {
  const router = Router();

  router.route('/').get(requireRole('admin'), async (_req, res) => {
    const users = await User.findAll({ order: [['id', 'ASC']] });
    reply(res, userListReply, { users: users.map((u) => u.toPublic()) });
  });

  router
    .route('/:id')
    .get(requireRole('reviewer'), validate({ params: idParams }), async (req, res) => {
      const me = currentUser(req);
      const { id } = paramsOf<{ id: number }>(req);
      if (id !== me.id && !hasRole(me.role, 'admin')) throw new HttpError(403, 'forbidden', 'Only admins read other accounts');
      const user = await User.findByPk(id);
      if (!user) throw notFound('User');
      reply(res, userReply, { user: user.toPublic() });
    })
    .patch(requireRole('admin'), validate({ params: idParams, body: userPatchBody }), async (req, res) => {
      const me = currentUser(req);
      const { id } = paramsOf<{ id: number }>(req);
      const changes = req.body as z.infer<typeof userPatchBody>;
      // An admin cannot lock themselves out: another admin has to demote or disable them.
      if (id === me.id && (changes.disabled === true || (changes.role !== undefined && changes.role !== 'admin'))) {
        throw new HttpError(409, 'self_lockout', 'You cannot disable your own account or take away your own admin role; ask another admin');
      }
      const user = await db.transaction(async (transaction) => {
        const row = await User.findByPk(id, { transaction });
        if (!row) throw notFound('User');
        await row.update(changes, { transaction });
        // Never leave the team without an admin who can sign in.
        const admins = await User.count({ where: { role: 'admin', disabled: false }, transaction });
        if (admins === 0) throw new HttpError(409, 'last_admin', 'This would leave no active admin');
        await recordAudit(transaction, me.id, 'update', 'user', row.id, changes);
        return row;
      });
      reply(res, userReply, { user: user.toPublic() });
    });

  return router;
}
