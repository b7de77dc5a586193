// Storing a bench session: the one path every upload takes (the bench page, the runner, an
// imported archive or CSV, the demo seed). The samples are scored here with the core's model and
// judged against its limits, all in the caller's transaction, so a failure leaves nothing behind.
import type { Transaction } from 'sequelize';
import { BenchSession, Board, Build, Core } from '../db/models';
import { HttpError } from '../http-error';
import { recordAudit } from './audit';
import { decodeSamples, isTonePlan, judgeSession, regressedLimits, PackedScoring, sessionSpectrum, type LimitKey, type Verdict } from './session-scoring';
import type { EnvelopeBounds } from './error-envelope';
import type { StoredStats } from '../../shared/contract/sessions';
import { decodeVectorSamples, judgeVectorSession, scoreVectorSamples } from './vector-scoring';
import { modeOf, rotationConfigOf, vectorConfigOf } from './core-mode';
import type { Conditions, SoakRecord } from '../../shared/soak';
import { saveSessionConditions } from './session-conditions';
import type { UploadScoring } from './upload-scoring';

type Json = Record<string, unknown>;

/** Where a session belongs and what ran; the build and board by id, or by the runner's label. */
export interface SessionDraft {
  coreId?: number;
  coreSlug?: string;
  buildId?: number | null;
  boardId?: number | null;
  build?: string | null;
  board?: string | null;
  startedAt: Date;
  endedAt?: Date | null;
  plan: Json;
  transport: Json;
  deviceInfo?: Json | null;
  notes?: string;
  tags?: string[];
  /** Link figures the runner or bench page reported (retries, check failures…). */
  link?: Json;
  /** Operating conditions and a soak's books (session_conditions). */
  conditions?: Conditions;
  soak?: SoakRecord;
}

export interface StoredSession {
  row: BenchSession;
  core: Core;
  /** The score, with the tone's spectra for a tone session; `vectoring` for a vectoring core's session. */
  stats: StoredStats;
  verdict: Verdict;
  passed: boolean;
  failedLimits: LimitKey[];
  /** The compare view's error envelope, for the caller to keep (session-intake.ts). */
  envelope: EnvelopeBounds;
}

/** The core a draft names. @throws HttpError 400 naming the field. */
export async function resolveCore(draft: Pick<SessionDraft, 'coreId' | 'coreSlug'>, transaction: Transaction, field = 'session'): Promise<Core> {
  const core = draft.coreId !== undefined ? await Core.findByPk(draft.coreId, { transaction }) : await Core.findOne({ where: { slug: draft.coreSlug }, transaction });
  if (!core) throw new HttpError(400, 'invalid', draft.coreId !== undefined ? `${field}.coreId: no such core` : `${field}.coreSlug: no such core`);
  if (draft.coreId !== undefined && draft.coreSlug !== undefined && core.slug !== draft.coreSlug) {
    throw new HttpError(400, 'invalid', `${field}.coreSlug: does not name the core of ${field}.coreId`);
  }
  return core;
}

async function resolveBuildId(draft: SessionDraft, core: Core, transaction: Transaction): Promise<number | null> {
  if (draft.buildId != null) {
    const build = await Build.findByPk(draft.buildId, { transaction });
    if (!build || build.coreId !== core.id) throw new HttpError(400, 'invalid', 'session.buildId: no such build of this core');
    return build.id;
  }
  if (!draft.build) return null;
  return (await Build.findOne({ where: { coreId: core.id, label: draft.build }, order: [['id', 'DESC']], transaction }))?.id ?? null;
}

async function resolveBoardId(draft: SessionDraft, transaction: Transaction): Promise<number | null> {
  if (draft.boardId != null) {
    if (!(await Board.findByPk(draft.boardId, { transaction }))) throw new HttpError(400, 'invalid', 'session.boardId: no such board');
    return draft.boardId;
  }
  if (!draft.board) return null;
  return (await Board.findOne({ where: { name: draft.board }, transaction }))?.id ?? null;
}

/** A rotation core's session: the ScoreSummary, with the spectra of a complete coherent tone. */
function scoreRotation(core: Core, draft: SessionDraft, samples: Buffer, checkFailures: number | undefined, begun: UploadScoring | undefined) {
  const config = rotationConfigOf(core);
  const scoring = begun?.take(core) ?? new PackedScoring(config, config.angleFormat);
  const { stats, profile, envelope, count } = scoring.finish(samples);
  // Only a tone's spectrum needs every sample unpacked at once.
  const spectrum = isTonePlan(draft.plan) ? sessionSpectrum(draft.plan, config, decodeSamples(samples, config.angleFormat)) : null;
  const sfdrDb = spectrum ? Math.min(spectrum.cos.sfdrDbc, spectrum.sin.sfdrDbc) : undefined;
  const stored: StoredStats = spectrum ? { ...stats, spectrum } : stats;
  const { verdict, passed } = judgeSession(core.limits, stats, { checkFailures, sfdrDb, unstableCodes: draft.soak?.unstable.count });
  return { stored, verdict, passed, profile, envelope, sampleCount: count };
}

/** A vectoring core's session: 16-byte records scored by shared/vectoring (stats.vectoring). */
function scoreVectoring(core: Core, draft: SessionDraft, samples: Buffer, checkFailures: number | undefined) {
  if (draft.soak) throw new HttpError(400, 'invalid', 'session.soak: soaks of vectoring cores are not kept yet; upload each pass as a session');
  const decoded = decodeVectorSamples(samples);
  const { stats, profile, envelope } = scoreVectorSamples(vectorConfigOf(core), decoded);
  const { verdict, passed } = judgeVectorSession(core.limits, stats, { checkFailures });
  return { stored: { count: stats.count, vectoring: stats } as StoredStats, verdict, passed, profile, envelope, sampleCount: decoded.xs.length };
}

/**
 * Score, judge and store one session inside `transaction`. `samples` is the packed sample format
 * of shared/link-engine/sample-pack.ts (for a vectoring core, vector-sample-pack.ts);
 * `options.scoring`, an upload's scoring begun while its samples arrived, is finished when it is
 * for this core. `options.action` names the audit entry.
 * @throws HttpError 400 for anything the caller got wrong.
 */
export async function storeSession(
  transaction: Transaction,
  operatorId: number | null,
  draft: SessionDraft,
  samples: Buffer,
  archive: Buffer | null,
  options: { action: string; scoring?: UploadScoring } = { action: 'upload' },
): Promise<StoredSession> {
  const core = await resolveCore(draft, transaction);
  const buildId = await resolveBuildId(draft, core, transaction);
  const boardId = await resolveBoardId(draft, transaction);

  const checkFailures = typeof draft.link?.checkFailures === 'number' ? draft.link.checkFailures : undefined;
  const scored = modeOf(core) === 'vectoring' ? scoreVectoring(core, draft, samples, checkFailures) : scoreRotation(core, draft, samples, checkFailures, options.scoring);
  const { stored, verdict, passed, profile, envelope, sampleCount } = scored;
  const baseline = core.baselineSessionId ? await BenchSession.findByPk(core.baselineSessionId, { attributes: ['id', 'verdict'], transaction }) : null;
  const failedLimits = baseline ? regressedLimits(baseline.verdict, verdict) : [];

  const row = await BenchSession.create(
    {
      coreId: core.id,
      buildId,
      boardId,
      operatorId,
      startedAt: draft.startedAt,
      endedAt: draft.endedAt ?? null,
      plan: draft.plan,
      transport: draft.link ? { ...draft.transport, linkFigures: draft.link } : draft.transport,
      deviceInfo: draft.deviceInfo ?? null,
      stats: stored,
      verdict,
      profile,
      passed,
      regression: failedLimits.length > 0,
      sampleCount,
      samples,
      archive,
      notes: draft.notes ?? '',
      tags: draft.tags ?? [],
    },
    { transaction },
  );
  await saveSessionConditions(transaction, row.id, draft.conditions, draft.soak);
  await recordAudit(transaction, operatorId, options.action, 'session', row.id, { coreId: core.id, sampleCount: row.sampleCount, passed, regression: row.regression });
  return { row, core, stats: stored, verdict, passed, failedLimits, envelope };
}
