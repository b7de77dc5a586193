// What `run` prints: a table for people, or one JSON summary for machines.
import type { LinkFigures } from '../shared/link-engine/link-figures';
import type { DeviceInfo } from '../shared/link';
import type { Explanation } from '../shared/explain';
import { explanationText } from './run-explain';
import type { ModelConfig, Plan } from '../shared/numeric';
import type { RunScore } from './run-score';
import type { LimitCheck, Verdict } from './run-verdict';
import type { Conditions, SoakRecord } from '../shared/soak';
import { conditionsLine } from './conditions';
import { soakReportLines } from './soak';

export interface RunReport {
  core: string;
  build: string | null;
  board: string | null;
  device: string;
  baud: number;
  info: DeviceInfo;
  plan: Plan;
  planText: string;
  model: ModelConfig;
  modelFrom: 'server' | 'config' | 'info';
  limitsFrom: 'server' | 'option' | 'none';
  status: 'complete' | 'aborted' | 'failed';
  elapsedMs: number;
  score: RunScore;
  figures: LinkFigures;
  verdict: Verdict;
  archive: string | null;
  /** Operating conditions, and those of them the board reported itself. */
  conditions: Conditions;
  conditionsFromBoard: Conditions | null;
  /** The soak's books when --soak was given; the other figures are then its last pass. */
  soak: SoakRecord | null;
  /** With --explain: what reproduces the answers. */
  explanation?: Explanation;
}

/** The machine-readable summary: everything but the histogram bins and the kept mismatches' bulk. */
export function jsonSummary(r: RunReport, upload: { sessionId: number | null } | null): Record<string, unknown> {
  const s = r.score.summary;
  return {
    core: r.core,
    build: r.build,
    board: r.board,
    device: { path: r.device, baud: r.baud, info: r.info },
    plan: r.plan.kind === 'list' ? { kind: 'list', count: r.plan.codes.length } : r.plan,
    model: r.model,
    modelFrom: r.modelFrom,
    status: r.status,
    elapsedMs: Math.round(r.elapsedMs),
    results: { total: r.score.total, answered: r.score.answered, missing: r.score.missing },
    stats: {
      cos: s.cos,
      sin: s.sin,
      overall: s.overall,
      magnitude: s.magnitude,
      phase: s.phase,
      mismatches: s.mismatches,
      coverage: s.coverage,
      histogram: { below: s.histogram.below, above: s.histogram.above },
      tone: r.score.tone,
      linkErrors: r.score.linkErrors,
    },
    link: r.figures,
    verdict: { passed: r.verdict.passed, limitsFrom: r.limitsFrom, checks: r.verdict.checks },
    archive: r.archive,
    conditions: r.conditions,
    soak: r.soak,
    ...(r.explanation ? { explanation: r.explanation } : {}),
    upload,
  };
}

const num = (v: number, digits = 3) => (Number.isInteger(v) ? String(v) : v.toFixed(digits));

/** One limit's line of the verdict table. */
export function checkLine(c: LimitCheck): string {
  const op = c.key.startsWith('min') ? '≥' : '≤';
  const value = c.value === null ? 'not measured' : num(c.value);
  const outcome = { pass: 'PASS', fail: 'FAIL', skip: 'skip' }[c.outcome];
  return `  ${outcome}  ${c.key.padEnd(20)} ${value.padStart(12)}  ${op} ${num(c.limit)}${c.note ? `  (${c.note})` : ''}`;
}

/** The human table. */
export function humanReport(r: RunReport): string {
  const s = r.score.summary;
  const out: string[] = [];
  const i = r.info;
  out.push(`core ${r.core}${r.build ? `, build ${r.build}` : ''}${r.board ? `, board ${r.board}` : ''}`);
  out.push(`device ${r.device} at ${r.baud.toLocaleString('en-US')} baud: "${i.name}", build id 0x${i.buildId.toString(16).padStart(8, '0')}, ${i.angleFormat} ${i.angleBits}-bit angles, ${i.outBits}-bit outputs (${i.outFrac} fraction bits), ${i.iterations} iterations`);
  out.push(`plan ${r.planText}: ${r.score.total.toLocaleString('en-US')} codes, ${r.score.answered.toLocaleString('en-US')} answered, ${r.score.missing} missing, ${(r.elapsedMs / 1000).toFixed(2)} s (${r.status})`);
  const cond = conditionsLine(r.conditions, r.conditionsFromBoard);
  if (cond) out.push(cond);
  out.push(`model from ${r.modelFrom === 'info' ? 'the device INFO (other keys at their defaults)' : r.modelFrom === 'server' ? 'the server' : '--config'}`);
  out.push('');
  out.push('              max |err| LSB   RMS LSB   mean LSB   at code');
  for (const [name, c] of [['cos', s.cos], ['sin', s.sin], ['both', s.overall]] as const) {
    out.push(`  ${name.padEnd(10)} ${num(c.maxAbsLsb, 4).padStart(15)} ${num(c.rmsLsb, 4).padStart(9)} ${num(c.meanLsb, 4).padStart(10)}   ${c.maxAbsCode ?? '—'}`);
  }
  out.push(`  magnitude max |err| ${s.magnitude.maxAbs.toExponential(3)}, phase max |err| ${s.phase.maxAbsRad.toExponential(3)} rad`);
  out.push(`  model mismatches ${s.mismatches.count} (largest ${s.mismatches.maxAbsDiffLsb} LSB), coverage ${(s.coverage.share * 100).toFixed(2)}% of codes`);
  if (r.score.tone) {
    const t = r.score.tone;
    out.push(`  tone: SFDR cos ${t.cos.sfdrDbc.toFixed(2)} dBc, sin ${t.sin.sfdrDbc.toFixed(2)} dBc; SINAD cos ${t.cos.sinadDb.toFixed(2)} dB, ENOB ${t.cos.enob.toFixed(2)} bits`);
  }
  const f = r.figures;
  const naks = Object.entries(f.naks).filter(([, n]) => n > 0).map(([k, n]) => `${n}×${k}`).join(' ') || 'none';
  out.push(`  link: ${f.framesSent} frames out, ${f.framesReceived} in, ${f.checkFailures} bad CHECK, ${f.skippedBytes} bytes skipped, ${f.retries} retries, NAKs ${naks}, ${f.confirmations} answers confirmed${f.unconfirmed ? ` (${f.unconfirmed} unconfirmed)` : ''}, ${Math.round(f.resultsPerS).toLocaleString('en-US')} results/s, ${(f.lineShare * 100).toFixed(1)}% of the line`);
  if (r.soak) out.push('', ...soakReportLines(r.soak));
  out.push('');
  if (r.verdict.checks.length === 0) out.push('verdict: PASS (no limits given: nothing to fail)');
  else {
    out.push(`limits from ${r.limitsFrom === 'server' ? 'the server' : '--limits'}:`);
    for (const c of r.verdict.checks) out.push(checkLine(c));
    out.push(`verdict: ${r.verdict.passed ? 'PASS' : 'FAIL'}`);
  }
  if (r.archive) out.push(`archive written to ${r.archive}`);
  return out.join('\n') + '\n' + (r.explanation ? explanationText(r.explanation) : '');
}
