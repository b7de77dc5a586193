import { Router, type Request } from 'express';
import { requireRole } from '../auth';
import { importUpload, sessionUpload } from '../uploads/session-multipart';
import { UploadScoring } from '../services/upload-scoring';
import type { RouteDeps } from './deps';
import { sessionHandlers } from './session-handlers';

/** /api/sessions: bench sessions, scored on the server from their samples. Paths and guards only. */
export function sessionsRouter(deps: RouteDeps) {
  const h = sessionHandlers(deps);
  const limit = deps.config.uploadLimitBytes;
  const router = Router();
  // The samples are scored while they arrive (upload-scoring.ts); the handler finishes the score.
  const scoreWhileArriving = (req: Request, field: string, bytes: Buffer, size: number) => {
    if (field === 'samples') UploadScoring.of(req).progress(bytes, size);
  };

  router.route('/').get(requireRole('reviewer'), ...h.list).post(requireRole('engineer'), sessionUpload(limit, scoreWhileArriving), ...h.upload);
  router.route('/import').post(requireRole('engineer'), importUpload(limit), ...h.import);
  router.route('/:id').get(requireRole('reviewer'), ...h.detail).patch(requireRole('engineer'), ...h.edit).delete(requireRole('engineer'), ...h.remove);
  router.route('/:id/samples').get(requireRole('reviewer'), ...h.samples);
  router.route('/:id/archive').get(requireRole('reviewer'), ...h.archive);
  router.route('/:id/export.csv').get(requireRole('reviewer'), ...h.csv);

  return router;
}
