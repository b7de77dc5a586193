// `run --soak 50 | 30m`: the plan repeated on one connection (shared/soak/soak-run.ts), a line
// per pass on stderr, and the soak's part of the report, the JSON summary and the upload.
import type { LinkEngine, RunHandle, RunResult, VectorRunHandle, VectorRunResult } from '../shared/link-engine/link-engine';
import type { RunRequest, VectorRunRequest } from '../shared/link-engine/run-request';
import type { ModelConfig } from '../shared/numeric';
import { describeSoak, parseSoakSpec, runSoak, runVectorSoak, scorePass, type PassScore, type SoakRecord, type SoakSpec, type SoakTimelinePoint, type VectorSoakRecord } from '../shared/soak';
import type { EngineClock } from '../shared/link-engine/link-engine';
import { UsageError } from './run-options';

export function parseSoakOption(text: string): SoakSpec {
  try {
    return parseSoakSpec(text);
  } catch (e) {
    throw new UsageError(`--soak: ${(e as Error).message}`);
  }
}

const n = (v: number) => v.toLocaleString('en-US');

export interface SoakRun {
  status: 'complete' | 'aborted' | 'failed';
  message?: string;
  /** The last whole pass: the session's samples. */
  result: RunResult;
  record: SoakRecord;
}

/** Every pass of the soak; a pass that fails ends it (the caller reports the failure). */
export async function soakPasses(a: {
  engine: LinkEngine;
  request: RunRequest;
  model: ModelConfig;
  spec: SoakSpec;
  clock: EngineClock;
  confirm: (code: number, cos: number, sin: number) => boolean;
  log: (line: string) => void;
  onPassStart?: (handle: RunHandle) => void;
  keepGoing?: () => boolean;
}): Promise<SoakRun> {
  const total = a.spec.kind === 'passes' ? `/${n(a.spec.passes)}` : '';
  const out = await runSoak({
    engine: a.engine,
    request: a.request,
    spec: a.spec,
    clock: a.clock,
    handlers: { confirm: a.confirm },
    onPassStart: (_pass, handle) => a.onPassStart?.(handle),
    keepGoing: a.keepGoing,
    score: (result) => scorePass(a.model, result),
    onPass: (p, acc) => a.log(passLine(p, total, acc.unstableCount, 'codes')),
  });
  // Stopped in its first pass: what that pass got is all there is (nothing is uploaded then).
  const result = out.last?.result ?? out.cut;
  if (!result) throw new Error(out.message ?? 'the soak ended before its first pass');
  return { status: out.status, message: out.message, result, record: out.acc.record(a.spec) };
}

/** The line a soak prints on stderr after each pass. */
function passLine(p: SoakTimelinePoint, total: string, unstable: number, what: 'codes' | 'vectors'): string {
  return (
    `soak pass ${n(p.pass)}${total}: ${n(p.answered)} answered, ${n(p.mismatches)} mismatches, ${n(p.linkErrors)} link errors` +
    `${p.retries ? ` (${n(p.retries)} re-asked)` : ''}, ${n(unstable)} unstable ${what} so far, ${(p.elapsedMs / 1000).toFixed(2)} s\n`
  );
}

export interface VectorSoakRun {
  status: 'complete' | 'aborted' | 'failed';
  message?: string;
  /** The last whole pass: the run's figures. */
  result: VectorRunResult;
  record: VectorSoakRecord;
}

/** soakPasses for a vectoring plan: every pass, a line per pass on stderr, the vectoring soak record. */
export async function vectorSoakPasses(a: {
  engine: LinkEngine;
  request: VectorRunRequest;
  spec: SoakSpec;
  clock: EngineClock;
  score: (result: VectorRunResult, checkFailures: number) => PassScore;
  confirm: (x: number, y: number, angle: number, magnitude: number) => boolean;
  log: (line: string) => void;
  onPassStart?: (handle: VectorRunHandle) => void;
  keepGoing?: () => boolean;
}): Promise<VectorSoakRun> {
  const total = a.spec.kind === 'passes' ? `/${n(a.spec.passes)}` : '';
  const out = await runVectorSoak({
    engine: a.engine,
    request: a.request,
    spec: a.spec,
    clock: a.clock,
    handlers: { confirm: a.confirm },
    onPassStart: (_pass, handle) => a.onPassStart?.(handle),
    keepGoing: a.keepGoing,
    score: a.score,
    onPass: (p, acc) => a.log(passLine(p, total, acc.unstableCount, 'vectors')),
  });
  const result = out.last?.result ?? out.cut;
  if (!result) throw new Error(out.message ?? 'the soak ended before its first pass');
  return { status: out.status, message: out.message, result, record: out.acc.record(a.spec) };
}

/** The soak's lines of the human report (a vectoring soak lists vectors, a rotating one codes). */
export function soakReportLines(r: SoakRecord | VectorSoakRecord): string[] {
  const s = r.summary;
  const vectoring = 'mode' in r;
  const what = vectoring ? 'vectors' : 'codes';
  const lines = [
    `soak ${describeSoak(r.spec)}: ${n(s.passes)} passes of ${n(s.codesPerPass)} ${what} in ${(s.elapsedMs / 1000).toFixed(1)} s; figures above are the last pass`,
    `  ${n(s.mismatches)} model mismatches in all (${n(s.passesWithMismatches)} passes had some), ${n(s.linkErrors)} link errors (${n(s.checkFailures)} bad CHECK, ${n(s.missing)} never answered), ${n(s.retries)} ${what} re-asked`,
    `  unstable ${what}: ${n(s.unstableCodes)}${r.unstable.listed < r.unstable.count ? ` (first ${n(r.unstable.listed)} listed)` : ''}`,
  ];
  const listed: string[] = vectoring
    ? r.unstable.vectors.map((u) => `    vector (${u.x}, ${u.y}) from pass ${u.firstPass}: ${u.answers.map((x) => `(${x.angle}, ${x.magnitude})×${x.count}`).join(' ')}${u.otherAnswers ? ` +${u.otherAnswers} other` : ''}`)
    : r.unstable.codes.map((u) => `    code ${u.code} from pass ${u.firstPass}: ${u.answers.map((x) => `(${x.cos}, ${x.sin})×${x.count}`).join(' ')}${u.otherAnswers ? ` +${u.otherAnswers} other` : ''}`);
  lines.push(...listed.slice(0, 20));
  if (listed.length > 20) lines.push(`    … ${n(listed.length - 20)} more in --json`);
  return lines;
}
