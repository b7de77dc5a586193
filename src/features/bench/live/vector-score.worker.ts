/// <reference lib="webworker" />
// Scoring of a vectoring run off the main thread, as score.worker.ts does for rotation: one
// VectorScoreAccumulator, fed one contiguous run of request indexes at a time (so each mismatch
// keeps its index); the errors go back for the charts in coalesced replies.
import { VectorScoreAccumulator } from '../../../../shared/vectoring';
import { vectorErrorsInto } from '../../../components/charts/vector-plot-data';
import { contiguousRuns } from './index-runs';
import type { VectorScoreReply, VectorScoreRequest } from './vector-score-protocol';

const SUMMARY_EVERY_MS = 250;
const SCORED_EVERY_MS = 200;
const scope = self as unknown as DedicatedWorkerGlobalScope;

let acc: VectorScoreAccumulator | null = null;
let lastSummaryAt = 0;
let pending: { xs: Int32Array; ys: Int32Array; angleErr: Float32Array; magErr: Float32Array }[] = [];
let scoredTimer: ReturnType<typeof setTimeout> | null = null;

const post = (m: VectorScoreReply, transfer: Transferable[] = []) => scope.postMessage(m, transfer);

function concat<T extends Int32Array | Float32Array>(parts: T[], make: (n: number) => T): T {
  const out = make(parts.reduce((n, p) => n + p.length, 0));
  let at = 0;
  for (const p of parts) {
    out.set(p, at);
    at += p.length;
  }
  return out;
}

function sendScored() {
  if (scoredTimer) clearTimeout(scoredTimer);
  scoredTimer = null;
  if (!pending.length) return;
  const parts = pending;
  pending = [];
  const out = {
    xs: concat(parts.map((p) => p.xs), (n) => new Int32Array(n)),
    ys: concat(parts.map((p) => p.ys), (n) => new Int32Array(n)),
    angleErr: concat(parts.map((p) => p.angleErr), (n) => new Float32Array(n)),
    magErr: concat(parts.map((p) => p.magErr), (n) => new Float32Array(n)),
  };
  post({ type: 'scored', ...out }, [out.xs.buffer, out.ys.buffer, out.angleErr.buffer, out.magErr.buffer]);
}

function sendSummary(final: boolean) {
  if (!acc) return;
  sendScored();
  lastSummaryAt = performance.now();
  post({ type: 'summary', summary: acc.summary(), final });
}

scope.onmessage = (e: MessageEvent<VectorScoreRequest>) => {
  const m = e.data;
  try {
    if (m.type === 'init') {
      acc = new VectorScoreAccumulator(m.config);
      pending = [];
      sendSummary(false);
      return;
    }
    if (m.type === 'summary') return sendSummary(true);
    if (!acc) throw new Error('scoring was not started');
    for (const [from, to] of contiguousRuns(m.indexes)) {
      acc.add(m.xs.subarray(from, to), m.ys.subarray(from, to), m.angle.subarray(from, to), m.magnitude.subarray(from, to), m.indexes[from]);
    }
    const n = m.xs.length;
    const angleErr = new Float32Array(n);
    const magErr = new Float32Array(n);
    vectorErrorsInto(acc.config, m.xs, m.ys, m.angle, m.magnitude, { angle: new Float64Array(n), magnitude: new Float64Array(n) }, angleErr, magErr);
    pending.push({ xs: m.xs, ys: m.ys, angleErr, magErr });
    scoredTimer ??= setTimeout(sendScored, SCORED_EVERY_MS);
    if (performance.now() - lastSummaryAt >= SUMMARY_EVERY_MS) sendSummary(false);
  } catch (err) {
    post({ type: 'error', message: (err as Error).message });
  }
};
