// The page's side of the vectoring scoring worker: answers are queued with their request indexes
// and handed over in chunks at most every FLUSH_EVERY_MS; replies feed the live samples and the summary.
import type { VectorConfig, VectorScoreSummary } from '../../../../shared/vectoring';
import type { VectorLiveSamples } from './vector-live-samples';
import type { VectorScoreReply, VectorScoreRequest } from './vector-score-protocol';

const FLUSH_EVERY_MS = 50;

export interface VectorScoreListener {
  summary(summary: VectorScoreSummary, final: boolean): void;
  error(message: string): void;
}

export class VectorScoreClient {
  private readonly worker: Worker;
  private pending: { indexes: number[]; xs: number[]; ys: number[]; angle: number[]; magnitude: number[] } | null = null;
  private timer: ReturnType<typeof setTimeout> | null = null;

  constructor(config: VectorConfig, private readonly samples: VectorLiveSamples, private readonly on: VectorScoreListener) {
    const w = new Worker(new URL('./vector-score.worker.ts', import.meta.url), { type: 'module' });
    w.onmessage = (e: MessageEvent<VectorScoreReply>) => {
      const m = e.data;
      if (m.type === 'scored') this.samples.plot.add(m.xs, m.ys, m.angleErr, m.magErr);
      else if (m.type === 'summary') {
        this.samples.setSummary(m.summary);
        this.on.summary(m.summary, m.final);
      } else this.on.error(`Scoring stopped: ${m.message}`);
    };
    w.onerror = (e) => this.on.error(`The scoring worker failed: ${e.message}`);
    w.postMessage({ type: 'init', config } satisfies VectorScoreRequest);
    this.worker = w;
  }

  /** Answers of request indexes `indexes` (their inputs looked up in `xs`, `ys`). */
  queue(xs: Int32Array, ys: Int32Array, indexes: ArrayLike<number>, angle: ArrayLike<number>, magnitude: ArrayLike<number>) {
    const p = (this.pending ??= { indexes: [], xs: [], ys: [], angle: [], magnitude: [] });
    for (let k = 0; k < indexes.length; k++) {
      const i = indexes[k];
      p.indexes.push(i);
      p.xs.push(xs[i]);
      p.ys.push(ys[i]);
      p.angle.push(angle[k]);
      p.magnitude.push(magnitude[k]);
    }
    this.timer ??= setTimeout(() => this.flush(), FLUSH_EVERY_MS);
  }

  /** Hand over what is queued, then ask for the final summary. */
  finish() {
    this.flush();
    this.worker.postMessage({ type: 'summary' } satisfies VectorScoreRequest);
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
    const msg = {
      type: 'batch',
      indexes: Uint32Array.from(p.indexes),
      xs: Int32Array.from(p.xs),
      ys: Int32Array.from(p.ys),
      angle: Int32Array.from(p.angle),
      magnitude: Int32Array.from(p.magnitude),
    } satisfies VectorScoreRequest;
    this.worker.postMessage(msg, [msg.indexes.buffer, msg.xs.buffer, msg.ys.buffer, msg.angle.buffer, msg.magnitude.buffer]);
  }
}
