import { Router } from 'express';
import { Op } from 'sequelize';
import { z } from 'zod';
import { currentUser, requireRole } from '../auth';
import { hashPassword } from '../auth/passwords';
import { newSecretToken, sha256Hex } from '../auth/tokens';
import { Invitation, User } from '../db/models';
import { HttpError } from '../http-error';
import { sendInvitationMail } from '../mail/messages';
import { validate } from '../middleware/validate';
import { recordAudit } from '../services/audit';
import { mailSafely, type RouteDeps } from './deps';
import { originOf } from './params';
import { invitationAcceptBody, invitationCreateBody, invitationListReply, invitationReply, userReply } from '../../shared/contract/people';
import { reply } from './reply';

const INVITATION_TTL_MS = 7 * 24 * 60 * 60 * 1000;


/** /api/invitations: admins invite by e-mail; the invited person accepts with the mailed token. */
export function invitationsRouter({ db, mailer, bcryptCost }: RouteDeps) {
  const router = Router();

  router
    .route('/')
    .get(requireRole('admin'), async (_req, res) => {
      const invitations = await Invitation.findAll({ order: [['id', 'DESC']] });
      reply(res, invitationListReply, { invitations: invitations.map((i) => i.toPublic()) });
    })
    .post(requireRole('admin'), validate({ body: invitationCreateBody }), async (req, res) => {
      const me = currentUser(req);
      const email = (req.body.email as string).toLowerCase();
      const name = (req.body.name as string | undefined) || null;
      if (await User.findOne({ where: { email } })) throw new HttpError(409, 'exists', 'body.email: an account with this e-mail exists');
      const token = newSecretToken();
      const invitation = await db.transaction(async (transaction) => {
        const row = await Invitation.create(
          { email, name, role: req.body.role, tokenHash: sha256Hex(token), expiresAt: new Date(Date.now() + INVITATION_TTL_MS), usedAt: null, invitedById: me.id },
          { transaction },
        );
        await recordAudit(transaction, me.id, 'create', 'invitation', row.id, { email, ...(name ? { name } : {}), role: row.role });
        return row;
      });
      const link = `${originOf(req)}/invite/${token}`;
      const mailed = await mailSafely(() => sendInvitationMail(mailer, email, { link, role: invitation.role, invitedBy: me.name, expiresAt: invitation.expiresAt }));
      reply(res, invitationReply, { invitation: invitation.toPublic(), mailed }, 201);
    });

  router.route('/accept').post(validate({ body: invitationAcceptBody }), async (req, res) => {
    const { token, name, password } = req.body as z.infer<typeof invitationAcceptBody>;
    const passwordHash = await hashPassword(password, bcryptCost);
    const user = await db.transaction(async (transaction) => {
      const invitation = await Invitation.findOne({
        where: { tokenHash: sha256Hex(token), usedAt: null, expiresAt: { [Op.gt]: new Date() } },
        transaction,
        // Two instances taking the same token at once: the second waits, then finds it used.
        lock: transaction.LOCK.UPDATE,
      });
      if (!invitation) throw new HttpError(400, 'bad_invitation', 'body.token: this invitation is unknown, used or expired');
      if (await User.findOne({ where: { email: invitation.email }, transaction })) {
        throw new HttpError(409, 'exists', 'An account with this e-mail exists');
      }
      const row = await User.create({ email: invitation.email, name, role: invitation.role, passwordHash }, { transaction });
      await invitation.update({ usedAt: new Date() }, { transaction });
      await recordAudit(transaction, row.id, 'accept', 'invitation', invitation.id, { email: row.email, role: row.role });
      return row;
    });
    reply(res, userReply, { user: user.toPublic() }, 201);
  });

  return router;
}
