import { Router } from 'express';
import { requireRole } from '../auth';
import type { StationRegistry } from './station-registry';

/** GET /api/stations: the stations online, who drives each and since when; every role may look. */
export function stationsRouter(registry: StationRegistry) {
  const router = Router();
  router.get('/', requireRole('reviewer'), (_req, res) => {
    res.json({ stations: registry.list() });
  });
  return router;
}
