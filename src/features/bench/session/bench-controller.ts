// One bench connection and its runs, outside React: the page reads a small snapshot through
// useSyncExternalStore (status, INFO, progress, summary); live samples and traffic bypass React.
import { LinkEngine, type RunHandle, type RunResult } from '../../../../shared/bench/link-engine';
import type { ByteLink } from '../../../../shared/bench/byte-link';
import type { RunProgress, LinkFigures } from '../../../../shared/bench/link-figures';
import type { RunRequest } from '../../../../shared/bench/run-request';
import type { DeviceInfo } from '../../../../shared/link';
import { angleCodeRange, parseModelConfig, planCodes, type ModelConfig, type Plan, type ScoreSummary } from '../../../../shared/numeric';
import { LiveSamples } from './live-samples';
import type { ScoreWorkerReply, ScoreWorkerRequest } from './score-protocol';
import { TrafficLog } from './traffic-log';

export interface BenchSnapshot {
  status: 'idle' | 'connecting' | 'connected' | 'closed';
  transportLabel: string | null;
  info: DeviceInfo | null;
  /** A plain-words problem with the connection, shown where it happened. */
  linkMessage: string | null;
  run: {
    state: 'running' | 'paused' | 'finished';
    progress: RunProgress | null;
    result: Pick<RunResult, 'status' | 'message' | 'elapsedMs'> & { missing: number } | null;
    summary: ScoreSummary | null;
    figures: LinkFigures | null;
    error: string | null;
    plan: Plan;
  } | null;
}

/** Every answered result of the latest run, in request order, kept for "Save session". */
export interface RunRecord {
  codes: Float64Array;
  cos: Int32Array;
  sin: Int32Array;
  /** 1 where the board answered that index. */
  answered: Uint8Array;
  plan: Plan;
  config: ModelConfig;
  startedAt: Date;
  endedAt: Date | null;
  transportLabel: string | null;
  baud: number;
  info: DeviceInfo | null;
}

const clock = {
  now: () => performance.now(),
  after: (ms: number, fn: () => void) => {
    const t = setTimeout(fn, ms);
    return () => clearTimeout(t);
  },
};

/** Results are handed to the worker in chunks at most this often, not one message per frame. */
const FLUSH_EVERY_MS = 16;

export class BenchController {
  readonly traffic = new TrafficLog();
  samples: LiveSamples | null = null;
  /** The latest run's results (for saving); null before the first run. */
  record: RunRecord | null = null;
  private baud = 0;
  private snap: BenchSnapshot = { status: 'idle', transportLabel: null, info: null, linkMessage: null, run: null };
  private listeners = new Set<() => void>();
  private link: ByteLink | null = null;
  private engine: LinkEngine | null = null;
  private handle: RunHandle | null = null;
  private worker: Worker | null = null;
  private pending: { first: number; codes: number[]; cos: number[]; sin: number[] } | null = null;
  private flushTimer: ReturnType<typeof setTimeout> | null = null;

  subscribe = (l: () => void) => {
    this.listeners.add(l);
    return () => this.listeners.delete(l);
  };
  getSnapshot = () => this.snap;

  private set(patch: Partial<BenchSnapshot>) {
    this.snap = { ...this.snap, ...patch };
    for (const l of this.listeners) l();
  }
  private setRun(patch: Partial<NonNullable<BenchSnapshot['run']>>) {
    if (this.snap.run) this.set({ run: { ...this.snap.run, ...patch } });
  }

  /** Open a link (made by the caller), say HELLO and keep INFO. */
  async connect(open: () => Promise<ByteLink>, label: string, baud: number) {
    this.baud = baud;
    this.set({ status: 'connecting', transportLabel: label, linkMessage: null, info: null, run: null });
    try {
      const link = await open();
      this.link = link;
      link.onWarning((m) => this.traffic.push({ type: 'note', text: m, atMs: clock.now() }));
      link.onClose((r) => {
        if (this.link !== link) return;
        this.link = null;
        this.engine = null;
        this.set({ status: 'closed', linkMessage: r.requested ? null : r.message });
      });
      this.engine = new LinkEngine({
        link,
        clock,
        baud,
        onTraffic: (direction, bytes, atMs) => this.traffic.push({ type: 'bytes', direction, bytes: bytes.slice(), atMs }),
        onFrame: (frame, atMs) => this.traffic.push({ type: 'frame', frame, atMs }),
        onSkip: (event, atMs) => this.traffic.push({ type: 'skip', event, atMs }),
      });
      const info = await this.engine.hello();
      this.set({ status: 'connected', info });
    } catch (err) {
      await this.link?.close().catch(() => undefined);
      this.link = null;
      this.engine = null;
      this.set({ status: 'idle', linkMessage: (err as Error).message });
    }
  }

  async disconnect() {
    await this.handle?.abort().catch(() => undefined);
    await this.link?.close();
  }

  /** Start a plan, scored against `configInput` (prefilled from INFO). Throws for a bad plan or profile. */
  startRun(plan: Plan, configInput: unknown) {
    if (!this.engine) throw new Error('Connect to a board first');
    const config: ModelConfig = parseModelConfig(configInput);
    const codes = planCodes(plan, config);
    const r = angleCodeRange(config);
    const req: RunRequest =
      plan.kind === 'exhaustive'
        ? { kind: 'sweep', start: r.min, step: 1, count: r.count }
        : plan.kind === 'sweep'
          ? { kind: 'sweep', start: plan.start, step: plan.step, count: plan.count }
          : { kind: 'codes', codes };
    this.samples = new LiveSamples(config);
    const record: RunRecord = {
      codes,
      cos: new Int32Array(codes.length),
      sin: new Int32Array(codes.length),
      answered: new Uint8Array(codes.length),
      plan,
      config,
      startedAt: new Date(),
      endedAt: null,
      transportLabel: this.snap.transportLabel,
      baud: this.baud,
      info: this.snap.info,
    };
    this.record = record;
    this.startWorker(config);
    this.set({ run: { state: 'running', progress: null, result: null, summary: null, figures: null, error: null, plan } });
    const handle = this.engine.run(req, {
      onResults: (b) => {
        for (let k = 0; k < b.indexes.length; k++) {
          const i = b.indexes[k];
          record.cos[i] = b.cos[k];
          record.sin[i] = b.sin[k];
          record.answered[i] = 1;
        }
        this.queueResults(codes, b.indexes, b.cos, b.sin);
      },
      onProgress: (p) => this.setRun({ progress: p, figures: { ...this.engine!.figures } }),
    });
    this.handle = handle;
    handle.done.then(
      (res) => {
        record.endedAt = new Date();
        this.flush();
        this.worker?.postMessage({ type: 'summary' } satisfies ScoreWorkerRequest);
        this.setRun({
          state: 'finished',
          progress: handle.progress(),
          figures: res.figures,
          result: { status: res.status, message: res.message, elapsedMs: res.elapsedMs, missing: res.missing.length },
        });
      },
      (err: Error) => {
        record.endedAt = new Date();
        this.setRun({ state: 'finished', error: err.message });
      },
    );
  }

  async pause() {
    await this.handle?.pause();
    this.setRun({ state: 'paused' });
  }
  async resume() {
    await this.handle?.resume();
    this.setRun({ state: 'running' });
  }
  async abort() {
    await this.handle?.abort();
  }

  dispose() {
    void this.disconnect();
    this.worker?.terminate();
    this.listeners.clear();
  }

  private startWorker(config: ModelConfig) {
    this.worker?.terminate();
    const w = new Worker(new URL('./score.worker.ts', import.meta.url), { type: 'module' });
    w.onmessage = (e: MessageEvent<ScoreWorkerReply>) => {
      if (w !== this.worker) return;
      const m = e.data;
      if (m.type === 'scored') this.samples?.add(m.codes, m.cos, m.sin, m.errCos, m.errSin);
      else if (m.type === 'summary') {
        this.samples?.setSummary(m.summary);
        this.setRun({ summary: m.summary });
      } else this.setRun({ error: `Scoring stopped: ${m.message}` });
    };
    w.onerror = (e) => this.setRun({ error: `The scoring worker failed: ${e.message}` });
    w.postMessage({ type: 'init', config } satisfies ScoreWorkerRequest);
    this.worker = w;
  }

  private queueResults(codes: Float64Array, indexes: Uint32Array, cos: Int32Array, sin: Int32Array) {
    this.pending ??= { first: indexes[0] ?? 0, codes: [], cos: [], sin: [] };
    for (let k = 0; k < indexes.length; k++) {
      this.pending.codes.push(codes[indexes[k]]);
      this.pending.cos.push(cos[k]);
      this.pending.sin.push(sin[k]);
    }
    this.flushTimer ??= setTimeout(() => this.flush(), FLUSH_EVERY_MS);
  }

  private flush() {
    if (this.flushTimer) clearTimeout(this.flushTimer);
    this.flushTimer = null;
    const p = this.pending;
    this.pending = null;
    if (!p || !this.worker) return;
    const msg: ScoreWorkerRequest = { type: 'batch', firstIndex: p.first, codes: Float64Array.from(p.codes), cos: Int32Array.from(p.cos), sin: Int32Array.from(p.sin) };
    this.worker.postMessage(msg, [msg.codes.buffer, msg.cos.buffer, msg.sin.buffer]);
  }
}
