import { Router } from 'express';
import { stationListReply } from '../../shared/contract/stations';
import { requireRole } from '../auth';
import { reply } from '../routes/reply';
import type { StationRegistry } from './station-registry';

/** GET /api/stations: the stations online, who drives each and since when; every role may look. */
export function stationsRouter(registry: StationRegistry) {
  const router = Router();
  router.get('/', requireRole('reviewer'), (_req, res) => {
    reply(res, stationListReply, { stations: registry.list() });
  });
  return router;
}
