import { once } from 'node:events';
import { Router, type Request, type RequestHandler } from 'express';
import multer from 'multer';
import { literal, Op, type WhereOptions } from 'sequelize';
import type { Literal } from 'sequelize/types/utils';
import { z } from 'zod';
import { currentUser, hasRole, requireRole } from '../auth';
import { BenchSession, Board, Build, Core, CoreWatcher, User } from '../db/models';
import { jsonArrayContains } from '../db/dialect';
import { HttpError, notFound } from '../http-error';
import { sendRegressionMail } from '../mail/messages';
import { validate } from '../middleware/validate';
import { recordAudit } from '../services/audit';
import { sessionCsvChunks } from '../services/session-csv';
import { decodeSamples } from '../services/session-scoring';
import { readImport } from '../services/session-import';
import { storeSession } from '../services/session-ingest';
import { sanitizeFileName } from '../uploads/bitstream-storage';
import { mailSafely, type RouteDeps } from './deps';
import { id, idParams, originOf, paramsOf, queryOf } from './params';

const json = z.record(z.string(), z.unknown());
const text = (max: number) => z.string().trim().max(max);

/**
 * The `session` part of an upload. The runner also sends its own `stats`, `verdict`, `passed`
 * and `sampleCount`: they are accepted so its uploads are not refused, and ignored — the server
 * scores the samples itself. `build` and `board` are the runner's labels, looked up by name.
 */
const sessionPart = z
  .strictObject({
    coreId: id.optional(),
    coreSlug: text(80).min(1).optional(),
    buildId: id.nullish(),
    boardId: id.nullish(),
    build: text(120).nullish(),
    board: text(120).nullish(),
    startedAt: z.coerce.date(),
    endedAt: z.coerce.date().nullish(),
    plan: json,
    transport: json,
    deviceInfo: json.nullish(),
    notes: text(10_000).default(''),
    tags: z.array(text(40).min(1)).max(20).default([]),
    link: json.optional(),
    stats: z.unknown().optional(),
    verdict: z.unknown().optional(),
    passed: z.unknown().optional(),
    sampleCount: z.unknown().optional(),
  })
  .refine((s) => s.coreId !== undefined || s.coreSlug !== undefined, { path: ['coreId'], message: 'coreId or coreSlug is required' });
type SessionPart = z.infer<typeof sessionPart>;

/** The `session` part of an import: where the results belong; what ran is read from the file. */
const importPart = z
  .strictObject({
    coreId: id.optional(),
    coreSlug: text(80).min(1).optional(),
    buildId: id.nullish(),
    boardId: id.nullish(),
    startedAt: z.coerce.date().optional(),
    notes: text(10_000).default(''),
    tags: z.array(text(40).min(1)).max(20).default([]),
  })
  .refine((s) => s.coreId !== undefined || s.coreSlug !== undefined, { path: ['coreId'], message: 'coreId or coreSlug is required' });

const flag = z.enum(['true', 'false']).transform((v) => v === 'true');
const listQuery = z.strictObject({
  coreId: id.optional(),
  buildId: id.optional(),
  boardId: id.optional(),
  operatorId: id.optional(),
  passed: flag.optional(),
  regression: flag.optional(),
  tag: text(40).min(1).optional(),
  from: z.coerce.date().optional(),
  to: z.coerce.date().optional(),
  sort: z.enum(['startedAt', '-startedAt', 'id', '-id']).default('-startedAt'),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(25),
});
type ListQuery = z.infer<typeof listQuery>;

const NO_BLOBS = { exclude: ['samples', 'archive'] };

/** Without the blobs, with whether an archive is kept and the names a list shows. */
const LISTED = {
  attributes: { exclude: ['samples', 'archive'], include: [[literal('"BenchSession"."archive" IS NOT NULL'), 'hasArchive']] as [Literal, string][] },
  include: [
    { model: Core, as: 'core', attributes: ['id', 'name', 'slug'] },
    { model: Build, as: 'build', attributes: ['id', 'label'] },
    { model: Board, as: 'board', attributes: ['id', 'name'] },
    { model: User, as: 'operator', attributes: ['id', 'name'] },
  ],
};
const listed = (row: BenchSession) => ({ ...row.toJSON(), hasArchive: Boolean(row.get('hasArchive')) });

/** What an engineer may change on a stored session; `baseline: true` makes it its core's baseline. */
const patchBody = z.strictObject({
  notes: text(10_000).optional(),
  tags: z.array(text(40).min(1)).max(20).optional(),
  baseline: z.literal(true).optional(),
});
type PatchBody = z.infer<typeof patchBody>;

/** How long an operator may delete a session of their own after uploading it. */
const OWN_DELETE_WINDOW_MS = 24 * 60 * 60 * 1000;

/** Multipart in memory: one `session` JSON field, `samples` and an optional `archive` (413 beyond the limit). */
function sessionUpload(limitBytes: number): RequestHandler {
  const upload = multer({ storage: multer.memoryStorage(), limits: { fileSize: limitBytes, files: 2, fields: 1, fieldSize: 1024 * 1024 } }).fields([
    { name: 'samples', maxCount: 1 },
    { name: 'archive', maxCount: 1 },
  ]);
  return (req, res, next) => upload(req, res, (err: unknown) => next(err ? uploadError(err, limitBytes) : undefined));
}

/** Multer's failures as the API's errors: 413 past a limit, 400 for a malformed body. */
function uploadError(err: unknown, limitBytes: number): unknown {
  if (err instanceof multer.MulterError) {
    if (err.code === 'LIMIT_FILE_SIZE') return new HttpError(413, 'too_large', `${err.field ?? 'A file'} is over the upload limit of ${limitBytes} bytes`);
    if (err.code === 'LIMIT_FIELD_VALUE') return new HttpError(413, 'too_large', 'session: the JSON part is over its size limit');
    return new HttpError(400, 'bad_upload', `${err.field ? `${err.field}: ` : ''}${err.message}`);
  }
  return err instanceof Error && /multipart|unexpected end/i.test(err.message) ? new HttpError(400, 'bad_upload', err.message) : err;
}

function importUpload(limitBytes: number): RequestHandler {
  const upload = multer({ storage: multer.memoryStorage(), limits: { fileSize: limitBytes, files: 1, fields: 1, fieldSize: 64 * 1024 } }).single('file');
  return (req, res, next) => upload(req, res, (err: unknown) => next(err ? uploadError(err, limitBytes) : undefined));
}

function parseSessionPart(req: Request): SessionPart;
function parseSessionPart<T extends z.ZodType>(req: Request, schema: T): z.infer<T>;
function parseSessionPart(req: Request, schema: z.ZodType = sessionPart): unknown {
  const raw = (req.body as Record<string, unknown> | undefined)?.session;
  if (typeof raw !== 'string') throw new HttpError(400, 'invalid', 'session: a multipart field named "session" holding JSON is required');
  let value: unknown;
  try {
    value = JSON.parse(raw);
  } catch {
    throw new HttpError(400, 'invalid', 'session: not valid JSON');
  }
  const r = schema.safeParse(value);
  if (!r.success) {
    const issues = r.error.issues.map((i) => ({ path: ['session', ...i.path].join('.'), message: i.message }));
    throw new HttpError(400, 'invalid', `${issues[0].path}: ${issues[0].message}`, issues);
  }
  return r.data;
}

function listWhere(q: ListQuery): WhereOptions {
  const where: Record<string | symbol, unknown> = {};
  for (const key of ['coreId', 'buildId', 'boardId', 'operatorId', 'passed', 'regression'] as const) {
    if (q[key] !== undefined) where[key] = q[key];
  }
  if (q.from || q.to) where.startedAt = { ...(q.from ? { [Op.gte]: q.from } : {}), ...(q.to ? { [Op.lte]: q.to } : {}) };
  if (q.tag) where[Op.and] = jsonArrayContains(BenchSession.sequelize!, '"BenchSession"."tags"', q.tag);
  return where as WhereOptions;
}

/** /api/sessions: bench sessions, scored on the server from their samples. */
export function sessionsRouter({ db, mailer, config }: RouteDeps) {
  const router = Router();
  const findSession = async (req: Request, attributes?: { exclude: string[] }) => {
    const session = await BenchSession.findByPk(paramsOf<{ id: number }>(req).id, attributes ? { attributes } : {});
    if (!session) throw notFound('Session');
    return session;
  };

  router
    .route('/')
    .get(requireRole('reviewer'), validate({ query: listQuery }), async (req, res) => {
      const q = queryOf<ListQuery>(req);
      const column = q.sort.replace('-', '');
      const { rows, count } = await BenchSession.findAndCountAll({
        ...LISTED,
        where: listWhere(q),
        order: [[column, q.sort.startsWith('-') ? 'DESC' : 'ASC'], ['id', 'DESC']],
        limit: q.pageSize,
        offset: (q.page - 1) * q.pageSize,
      });
      res.json({ items: rows.map(listed), total: count, page: q.page, pageSize: q.pageSize });
    })
    .post(requireRole('engineer'), sessionUpload(config.uploadLimitBytes), async (req, res) => {
      const me = currentUser(req);
      const part = parseSessionPart(req);
      const files = (req.files ?? {}) as Record<string, Express.Multer.File[] | undefined>;
      const samplesFile = files.samples?.[0];
      if (!samplesFile) throw new HttpError(400, 'invalid', 'samples: a multipart file named "samples" is required');
      const archive = files.archive?.[0]?.buffer ?? null;

      const { link, stats: _s, verdict: _v, passed: _p, sampleCount: _n, ...draft } = part;
      const result = await db.transaction((transaction) => storeSession(transaction, me.id, { ...draft, link }, samplesFile.buffer, archive));
      const { row, core, stats, verdict, passed, failedLimits } = result;
      if (failedLimits.length > 0) await mailRegression(req, row, core, failedLimits);
      res.status(201).json({ id: row.id, passed, regression: row.regression, verdict, stats });
    });

  router.route('/import').post(requireRole('engineer'), importUpload(config.uploadLimitBytes), async (req, res) => {
    const me = currentUser(req);
    const part = parseSessionPart(req, importPart);
    const file = (req.file as Express.Multer.File | undefined) ?? null;
    if (!file) throw new HttpError(400, 'invalid', 'file: a multipart file named "file" (a recorder archive or a CSV) is required');
    const imported = readImport(file.buffer, file.originalname);
    const result = await db.transaction((transaction) =>
      storeSession(
        transaction,
        me.id,
        {
          ...part,
          startedAt: part.startedAt ?? new Date(),
          plan: { kind: 'imported', from: imported.source, fileName: sanitizeFileName(file.originalname) },
          transport: { kind: 'import', source: imported.source },
          deviceInfo: imported.deviceInfo,
          link: imported.link,
        },
        imported.samples,
        imported.archive,
        { action: 'import' },
      ),
    );
    const { row, core, stats, verdict, passed, failedLimits } = result;
    if (failedLimits.length > 0) await mailRegression(req, row, core, failedLimits);
    res.status(201).json({ id: row.id, passed, regression: row.regression, verdict, stats });
  });

  async function mailRegression(req: Request, row: BenchSession, core: Core, failedLimits: string[]) {
    const watchers = await CoreWatcher.findAll({ where: { coreId: core.id } });
    const users = watchers.length ? await User.findAll({ where: { id: watchers.map((w) => w.userId), disabled: false } }) : [];
    if (!users.length) return;
    const build = row.buildId ? await Build.findByPk(row.buildId) : null;
    await mailSafely(() =>
      sendRegressionMail(mailer, users.map((u) => u.email), {
        core: core.name,
        build: build?.label ?? 'unknown',
        sessionId: row.id,
        failedLimits,
        link: `${originOf(req)}/sessions/${row.id}`,
      }),
    );
  }

  router
    .route('/:id')
    .get(requireRole('reviewer'), validate({ params: idParams }), async (req, res) => {
      const session = await BenchSession.findByPk(paramsOf<{ id: number }>(req).id, LISTED);
      if (!session) throw notFound('Session');
      res.json({ session: listed(session) });
    })
    .patch(requireRole('engineer'), validate({ params: idParams, body: patchBody }), async (req, res) => {
      const me = currentUser(req);
      const body = req.body as PatchBody;
      const session = await findSession(req, NO_BLOBS);
      if (body.baseline && !session.passed) throw new HttpError(409, 'conflict', 'baseline: only a passing session may be its core’s baseline');
      await db.transaction(async (transaction) => {
        const changes: { notes?: string; tags?: string[] } = {};
        if (body.notes !== undefined) changes.notes = body.notes;
        if (body.tags !== undefined) changes.tags = body.tags;
        if (Object.keys(changes).length) await session.update(changes, { transaction });
        if (body.baseline) await Core.update({ baselineSessionId: session.id }, { where: { id: session.coreId }, transaction });
        await recordAudit(transaction, me.id, 'update', 'session', session.id, { ...body });
      });
      res.json({ session });
    })
    .delete(requireRole('engineer'), validate({ params: idParams }), async (req, res) => {
      const me = currentUser(req);
      const session = await findSession(req, NO_BLOBS);
      const fresh = Date.now() - session.createdAt.getTime() < OWN_DELETE_WINDOW_MS;
      if (!hasRole(me.role, 'admin') && !(session.operatorId === me.id && fresh)) {
        throw new HttpError(403, 'forbidden', 'Only an admin, or its operator within 24 hours of the upload, may delete a session');
      }
      await db.transaction(async (transaction) => {
        // No foreign key guards a core's baseline: a deleted baseline leaves the core without one.
        await Core.update({ baselineSessionId: null }, { where: { baselineSessionId: session.id }, transaction });
        await session.destroy({ transaction });
        await recordAudit(transaction, me.id, 'delete', 'session', session.id, { coreId: session.coreId, passed: session.passed, sampleCount: session.sampleCount });
      });
      res.status(204).end();
    });

  router.route('/:id/samples').get(requireRole('reviewer'), validate({ params: idParams }), async (req, res) => {
    const session = await findSession(req);
    res.type('application/octet-stream').attachment(`session-${session.id}-samples.bin`).send(session.samples);
  });

  router.route('/:id/archive').get(requireRole('reviewer'), validate({ params: idParams }), async (req, res) => {
    const session = await findSession(req);
    if (!session.archive) throw notFound('Session archive');
    res.type('application/octet-stream').attachment(`session-${session.id}.abrc`).send(session.archive);
  });

  router.route('/:id/export.csv').get(requireRole('reviewer'), validate({ params: idParams }), async (req, res) => {
    const session = await findSession(req);
    const core = await Core.findByPk(session.coreId);
    if (!core) throw notFound('Core');
    const model = core.modelConfig as { angleFormat?: 'turn' | 'rad' };
    const samples = decodeSamples(session.samples, model.angleFormat ?? 'turn');
    res.type('text/csv; charset=utf-8').set('content-disposition', `attachment; filename="session-${session.id}.csv"`);
    for (const chunk of sessionCsvChunks(core.modelConfig, samples)) {
      if (res.write(chunk)) continue;
      await Promise.race([once(res, 'drain'), once(res, 'close')]);
      if (res.destroyed) return;
    }
    res.end();
  });

  return router;
}
