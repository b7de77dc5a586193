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
  private pending: { indexes: number[]; codes: number[]; cos: number[]; sin: number[] } | null = null;
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
    const p = (this.pending ??= { indexes: [], codes: [], cos: [], sin: [] });
    for (let k = 0; k < indexes.length; k++) {
      p.indexes.push(indexes[k]);
      p.codes.push(codes[indexes[k]]);
      p.cos.push(cos[k]);
      p.sin.push(sin[k]);
    }
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

  private flush() {
    if (this.timer) clearTimeout(this.timer);
    this.timer = null;
    const p = this.pending;
    this.pending = null;
    if (!p) return;
    const msg = { type: 'batch', indexes: Uint32Array.from(p.indexes), codes: Float64Array.from(p.codes), cos: Int32Array.from(p.cos), sin: Int32Array.from(p.sin) } satisfies ScoreWorkerRequest;
    this.worker.postMessage(msg, [msg.indexes.buffer, msg.codes.buffer, msg.cos.buffer, msg.sin.buffer]);
  }
}
