import { Router } from 'express';
import type { Sequelize } from 'sequelize';
import { checkDatabase } from '../db/connection';
import { SequelizeStorage } from 'umzug';
import { healthReply } from '../../shared/contract/misc';
import { reply } from './reply';

/** GET /api/health: version, database reachability and how many migrations have run. */
export function healthRouter(db: Sequelize, version: string) {
  const router = Router();
  const started = Date.now();
  router.get('/', async (_req, res) => {
    const database = await checkDatabase(db);
    const migrations =
      database.status === 'ok' ? (await new SequelizeStorage({ sequelize: db }).executed()).length : 0;
    const body = { status: database.status === 'ok' ? ('ok' as const) : ('degraded' as const), version, database: { ...database, migrations }, uptimeS: (Date.now() - started) / 1000 };
    reply(res, healthReply, body, database.status === 'ok' ? 200 : 503);
  });
  return router;
}
