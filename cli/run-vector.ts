// `run` against a vectoring core (issue #20): after HELLO and MODES, the plan through the link
// engine's vectoring run, scoring with shared/vectoring's scorer, the verdict against the
// vectoring limits measured as the server measures them (shared/link-engine/vector-measures.ts),
// the capture archive, the report, and with --server the session upload of 16-byte records.
import { writeFileSync } from 'node:fs';
import type { LinkEngine, VectorRunHandle, VectorRunResult } from '../shared/link-engine/link-engine';
import type { PassScore, VectorSoakRecord } from '../shared/soak';
import { soakReportLines, vectorSoakPasses, type VectorSoakRun } from './soak';
import type { LinkFigures } from '../shared/link-engine/link-figures';
import type { Crc8Name, DeviceInfo, ModeInfo, VectoringFormats } from '../shared/link';
import { createVectorModel, parseVectorConfig, VectorScoreAccumulator, type VectorConfig, type VectorPlan, type VectorScoreSummary } from '../shared/vectoring';
import type { CliIo } from './io';
import { progressSink } from './progress';
import { UsageError, type RunOptions } from './run-options';
import { MAX_LABEL_BYTES, type RunRecording } from './run-record';
import type { Limits, LimitCheck, Verdict } from './run-verdict';
import { limitOutsideMode, VECTOR_LIMIT_KEYS } from '../shared/link-engine/limits';
import { VECTOR_MEASURES } from '../shared/link-engine/vector-measures';
import { packVectorSamples, transportOf, type Fetch, type ServerCore } from './run-server';
import { publishRun } from './run-upload';
import { junitXml } from './junit';
import { resolveVectorPlan, vectorPlanToRequest } from './run-vector-plan';
import { checkLine } from './run-report';
import type { Interrupt } from './interrupt';
import { INTERRUPTED_STATUS } from './interrupt';
import { realClock } from './clock';
import { explainVectorRun, explanationText } from './run-explain';
import type { VectorExplanation } from '../shared/explain';

/** The archive label of a vectoring capture, as JSON. */
export interface VectorRunLabel {
  recordedBy: 'anglebench run';
  mode: 'vectoring';
  core: string;
  build: string | null;
  board: string | null;
  plan: VectorPlan;
  model: VectorConfig;
}

export interface VectorRunScore {
  summary: VectorScoreSummary;
  total: number;
  answered: number;
  missing: number;
  /** Frames dropped for a bad CHECK plus vectors never answered. */
  linkErrors: number;
}

/** Something that is not the core's fault: exit status 2 with this one line. */
export class VectorRunError extends Error {}

const BATCH = 4096;

/** Every answered vector in request order, in runs of consecutive indexes (mismatches keep their index). */
export function scoreVectorRun(config: VectorConfig, r: Pick<VectorRunResult, 'xs' | 'ys' | 'angle' | 'magnitude' | 'answered'>, checkFailures: number): VectorRunScore {
  const acc = new VectorScoreAccumulator(config);
  const n = r.xs.length;
  let answered = 0;
  let from = -1;
  const flush = (to: number) => {
    if (from < 0) return;
    for (let s = from; s < to; s += BATCH) {
      const e = Math.min(to, s + BATCH);
      acc.add(r.xs.subarray(s, e), r.ys.subarray(s, e), r.angle.subarray(s, e), r.magnitude.subarray(s, e), s);
    }
    from = -1;
  };
  for (let i = 0; i < n; i++) {
    if (!r.answered[i]) {
      flush(i);
      continue;
    }
    if (from < 0) from = i;
    answered++;
  }
  flush(n);
  return { summary: acc.summary(), total: n, answered, missing: n - answered, linkErrors: checkFailures + (n - answered) };
}

/**
 * The vectoring limits against the score, measured by the server's own table so the stored
 * session's verdict is the runner's; link errors are the frames that failed their CHECK, the
 * count the upload sends as `link.checkFailures`. An empty run fails every limit it could measure.
 */
export function judgeVector(score: VectorRunScore, limits: Limits, checkFailures: number): Verdict {
  const checks: LimitCheck[] = [];
  for (const key of VECTOR_LIMIT_KEYS) {
    const limit = limits[key];
    const m = VECTOR_MEASURES[key];
    if (limit === undefined || !m) continue;
    const value = m.value(score.summary, { checkFailures });
    if (value === null) {
      checks.push({ key, limit, value, outcome: 'skip' });
      continue;
    }
    const empty = score.summary.count === 0 && key !== 'maxLinkErrors';
    const ok = !empty && (m.max ? value <= limit : value >= limit);
    checks.push({ key, limit, value, outcome: ok ? 'pass' : 'fail', ...(empty ? { note: 'no results' } : {}) });
  }
  return { passed: checks.every((c) => c.outcome !== 'fail'), checks };
}

/** @throws UsageError for a limit only rotation cores have: the server would never judge it. */
export function checkVectorLimits(limits: Limits, from: string): void {
  const key = limitOutsideMode('vectoring', limits);
  if (key) throw new UsageError(`${from}: ${key} is a limit of rotation cores; a vectoring core's are ${VECTOR_LIMIT_KEYS.join(', ')}`);
}

/** The model to score with: --config or the server's core, else MODE_INFO's formats with every other key at its default; formats must agree. */
export function chooseVectorModel(given: { config: VectorConfig; from: 'config' | 'server' } | null, f: VectoringFormats, core: string): { model: VectorConfig; from: VectorModelFrom } {
  const fromDevice = () =>
    parseVectorConfig({ inBits: f.inBits, inFrac: f.inFrac, angleFormat: f.angleFormat, angleBits: f.angleBits, magBits: f.magBits, magFrac: f.magFrac, iterations: f.iterations, ...(f.angleFormat === 'rad' ? { angleFrac: f.angleFrac } : {}) });
  let model: VectorConfig;
  try {
    model = given?.config ?? fromDevice();
  } catch (e) {
    throw new VectorRunError(`the device's MODE_INFO describes no core the model can hold (${(e as Error).message})`);
  }
  const keys: Array<keyof VectoringFormats & keyof VectorConfig> = ['inBits', 'inFrac', 'angleFormat', 'angleBits', 'magBits', 'magFrac'];
  if (f.angleFormat === 'rad') keys.push('angleFrac');
  const differ = keys.filter((k) => model[k] !== f[k]);
  if (differ.length > 0) {
    const what = differ.map((k) => `${k} ${String(f[k])} on the device, ${String(model[k])} in the model`).join('; ');
    throw new VectorRunError(`the device's formats differ from the model of core "${core}" (${what}): is the right bitstream loaded?`);
  }
  return { model, from: given?.from ?? 'device' };
}

/** Where a vectoring run's model came from. */
export type VectorModelFrom = 'config' | 'server' | 'device';

export interface VectorRunContext {
  o: RunOptions;
  io: CliIo;
  engine: LinkEngine;
  info: DeviceInfo;
  modes: ModeInfo;
  recording: RunRecording;
  limits: Limits;
  limitsFrom: 'server' | 'option' | 'none';
  baud: number;
  crc: Crc8Name;
  /** The server's vectoring core when --server was given: its configuration, limits and the upload's target. */
  core: (ServerCore & { mode: 'vectoring' }) | null;
  fetchImpl: Fetch;
  stderrIsTty: boolean;
  writeFile?: (path: string, bytes: Uint8Array) => void;
  interrupt?: Interrupt;
  t0: number;
  warnings: string[];
}

/** Runs the plan on the vectoring core; returns the exit status (0 pass, 1 a limit fails, 130 interrupted). */
export async function runVectoring(c: VectorRunContext): Promise<number> {
  const { o, io, engine } = c;
  // The server refuses a vectoring session's soak (its record lists codes, not vectors): say so before the soak runs for nothing.
  if (o.soak && o.server) {
    throw new UsageError('--soak with --server: the server does not keep the soaks of vectoring cores yet; run the soak without --server (its unstable vectors are in the report and in --json), or save single passes');
  }
  if (!o.vectorPlan) throw new UsageError(`--plan ${o.planText} is a rotating core's plan, and the board serves a vectoring core (plans: exhaustive, grid:TARGET, circle:RADIUS,POINTS, random:COUNT,SEED, edges, file:PATH)`);
  checkVectorLimits(c.limits, c.limitsFrom === 'option' ? '--limits' : `core "${o.core}" limits on the server`);
  const given = o.vectorConfig ? { config: o.vectorConfig, from: 'config' as const } : c.core ? { config: c.core.vectorConfig, from: 'server' as const } : null;
  const { model, from } = chooseVectorModel(given, c.modes.vectoring!, o.core);
  const bound = resolveVectorPlan(o.vectorPlan, model, io.readFile);
  const label: VectorRunLabel = { recordedBy: 'anglebench run', mode: 'vectoring', core: o.core, build: o.build, board: o.board, plan: bound.plan, model };
  const labelSize = new TextEncoder().encode(JSON.stringify(label)).length;
  if (o.out && labelSize > MAX_LABEL_BYTES) throw new UsageError(`--plan file: too many vectors to record in the archive's label (${labelSize} bytes, at most ${MAX_LABEL_BYTES})`);
  c.recording.start(label);
  const request = vectorPlanToRequest(bound, model);
  const progress = progressSink(io.stderr, c.stderrIsTty, () => realClock.now(), 'vectors');
  const startedAt = new Date();
  const reference = createVectorModel(model);
  // As confirmOffModel for rotating cores: on a damaged line, answers off the model are asked twice.
  const confirm = (x: number, y: number, angle: number, magnitude: number) => {
    const m = reference.answer(x, y);
    return m.angle !== angle || m.magnitude !== magnitude;
  };
  let result: VectorRunResult;
  let soak: VectorSoakRun | null = null;
  let current: VectorRunHandle | null = null;
  const stop = c.interrupt?.onRequest(() => void current?.abort()) ?? (() => undefined);
  // A run (or soak pass) that starts after the interrupt came is aborted as it begins.
  const started = (h: VectorRunHandle): VectorRunHandle => {
    current = h;
    if (c.interrupt?.requested) void h.abort();
    return h;
  };
  try {
    if (o.soak) {
      const keepGoing = () => !c.interrupt?.requested;
      soak = await vectorSoakPasses({ engine, request, spec: o.soak, clock: realClock, score: (r, checkFailures) => passScore(model, r, checkFailures), confirm, log: io.stderr, onPassStart: started, keepGoing });
      result = soak.status === 'complete' ? soak.result : { ...soak.result, status: soak.status, message: soak.message };
    } else {
      result = await started(engine.runVectors(request, { onProgress: (p) => progress.update(p), confirm })).done;
    }
  } finally {
    stop();
    progress.end(null);
  }
  const endedAt = new Date();
  if (result.status === 'failed') throw new VectorRunError(result.message ?? 'the run failed');
  const archive = c.recording.finish(realClock.now() - c.t0);
  if (o.out) {
    try {
      (c.writeFile ?? writeFileSync)(o.out, archive);
    } catch (e) {
      throw new VectorRunError(`cannot write the archive to ${o.out}: ${(e as NodeJS.ErrnoException).code ?? (e as Error).message}`);
    }
  }
  const score = scoreVectorRun(model, result, result.figures.checkFailures);
  const verdict = judgeVector(score, c.limits, result.figures.checkFailures);
  const report: VectorRunReport = {
    core: o.core, build: o.build, board: o.board, device: o.device, baud: c.baud, info: c.info, modes: c.modes, plan: bound.plan, planText: o.planText,
    model, modelFrom: from, limitsFrom: c.limitsFrom, status: result.status, elapsedMs: result.elapsedMs, score, figures: result.figures, verdict, archive: o.out,
    soak: soak?.record ?? null,
    explanation: o.explain && score.answered > 0 ? explainVectorRun(model, result) : undefined,
  };
  for (const w of c.warnings.slice(0, 5)) io.stderr(`warning: ${w}\n`);
  if (c.interrupt?.requested) {
    // What was captured is on record (--out); a partial session is not uploaded.
    io.stdout(o.json ? JSON.stringify(vectorJsonSummary(report, null), null, 2) + '\n' : vectorHumanReport(report));
    io.stderr(`interrupted: ${score.answered} of ${score.total} vectors answered${o.out ? `, the capture written to ${o.out}` : ''}${o.server ? '; nothing uploaded' : ''}\n`);
    return INTERRUPTED_STATUS;
  }
  const core = c.core;
  await publishRun({
    o, io, fetchImpl: c.fetchImpl, core, writeFile: c.writeFile,
    human: vectorHumanReport(report),
    json: (upload) => vectorJsonSummary(report, upload),
    junit: (sessionUrl) => junitXml(report, sessionUrl),
    upload: () => {
      const summary = vectorJsonSummary(report, null);
      return {
        // The records and the link's CHECK failures are what the server scores and judges (docs/api.md, "Vectoring cores").
        session: {
          coreId: core!.id, coreSlug: core!.slug, build: o.build, board: o.board, plan: bound.plan, startedAt: startedAt.toISOString(), endedAt: endedAt.toISOString(),
          transport: transportOf(o, c.baud, c.crc),
          deviceInfo: c.info, stats: summary.stats, link: result.figures, verdict: summary.verdict, passed: verdict.passed, sampleCount: score.answered,
        },
        samples: packVectorSamples({ xs: result.xs, ys: result.ys, angles: result.angle, magnitudes: result.magnitude }, result.answered),
        archive,
      };
    },
  });
  return verdict.passed ? 0 : 1;
}

export interface VectorRunReport {
  core: string;
  build: string | null;
  board: string | null;
  device: string;
  baud: number;
  info: DeviceInfo;
  modes: ModeInfo;
  plan: VectorPlan;
  planText: string;
  model: VectorConfig;
  modelFrom: VectorModelFrom;
  limitsFrom: 'server' | 'option' | 'none';
  status: VectorRunResult['status'];
  elapsedMs: number;
  score: VectorRunScore;
  figures: LinkFigures;
  verdict: Verdict;
  archive: string | null;
  /** With --explain: which deviation or defect reproduces the answers (shared/explain). */
  explanation?: VectorExplanation;
  /** The soak's books when --soak was given; the other figures are then its last pass. */
  soak: VectorSoakRecord | null;
}

/** A soak pass's figures for its books: model mismatches, and the larger of the largest angle and magnitude errors, each in its own LSB. */
function passScore(model: VectorConfig, r: VectorRunResult, checkFailures: number): PassScore {
  const s = scoreVectorRun(model, r, checkFailures).summary;
  return { mismatches: s.mismatches.count, maxAbsErrorLsb: s.count > 0 ? Math.max(s.angleLsb.maxAbs, s.magnitudeLsb.maxAbs) : null };
}

/** The machine-readable summary of a vectoring run (`mode: "vectoring"` tells it from a rotating one's). */
export function vectorJsonSummary(r: VectorRunReport, upload: { sessionId: number | null } | null): Record<string, unknown> {
  const s = r.score.summary;
  return {
    mode: 'vectoring',
    core: r.core,
    build: r.build,
    board: r.board,
    device: { path: r.device, baud: r.baud, info: r.info, modes: r.modes },
    plan: r.plan.kind === 'list' ? { kind: 'list', count: r.plan.points.length } : r.plan,
    model: r.model,
    modelFrom: r.modelFrom,
    status: r.status,
    elapsedMs: Math.round(r.elapsedMs),
    results: { total: r.score.total, answered: r.score.answered, missing: r.score.missing },
    stats: {
      angleLsb: s.angleLsb,
      magnitudeLsb: s.magnitudeLsb,
      magnitudePpm: s.magnitudePpm,
      mismatches: s.mismatches,
      coverage: { cells: share(s.coverage.cells), sectors: share(s.coverage.sectors), rings: share(s.coverage.rings), zeroVectors: s.coverage.zeroVectors, distinct: s.coverage.distinct, total: s.coverage.total },
      histogram: { below: s.histogram.below, above: s.histogram.above },
      linkErrors: r.score.linkErrors,
    },
    link: r.figures,
    verdict: { passed: r.verdict.passed, limitsFrom: r.limitsFrom, checks: r.verdict.checks },
    archive: r.archive,
    ...(r.soak ? { soak: r.soak } : {}),
    ...(r.explanation ? { explanation: r.explanation } : {}),
    upload,
  };
}

const share = (o: { occupied: number; total: number; share: number }) => ({ occupied: o.occupied, total: o.total, share: o.share });
const num = (v: number, digits = 3) => (Number.isInteger(v) ? String(v) : v.toFixed(digits));

/** The human table of a vectoring run. */
export function vectorHumanReport(r: VectorRunReport): string {
  const s = r.score.summary;
  const m = r.model;
  const out: string[] = [];
  out.push(`core ${r.core}${r.build ? `, build ${r.build}` : ''}${r.board ? `, board ${r.board}` : ''} (vectoring)`);
  out.push(
    `device ${r.device} at ${r.baud.toLocaleString('en-US')} baud: "${r.info.name}", build id 0x${r.info.buildId.toString(16).padStart(8, '0')}, ${m.inBits}-bit x/y (${m.inFrac} fraction bits) in, ${m.angleFormat} ${m.angleBits}-bit angles and ${m.magBits}-bit magnitudes (${m.magFrac} fraction bits) out, ${m.iterations} iterations`,
  );
  out.push(`plan ${r.planText}: ${r.score.total.toLocaleString('en-US')} vectors, ${r.score.answered.toLocaleString('en-US')} answered, ${r.score.missing} missing, ${(r.elapsedMs / 1000).toFixed(2)} s (${r.status})`);
  out.push(`model from ${{ config: '--config', server: 'the server', device: 'the device MODE_INFO (other keys at their defaults)' }[r.modelFrom]}`);
  out.push('');
  out.push('              max |err|       RMS      mean   at (x, y)');
  const row = (name: string, e: VectorScoreSummary['angleLsb'], unit: string) =>
    `  ${name.padEnd(14)} ${num(e.maxAbs, 4).padStart(9)} ${num(e.rms, 4).padStart(9)} ${num(e.mean, 4).padStart(9)}   ${e.worst ? `(${e.worst.x}, ${e.worst.y})` : '—'}  ${unit}`;
  out.push(row('angle', s.angleLsb, 'LSB'));
  out.push(row('magnitude', s.magnitudeLsb, 'LSB'));
  out.push(row('magnitude', s.magnitudePpm, 'ppm'));
  out.push(`  model mismatches ${s.mismatches.count} (largest ${s.mismatches.maxAbsDiffLsb} LSB), coverage ${(s.coverage.cells.share * 100).toFixed(2)}% of cells, ${(s.coverage.sectors.share * 100).toFixed(0)}% of angle sectors, ${(s.coverage.rings.share * 100).toFixed(0)}% of magnitude rings`);
  const f = r.figures;
  const naks = Object.entries(f.naks).filter(([, n]) => n > 0).map(([k, n]) => `${n}×${k}`).join(' ') || 'none';
  out.push(`  link: ${f.framesSent} frames out, ${f.framesReceived} in, ${f.checkFailures} bad CHECK, ${f.skippedBytes} bytes skipped, ${f.retries} retries, NAKs ${naks}, ${f.confirmations} answers confirmed, ${Math.round(f.resultsPerS).toLocaleString('en-US')} results/s, ${(f.lineShare * 100).toFixed(1)}% of the line`);
  out.push('');
  if (r.verdict.checks.length === 0) out.push('verdict: PASS (no limits given: nothing to fail)');
  else {
    out.push(`limits from ${r.limitsFrom === 'server' ? 'the server' : '--limits'}:`);
    for (const c of r.verdict.checks) out.push(checkLine(c));
    out.push(`verdict: ${r.verdict.passed ? 'PASS' : 'FAIL'}`);
  }
  if (r.soak) out.push('', ...soakReportLines(r.soak));
  if (r.archive) out.push(`archive written to ${r.archive}`);
  return out.join('\n') + '\n' + (r.explanation ? explanationText(r.explanation) : '');
}
