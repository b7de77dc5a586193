import { Router, type Request } from 'express';
import multer from 'multer';
import { z } from 'zod';
import { checkGoldenVectors, GoldenVectorError, summariseGoldenVectors } from '../../shared/link-engine/golden-vectors';
import { parseSampleCsv, SAMPLE_CSV_HEADER, SampleCsvError } from '../../shared/link-engine/sample-csv';
import { packColumns, unpackSamples } from '../../shared/link-engine/sample-pack';
import { checkVectorGoldenVectors, summariseVectorGoldenVectors } from '../../shared/link-engine/vector-golden-vectors';
import { parseVectorCsv, VECTOR_CSV_HEADER } from '../../shared/link-engine/vector-sample-csv';
import { packVectorSamples, unpackVectorSamples } from '../../shared/link-engine/vector-sample-pack';
import { modeOf, rotationConfigOf, vectorConfigOf } from '../services/core-mode';
import { currentUser, requireRole } from '../auth';
import { Core, GoldenVectorSet } from '../db/models';
import { HttpError, notFound } from '../http-error';
import { validate } from '../middleware/validate';
import { recordAudit } from '../services/audit';
import type { RouteDeps } from './deps';
import { id, paramsOf } from './params';
import { goldenVectorListReply, goldenVectorReply } from '../../shared/contract/misc';
import { reply } from './reply';

const coreParams = z.strictObject({ id });
const setParams = z.strictObject({ id, setId: id });
const nameField = z.string().trim().min(1, 'name: give the set a name').max(120, 'name: at most 120 characters');

/** A set as the API shows it: its rows summarised against the core's current model. */
function describe(set: GoldenVectorSet, core: Core) {
  const head = { id: set.id, coreId: set.coreId, name: set.name, createdAt: set.createdAt };
  if (modeOf(core) === 'vectoring') {
    const { firstMismatches, ...summary } = summariseVectorGoldenVectors(vectorConfigOf(core), unpackVectorSamples(set.codes));
    return { ...head, ...summary, firstMismatches: [], firstVectorMismatches: firstMismatches };
  }
  const config = rotationConfigOf(core);
  return { ...head, ...summariseGoldenVectors(config, unpackSamples(set.codes, config.angleFormat)) };
}

/** The set's rows, checked against the core's formats: packed as its sessions are. @throws SampleCsvError, GoldenVectorError */
function readSet(core: Core, text: string): { count: number; codes: Buffer } {
  if (modeOf(core) === 'vectoring') {
    const rows = parseVectorCsv(text);
    checkVectorGoldenVectors(vectorConfigOf(core), rows);
    return { count: rows.xs.length, codes: Buffer.from(packVectorSamples(rows).buffer) };
  }
  const rows = parseSampleCsv(text);
  checkGoldenVectors(rotationConfigOf(core), rows);
  return { count: rows.codes.length, codes: Buffer.from(packColumns(rows).buffer) };
}

/** /api/cores/:id/golden-vectors: expected codes from RTL simulation, as CSV uploads (a vectoring core's: x_code,y_code,angle_code,magnitude_code). */
export function goldenVectorsRouter({ db, config }: RouteDeps) {
  const router = Router({ mergeParams: true });
  const upload = multer({ storage: multer.memoryStorage(), limits: { fileSize: config.uploadLimitBytes, files: 1, fields: 2 } }).single('file');
  const findCore = async (req: Request) => {
    const core = await Core.findByPk(paramsOf<{ id: number }>(req).id);
    if (!core) throw notFound('Core');
    return core;
  };

  router
    .route('/')
    .get(requireRole('reviewer'), validate({ params: coreParams }), async (req, res) => {
      const core = await findCore(req);
      const sets = await GoldenVectorSet.findAll({ where: { coreId: core.id }, order: [['id', 'ASC']] });
      reply(res, goldenVectorListReply, { sets: sets.map((s) => describe(s, core)) });
    })
    .post(
      requireRole('engineer'),
      validate({ params: coreParams }),
      (req, res, next) =>
        upload(req, res, (err: unknown) => {
          if (err instanceof multer.MulterError && err.code === 'LIMIT_FILE_SIZE') return next(new HttpError(413, 'too_large', `file: over the upload limit of ${config.uploadLimitBytes} bytes`));
          if (err instanceof multer.MulterError) return next(new HttpError(400, 'bad_upload', `${err.field ? `${err.field}: ` : ''}${err.message}`));
          next(err);
        }),
      async (req, res) => {
        const me = currentUser(req);
        const core = await findCore(req);
        const name = nameField.safeParse((req.body as Record<string, unknown> | undefined)?.name ?? '');
        if (!name.success) throw new HttpError(400, 'invalid', name.error.issues[0].message);
        const header = modeOf(core) === 'vectoring' ? VECTOR_CSV_HEADER : SAMPLE_CSV_HEADER;
        if (!req.file) throw new HttpError(400, 'invalid', `file: a multipart file named "file" (CSV ${header}) is required`);
        let rows;
        try {
          rows = readSet(core, req.file.buffer.toString('utf8'));
        } catch (err) {
          if (err instanceof SampleCsvError) throw new HttpError(400, 'bad_csv', `file: ${err.message}`, [{ path: 'file', line: err.line, message: err.message }]);
          if (err instanceof GoldenVectorError) throw new HttpError(400, 'bad_csv', `file: line ${err.row + 2}: ${err.message}`, [{ path: 'file', line: err.row + 2, message: err.message }]);
          throw err;
        }
        const set = await db.transaction(async (transaction) => {
          const row = await GoldenVectorSet.create({ coreId: core.id, name: name.data, ...rows }, { transaction });
          await recordAudit(transaction, me.id, 'upload', 'golden-vectors', row.id, { coreId: core.id, name: row.name, count: row.count });
          return row;
        });
        reply(res, goldenVectorReply, { set: describe(set, core) }, 201);
      },
    );

  router.route('/:setId').delete(requireRole('engineer'), validate({ params: setParams }), async (req, res) => {
    const me = currentUser(req);
    const { id: coreId, setId } = paramsOf<{ id: number; setId: number }>(req);
    const set = await GoldenVectorSet.findOne({ where: { id: setId, coreId } });
    if (!set) throw notFound('Golden vector set');
    await db.transaction(async (transaction) => {
      await set.destroy({ transaction });
      await recordAudit(transaction, me.id, 'delete', 'golden-vectors', set.id, { coreId, name: set.name });
    });
    res.status(204).end();
  });

  return router;
}
