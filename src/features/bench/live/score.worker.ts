/// <reference lib="webworker" />
// Scoring off the main thread. Each batch is scored into one ScoreAccumulator, one contiguous
// run of request indexes at a time, so every mismatch keeps its exact index. Errors in LSB go back
// for the charts in coalesced replies (at most every SCORED_EVERY_MS), so a fast run costs the
// page a few messages a second, not one per batch. A tone plan's samples are kept by index for
// its spectral figures.
import { exactSinCosInto, ScoreAccumulator, toneFigures, type ModelConfig } from '../../../../shared/numeric';
import type { ScoreWorkerReply, ScoreWorkerRequest, ToneResult } from './score-protocol';
import { contiguousRuns } from './index-runs';
import { ScoredBuffer } from './scored-buffer';

const SUMMARY_EVERY_MS = 250;
const SCORED_EVERY_MS = 200;
const scope = self as unknown as DedicatedWorkerGlobalScope;

let acc: ScoreAccumulator | null = null;
let config: ModelConfig | null = null;
let tone: { cycles: number; cos: Float64Array; sin: Float64Array; seen: Uint8Array; count: number } | null = null;
let lastSummaryAt = 0;
let exactCos = new Float64Array(0);
let exactSin = new Float64Array(0);
const scored = new ScoredBuffer();
let scoredTimer: ReturnType<typeof setTimeout> | null = null;

const post = (m: ScoreWorkerReply, transfer: Transferable[] = []) => scope.postMessage(m, transfer);

function sendScored() {
  if (scoredTimer) clearTimeout(scoredTimer);
  scoredTimer = null;
  const out = scored.take();
  if (out) post({ type: 'scored', ...out }, [out.codes.buffer, out.cos.buffer, out.sin.buffer, out.errCos.buffer, out.errSin.buffer]);
}

let toneDone: ToneResult | null = null;

/** The FFT runs once, when every sample is in; before that the reason is enough. */
function toneResult(): ToneResult | null {
  if (!tone) return null;
  const n = tone.seen.length;
  if (tone.count < n) return { unavailable: `needs all ${n.toLocaleString('en-US')} samples (${tone.count.toLocaleString('en-US')} so far)` };
  try {
    toneDone ??= { cos: toneFigures(tone.cos, tone.cycles), sin: toneFigures(tone.sin, tone.cycles) };
  } catch (err) {
    toneDone = { unavailable: (err as Error).message };
  }
  return toneDone;
}

/** A summary owed after the last batch, so figures catch up when answers stop (a pause, a burst). */
let summaryTimer: ReturnType<typeof setTimeout> | null = null;

function sendSummary(final: boolean) {
  if (summaryTimer) clearTimeout(summaryTimer);
  summaryTimer = null;
  if (!acc) return;
  sendScored();
  lastSummaryAt = performance.now();
  post({ type: 'summary', summary: acc.summary(), tone: toneResult(), final });
}

scope.onmessage = (e: MessageEvent<ScoreWorkerRequest>) => {
  const m = e.data;
  try {
    if (m.type === 'init') {
      acc = new ScoreAccumulator(m.config);
      config = acc.config;
      const n = m.tone?.samples ?? 0;
      toneDone = null;
      tone = m.tone ? { cycles: m.tone.cycles, cos: new Float64Array(n), sin: new Float64Array(n), seen: new Uint8Array(n), count: 0 } : null;
      sendSummary(false);
      return;
    }
    if (m.type === 'summary') return sendSummary(true);
    if (!acc || !config) throw new Error('scoring was not started');
    for (const [from, to] of contiguousRuns(m.indexes)) acc.add(m.codes.subarray(from, to), m.cos.subarray(from, to), m.sin.subarray(from, to), m.indexes[from]);
    const n = m.codes.length;
    if (exactCos.length < n) {
      exactCos = new Float64Array(n);
      exactSin = new Float64Array(n);
    }
    exactSinCosInto(config, m.codes, exactCos, exactSin);
    const scale = 2 ** config.outFrac;
    scored.append(m.codes, m.cos, m.sin, (k) => m.cos[k] - exactCos[k] * scale, (k) => m.sin[k] - exactSin[k] * scale);
    if (tone) {
      for (let k = 0; k < n; k++) {
        const i = m.indexes[k];
        if (i >= tone.seen.length || tone.seen[i]) continue;
        tone.seen[i] = 1;
        tone.count++;
        tone.cos[i] = m.cos[k];
        tone.sin[i] = m.sin[k];
      }
    }
    scoredTimer ??= setTimeout(sendScored, SCORED_EVERY_MS);
    const since = performance.now() - lastSummaryAt;
    if (since >= SUMMARY_EVERY_MS) sendSummary(false);
    else summaryTimer ??= setTimeout(() => sendSummary(false), SUMMARY_EVERY_MS - since);
  } catch (err) {
    post({ type: 'error', message: (err as Error).message });
  }
};
