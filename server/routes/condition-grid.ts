import { Router } from 'express';
import { conditionGridQuery, conditionGridReply } from '../../shared/contract/condition-grid';
import { requireRole } from '../auth';
import { conditionGrid } from '../services/condition-grid';
import { handler } from './handler';
import { reply } from './reply';

/** /api/condition-grid: the shmoo plot of one build or core over two operating conditions. */
export function conditionGridRouter() {
  const router = Router();
  router.get('/', requireRole('reviewer'), ...handler({ query: conditionGridQuery }, async ({ query }, _req, res) => {
    reply(res, conditionGridReply, await conditionGrid(query));
  }));
  return router;
}
