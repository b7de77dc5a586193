// The page's side of the scoring worker: results are queued with their request indexes and handed
// over in chunks at most every FLUSH_EVERY_MS; replies feed the live samples and the summary.
import type { ModelConfig, Plan, ScoreSummary } from '../../../../shared/numeric';
import type { LiveSamples } from './live-samples';
import type { ScoreWorkerReply, ScoreWorkerRequest, ToneResult } from './score-protocol';

const FLUSH_EVERY_MS = 50;

export interface ScoreListener {
  summary(summary: ScoreSummary, tone: ToneResult | null, final: boolean): void;
  error(message: string): void;
}

export class ScoreClient {
  private readonly worker: Worker;
  /** Results waiting for the next flush, in typed arrays grown by doubling: no array of numbers per result. */
  private pending = ScoreClient.buffers(4096);
  private queued = 0;
  private timer: ReturnType<typeof setTimeout> | null = null;

  constructor(config: ModelConfig, plan: Plan, private readonly samples: LiveSamples, private readonly on: ScoreListener) {
    const w = new Worker(new URL('./score.worker.ts', import.meta.url), { type: 'module' });
    w.onmessage = (e: MessageEvent<ScoreWorkerReply>) => {
      const m = e.data;
      if (m.type === 'scored') this.samples.add(m.codes, m.cos, m.sin, m.errCos, m.errSin);
      else if (m.type === 'summary') {
        this.samples.setSummary(m.summary);
        this.on.summary(m.summary, m.tone, m.final);
      } else this.on.error(`Scoring stopped: ${m.message}`);
    };
    w.onerror = (e) => this.on.error(`The scoring worker failed: ${e.message}`);
    const tone = plan.kind === 'tone' ? { cycles: plan.cycles, samples: plan.samples } : null;
    w.postMessage({ type: 'init', config, tone } satisfies ScoreWorkerRequest);
    this.worker = w;
  }

  /** Results of request indexes `indexes` (their codes looked up in `codes`). */
  queue(codes: Float64Array, indexes: ArrayLike<number>, cos: ArrayLike<number>, sin: ArrayLike<number>) {
    const n = indexes.length;
    this.reserve(this.queued + n);
    const p = this.pending;
    for (let k = 0, at = this.queued; k < n; k++, at++) {
      const i = indexes[k];
      p.indexes[at] = i;
      p.codes[at] = codes[i];
      p.cos[at] = cos[k];
      p.sin[at] = sin[k];
    }
    this.queued += n;
    this.timer ??= setTimeout(() => this.flush(), FLUSH_EVERY_MS);
  }

  /** Hand over what is queued, then ask for the final summary. */
  finish() {
    this.flush();
    this.worker.postMessage({ type: 'summary' } satisfies ScoreWorkerRequest);
  }

  terminate() {
    if (this.timer) clearTimeout(this.timer);
    this.worker.terminate();
  }

  private static buffers(capacity: number) {
    return { indexes: new Uint32Array(capacity), codes: new Float64Array(capacity), cos: new Int32Array(capacity), sin: new Int32Array(capacity) };
  }

  private reserve(capacity: number) {
    if (capacity <= this.pending.codes.length) return;
    const bigger = ScoreClient.buffers(Math.max(capacity, this.pending.codes.length * 2));
    const n = this.queued;
    bigger.indexes.set(this.pending.indexes.subarray(0, n));
    bigger.codes.set(this.pending.codes.subarray(0, n));
    bigger.cos.set(this.pending.cos.subarray(0, n));
    bigger.sin.set(this.pending.sin.subarray(0, n));
    this.pending = bigger;
  }

  private flush() {
    if (this.timer) clearTimeout(this.timer);
    this.timer = null;
    const n = this.queued;
    if (n === 0) return;
    this.queued = 0;
    // Exact-length copies, handed over (not cloned); the queue keeps its own arrays for the next results.
    const p = this.pending;
    const msg = { type: 'batch', indexes: p.indexes.slice(0, n), codes: p.codes.slice(0, n), cos: p.cos.slice(0, n), sin: p.sin.slice(0, n) } satisfies ScoreWorkerRequest;
    this.worker.postMessage(msg, [msg.indexes.buffer, msg.codes.buffer, msg.cos.buffer, msg.sin.buffer]);
  }
}
