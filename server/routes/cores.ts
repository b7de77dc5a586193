import { Router, type Request } from 'express';
import { currentUser, requireRole } from '../auth';
import { Core, CoreWatcher, User } from '../db/models';
import { HttpError, notFound } from '../http-error';
import { validate } from '../middleware/validate';
import { recordAudit } from '../services/audit';
import type { RouteDeps } from './deps';
import { idParams, paramsOf } from './params';
import { coreCreateBody, coreDetailReply, coreListReply, corePatchBody, coreReply, modeIssues, type CorePatchBody } from '../../shared/contract/cores';
import { reply } from './reply';


/** /api/cores: the cores under test, their model configuration, limits and watchers. */
export function coresRouter({ db }: RouteDeps) {
  const router = Router();
  const findCore = async (req: Request) => {
    const core = await Core.findByPk(paramsOf<{ id: number }>(req).id);
    if (!core) throw notFound('Core');
    return core;
  };

  router
    .route('/')
    .get(requireRole('reviewer'), async (_req, res) => {
      reply(res, coreListReply, { cores: await Core.findAll({ order: [['name', 'ASC']] }) });
    })
    .post(requireRole('engineer'), validate({ body: coreCreateBody }), async (req, res) => {
      const me = currentUser(req);
      const core = await db.transaction(async (transaction) => {
        const row = await Core.create({ ...req.body, baselineSessionId: null }, { transaction });
        await recordAudit(transaction, me.id, 'create', 'core', row.id, { name: row.name, slug: row.slug });
        return row;
      });
      reply(res, coreReply, { core }, 201);
    });

  router
    .route('/:id')
    .get(requireRole('reviewer'), validate({ params: idParams }), async (req, res) => {
      const me = currentUser(req);
      const core = await findCore(req);
      // Who hears of this core's regressions, and whether the caller is one of them (for the toggle).
      const rows = await CoreWatcher.findAll({ where: { coreId: core.id }, attributes: ['userId'] });
      const users = rows.length ? await User.findAll({ where: { id: rows.map((r) => r.userId) }, attributes: ['id', 'name'], order: [['name', 'ASC']] }) : [];
      const watchers = users.map((u) => ({ id: u.id, name: u.name }));
      reply(res, coreDetailReply, { core, watchers, watching: watchers.some((w) => w.id === me.id) });
    })
    .patch(requireRole('engineer'), validate({ params: idParams, body: corePatchBody }), async (req, res) => {
      const me = currentUser(req);
      const core = await findCore(req);
      const body = req.body as CorePatchBody;
      // Its sessions were recorded and scored in its mode: a core keeps the mode it was created with.
      if (body.mode !== undefined && body.mode !== core.mode) throw new HttpError(400, 'invalid', `body.mode: a core's mode is fixed when it is created (this core is a ${core.mode} core)`);
      const issues = modeIssues(core.mode, body);
      if (issues.length) throw new HttpError(400, 'invalid', `body.${issues[0].path.join('.')}: ${issues[0].message}`, issues.map((i) => ({ path: `body.${i.path.join('.')}`, message: i.message })));
      await db.transaction(async (transaction) => {
        await core.update(body, { transaction });
        await recordAudit(transaction, me.id, 'update', 'core', core.id, req.body);
      });
      reply(res, coreReply, { core });
    })
    .delete(requireRole('admin'), validate({ params: idParams }), async (req, res) => {
      const me = currentUser(req);
      const core = await findCore(req);
      await db.transaction(async (transaction) => {
        await core.destroy({ transaction });
        await recordAudit(transaction, me.id, 'delete', 'core', core.id, { name: core.name, slug: core.slug });
      });
      res.status(204).end();
    });

  // Watching is personal: anyone who reads a core may ask to hear of its regressions.
  router
    .route('/:id/watch')
    .put(requireRole('reviewer'), validate({ params: idParams }), async (req, res) => {
      const me = currentUser(req);
      const core = await findCore(req);
      await db.transaction(async (transaction) => {
        const [, created] = await CoreWatcher.findOrCreate({ where: { coreId: core.id, userId: me.id }, transaction });
        if (created) await recordAudit(transaction, me.id, 'watch', 'core', core.id);
      });
      res.status(204).end();
    })
    .delete(requireRole('reviewer'), validate({ params: idParams }), async (req, res) => {
      const me = currentUser(req);
      const core = await findCore(req);
      await db.transaction(async (transaction) => {
        const removed = await CoreWatcher.destroy({ where: { coreId: core.id, userId: me.id }, transaction });
        if (removed) await recordAudit(transaction, me.id, 'unwatch', 'core', core.id);
      });
      res.status(204).end();
    });

  return router;
}
