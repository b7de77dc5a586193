import { Router } from 'express';
import type { Sequelize } from 'sequelize';
import { checkDatabase } from '../db/connection';
import { SequelizeStorage } from 'umzug';

/** GET /api/health: version, database reachability and how many migrations have run. */
export function healthRouter(db: Sequelize, version: string) {
  const router = Router();
  const started = Date.now();
  router.get('/', async (_req, res) => {
    const database = await checkDatabase(db);
    const migrations =
      database.status === 'ok' ? (await new SequelizeStorage({ sequelize: db }).executed()).length : 0;
    res.status(database.status === 'ok' ? 200 : 503).json({
      status: database.status === 'ok' ? 'ok' : 'degraded',
      version,
      database: { ...database, migrations },
      uptimeS: (Date.now() - started) / 1000,
    });
  });
  return router;
}
