// `run` against a vectoring core (issue #20): after HELLO and MODES, the plan through the link
// engine's vectoring run, scoring with shared/vectoring's scorer, the verdict against the same
// limits as a rotating core's (read for angle and magnitude), the capture archive and the report.
// Saving to the server waits for the server to know vectoring sessions: refused with a clear error.
import { writeFileSync } from 'node:fs';
import type { LinkEngine, VectorRunResult } from '../shared/link-engine/link-engine';
import type { LinkFigures } from '../shared/link-engine/link-figures';
import type { DeviceInfo, ModeInfo, VectoringFormats } from '../shared/link';
import { createVectorModel, parseVectorConfig, VectorScoreAccumulator, type VectorConfig, type VectorPlan, type VectorScoreSummary } from '../shared/vectoring';
import type { CliIo } from './io';
import { progressSink } from './progress';
import { UsageError, type RunOptions } from './run-options';
import { MAX_LABEL_BYTES, type RunRecording } from './run-record';
import type { Limits, LimitCheck, LimitKey, Verdict } from './run-verdict';
import { resolveVectorPlan, vectorPlanToRequest } from './run-vector-plan';
import { checkLine } from './run-report';
import type { Interrupt } from './interrupt';
import { INTERRUPTED_STATUS } from './interrupt';
import { realClock } from './clock';

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
 * The limits as a vectoring core reads them: errors in output LSB of the angle or the magnitude,
 * whichever is larger; coverage is the share of the input plane's cells asked about. SFDR and
 * unstable codes are not measured by a vectoring run.
 */
const VECTOR_MEASURES: Record<LimitKey, { max: boolean; value: (s: VectorRunScore) => number | null; note?: string }> = {
  maxAbsErrorLsb: { max: true, value: (s) => Math.max(s.summary.angleLsb.maxAbs, s.summary.magnitudeLsb.maxAbs) },
  maxRmsErrorLsb: { max: true, value: (s) => Math.max(s.summary.angleLsb.rms, s.summary.magnitudeLsb.rms) },
  maxAbsBiasLsb: { max: true, value: (s) => Math.max(Math.abs(s.summary.angleLsb.mean), Math.abs(s.summary.magnitudeLsb.mean)) },
  minSfdrDb: { max: false, value: () => null, note: 'not measured by a vectoring run' },
  maxModelMismatches: { max: true, value: (s) => s.summary.mismatches.count },
  maxLinkErrors: { max: true, value: (s) => s.linkErrors },
  minCoveragePct: { max: false, value: (s) => s.summary.coverage.cells.share * 100, note: 'cells of the input plane' },
  maxUnstableCodes: { max: true, value: () => null, note: 'needs a soak, not yet for vectoring cores' },
  // The vectoring cores' own limits, measured as the server measures them (shared/link-engine/limits.ts).
  maxAngleErrorLsb: { max: true, value: (s) => s.summary.angleLsb.maxAbs },
  maxAngleRmsLsb: { max: true, value: (s) => s.summary.angleLsb.rms },
  maxMagnitudeErrorLsb: { max: true, value: (s) => s.summary.magnitudeLsb.maxAbs },
  maxMagnitudeErrorPpm: { max: true, value: (s) => s.summary.magnitudePpm.maxAbs },
  minPlaneCoveragePct: { max: false, value: (s) => s.summary.coverage.cells.share * 100, note: 'cells of the input plane' },
};

/** Every given limit against the score; an empty run fails every limit it could measure, as run-verdict's judge. */
export function judgeVector(score: VectorRunScore, limits: Limits): Verdict {
  const checks: LimitCheck[] = [];
  for (const key of Object.keys(VECTOR_MEASURES) as LimitKey[]) {
    const limit = limits[key];
    if (limit === undefined) continue;
    const m = VECTOR_MEASURES[key];
    const value = m.value(score);
    if (value === null) {
      checks.push({ key, limit, value, outcome: 'skip', note: m.note });
      continue;
    }
    const empty = score.summary.count === 0 && key !== 'maxLinkErrors';
    const ok = !empty && (m.max ? value <= limit : value >= limit);
    checks.push({ key, limit, value, outcome: ok ? 'pass' : 'fail', ...(empty ? { note: 'no results' } : m.note ? { note: m.note } : {}) });
  }
  return { passed: checks.every((c) => c.outcome !== 'fail'), checks };
}

/** The model to score with: --config, else MODE_INFO's formats with every other key at its default; formats must agree. */
export function chooseVectorModel(config: VectorConfig | null, f: VectoringFormats, core: string): { model: VectorConfig; from: 'config' | 'device' } {
  const fromDevice = () =>
    parseVectorConfig({ inBits: f.inBits, inFrac: f.inFrac, angleFormat: f.angleFormat, angleBits: f.angleBits, magBits: f.magBits, magFrac: f.magFrac, iterations: f.iterations, ...(f.angleFormat === 'rad' ? { angleFrac: f.angleFrac } : {}) });
  let model: VectorConfig;
  try {
    model = config ?? fromDevice();
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
  return { model, from: config ? 'config' : 'device' };
}

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
  stderrIsTty: boolean;
  writeFile?: (path: string, bytes: Uint8Array) => void;
  interrupt?: Interrupt;
  t0: number;
  warnings: string[];
}

/** Runs the plan on the vectoring core; returns the exit status (0 pass, 1 a limit fails, 130 interrupted). */
export async function runVectoring(c: VectorRunContext): Promise<number> {
  const { o, io, engine } = c;
  if (o.server) throw new VectorRunError('the board serves a vectoring core, and vectoring sessions cannot be saved to the server yet: run without --server and keep the capture with --out');
  for (const [given, name] of [[o.soak, '--soak'], [o.explain, '--explain'], [o.junit, '--junit']] as const) {
    if (given) throw new UsageError(`${name} is not available for vectoring cores yet`);
  }
  if (!o.vectorPlan) throw new UsageError(`--plan ${o.planText} is a rotating core's plan, and the board serves a vectoring core (plans: exhaustive, grid:TARGET, circle:RADIUS,POINTS, random:COUNT,SEED, edges, file:PATH)`);
  const { model, from } = chooseVectorModel(o.vectorConfig, c.modes.vectoring!, o.core);
  const bound = resolveVectorPlan(o.vectorPlan, model, io.readFile);
  const label: VectorRunLabel = { recordedBy: 'anglebench run', mode: 'vectoring', core: o.core, build: o.build, board: o.board, plan: bound.plan, model };
  const labelSize = new TextEncoder().encode(JSON.stringify(label)).length;
  if (o.out && labelSize > MAX_LABEL_BYTES) throw new UsageError(`--plan file: too many vectors to record in the archive's label (${labelSize} bytes, at most ${MAX_LABEL_BYTES})`);
  c.recording.start(label);
  const request = vectorPlanToRequest(bound, model);
  const progress = progressSink(io.stderr, c.stderrIsTty, () => realClock.now());
  const reference = createVectorModel(model);
  // As confirmOffModel for rotating cores: on a damaged line, answers off the model are asked twice.
  const confirm = (x: number, y: number, angle: number, magnitude: number) => {
    const m = reference.answer(x, y);
    return m.angle !== angle || m.magnitude !== magnitude;
  };
  let result: VectorRunResult;
  const handle = engine.runVectors(request, { onProgress: (p) => progress.update(p), confirm });
  const stop = c.interrupt?.onRequest(() => void handle.abort()) ?? (() => undefined);
  if (c.interrupt?.requested) void handle.abort();
  try {
    result = await handle.done;
  } finally {
    stop();
    progress.end(null);
  }
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
  const verdict = judgeVector(score, c.limits);
  const report: VectorRunReport = {
    core: o.core, build: o.build, board: o.board, device: o.device, baud: c.baud, info: c.info, modes: c.modes, plan: bound.plan, planText: o.planText,
    model, modelFrom: from, limitsFrom: c.limitsFrom, status: result.status, elapsedMs: result.elapsedMs, score, figures: result.figures, verdict, archive: o.out,
  };
  for (const w of c.warnings.slice(0, 5)) io.stderr(`warning: ${w}\n`);
  io.stdout(o.json ? JSON.stringify(vectorJsonSummary(report), null, 2) + '\n' : vectorHumanReport(report));
  if (c.interrupt?.requested) {
    io.stderr(`interrupted: ${score.answered} of ${score.total} vectors answered${o.out ? `, the capture written to ${o.out}` : ''}\n`);
    return INTERRUPTED_STATUS;
  }
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
  modelFrom: 'config' | 'device';
  limitsFrom: 'server' | 'option' | 'none';
  status: VectorRunResult['status'];
  elapsedMs: number;
  score: VectorRunScore;
  figures: LinkFigures;
  verdict: Verdict;
  archive: string | null;
}

/** The machine-readable summary of a vectoring run (`mode: "vectoring"` tells it from a rotating one's). */
export function vectorJsonSummary(r: VectorRunReport): Record<string, unknown> {
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
    upload: null,
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
  out.push(`model from ${r.modelFrom === 'config' ? '--config' : 'the device MODE_INFO (other keys at their defaults)'}`);
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
  if (r.archive) out.push(`archive written to ${r.archive}`);
  return out.join('\n') + '\n';
}
