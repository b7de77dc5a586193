// The handlers of /api/sessions, each typed from its schemas (see handler.ts); the work is done
// by the session services, the paths and guards are in sessions.ts.
import { once } from 'node:events';
import type { Response } from 'express';
import { idParams } from '../../shared/contract/common';
import {
  sessionDetailReply,
  sessionImportPart,
  sessionListQuery,
  sessionPage,
  sessionPatchBody,
  sessionPatchReply,
  sessionStoredReply,
  sessionUploadPart,
} from '../../shared/contract/sessions';
import { currentUser } from '../auth';
import { Core } from '../db/models';
import { HttpError, notFound } from '../http-error';
import { sessionConditionsOf } from '../services/session-conditions';
import type { Conditions } from '../../shared/soak';
import { sessionCsvChunks } from '../services/session-csv';
import { deleteSession, editSession } from '../services/session-edits';
import { acceptImport, acceptUpload } from '../services/session-intake';
import { findSession, listSessions, sessionDetail } from '../services/session-listing';
import { decodeSamples } from '../services/session-scoring';
import { modeOf, rotationConfigOf } from '../services/core-mode';
import { decodeVectorSamples } from '../services/vector-scoring';
import { vectorCsvChunks } from '../../shared/link-engine/vector-sample-csv';
import { readSessionPart, uploadedFile } from '../uploads/session-multipart';
import { UploadScoring } from '../services/upload-scoring';
import type { RouteDeps } from './deps';
import { handler } from './handler';
import { originOf } from './params';
import { reply } from './reply';

/** Write `chunks` to `res`, waiting for the socket to drain; stops if the client goes away. */
async function streamChunks(res: Response, chunks: Iterable<string>): Promise<void> {
  for (const chunk of chunks) {
    if (res.write(chunk)) continue;
    await Promise.race([once(res, 'drain'), once(res, 'close')]);
    if (res.destroyed) return;
  }
  res.end();
}

function rotationCsv(core: Core, samples: Buffer, conditions: Conditions) {
  const config = rotationConfigOf(core);
  return sessionCsvChunks(config, decodeSamples(samples, config.angleFormat), conditions);
}

export function sessionHandlers({ db, mailer }: RouteDeps) {
  return {
    list: handler({ query: sessionListQuery }, async ({ query }, _req, res) => {
      reply(res, sessionPage, await listSessions(query));
    }),

    /** Behind sessionUpload: the multipart body is read before this runs. */
    upload: handler({}, async (_input, req, res) => {
      const part = readSessionPart(req, sessionUploadPart);
      const samples = uploadedFile(req, 'samples');
      if (!samples) throw new HttpError(400, 'invalid', 'samples: a multipart file named "samples" is required');
      const intake = { db, mailer, origin: originOf(req), operatorId: currentUser(req).id };
      const archive = uploadedFile(req, 'archive')?.buffer ?? null;
      reply(res, sessionStoredReply, await acceptUpload(intake, part, samples.buffer, archive, UploadScoring.of(req)), 201);
    }),

    /** Behind importUpload. */
    import: handler({}, async (_input, req, res) => {
      const part = readSessionPart(req, sessionImportPart);
      const file = req.file;
      if (!file) throw new HttpError(400, 'invalid', 'file: a multipart file named "file" (a recorder archive or a CSV) is required');
      const intake = { db, mailer, origin: originOf(req), operatorId: currentUser(req).id };
      reply(res, sessionStoredReply, await acceptImport(intake, part, file), 201);
    }),

    detail: handler({ params: idParams }, async ({ params }, _req, res) => {
      reply(res, sessionDetailReply, await sessionDetail(params.id));
    }),

    edit: handler({ params: idParams, body: sessionPatchBody }, async ({ params, body }, req, res) => {
      reply(res, sessionPatchReply, await editSession(db, currentUser(req), params.id, body));
    }),

    remove: handler({ params: idParams }, async ({ params }, req, res) => {
      await deleteSession(db, currentUser(req), params.id);
      res.status(204).end();
    }),

    samples: handler({ params: idParams }, async ({ params }, _req, res) => {
      const session = await findSession(params.id);
      res.type('application/octet-stream').attachment(`session-${session.id}-samples.bin`).send(session.samples);
    }),

    archive: handler({ params: idParams }, async ({ params }, _req, res) => {
      const session = await findSession(params.id);
      if (!session.archive) throw notFound('Session archive');
      res.type('application/octet-stream').attachment(`session-${session.id}.abrc`).send(session.archive);
    }),

    csv: handler({ params: idParams }, async ({ params }, _req, res) => {
      const session = await findSession(params.id);
      const core = await Core.findByPk(session.coreId);
      if (!core) throw notFound('Core');
      // A vectoring session's CSV is its answers as they came, in the import format (x_code,y_code,angle_code,magnitude_code).
      const chunks = modeOf(core) === 'vectoring' ? vectorCsvChunks(decodeVectorSamples(session.samples)) : rotationCsv(core, session.samples, await sessionConditionsOf(session.id));
      res.type('text/csv; charset=utf-8').set('content-disposition', `attachment; filename="session-${session.id}.csv"`);
      await streamChunks(res, chunks);
    }),
  };
}
