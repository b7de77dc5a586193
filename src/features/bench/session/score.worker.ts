/// <reference lib="webworker" />
// Scoring off the main thread: each batch is scored into one ScoreAccumulator, and its errors in
// LSB go back (transferred, not copied) for the charts. The summary is sent at most every
// SUMMARY_EVERY_MS, and at once when asked.
import { exactSinCosInto, ScoreAccumulator, type ModelConfig } from '../../../../shared/numeric';
import type { ScoreWorkerReply, ScoreWorkerRequest } from './score-protocol';

const SUMMARY_EVERY_MS = 150;
const scope = self as unknown as DedicatedWorkerGlobalScope;

let acc: ScoreAccumulator | null = null;
let config: ModelConfig | null = null;
let lastSummaryAt = 0;
let exactCos = new Float64Array(0);
let exactSin = new Float64Array(0);

const post = (m: ScoreWorkerReply, transfer: Transferable[] = []) => scope.postMessage(m, transfer);

function sendSummary() {
  if (!acc) return;
  lastSummaryAt = performance.now();
  post({ type: 'summary', summary: acc.summary() });
}

scope.onmessage = (e: MessageEvent<ScoreWorkerRequest>) => {
  const m = e.data;
  try {
    if (m.type === 'init') {
      acc = new ScoreAccumulator(m.config);
      config = acc.config;
      sendSummary();
      return;
    }
    if (m.type === 'summary') return sendSummary();
    if (!acc || !config) throw new Error('scoring was not started');
    acc.add(m.codes, m.cos, m.sin, m.firstIndex);
    const n = m.codes.length;
    if (exactCos.length < n) {
      exactCos = new Float64Array(n);
      exactSin = new Float64Array(n);
    }
    exactSinCosInto(config, m.codes, exactCos, exactSin);
    const scale = 2 ** config.outFrac;
    const errCos = new Float32Array(n);
    const errSin = new Float32Array(n);
    for (let k = 0; k < n; k++) {
      errCos[k] = m.cos[k] - exactCos[k] * scale;
      errSin[k] = m.sin[k] - exactSin[k] * scale;
    }
    post({ type: 'scored', codes: m.codes, cos: m.cos, sin: m.sin, errCos, errSin }, [m.codes.buffer, m.cos.buffer, m.sin.buffer, errCos.buffer, errSin.buffer]);
    if (performance.now() - lastSummaryAt >= SUMMARY_EVERY_MS) sendSummary();
  } catch (err) {
    post({ type: 'error', message: (err as Error).message });
  }
};
