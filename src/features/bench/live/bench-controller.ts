// One bench connection and its runs, outside React: the page reads a small snapshot through
// useSyncExternalStore (status, INFO, progress, summary); live samples and traffic bypass React.
// The connection is recorded from open to close; a run keeps the HELLO → INFO preamble and its
// own traffic. The latest run is kept in IndexedDB until it is saved or discarded, so a reload
// does not lose it.
import type { LinkEngine, RunControls } from '../../../../shared/link-engine/link-engine';
import type { ByteLink, LinkCloseReason } from '../../../../shared/link-engine/byte-link';
import type { RunProgress, LinkFigures } from '../../../../shared/link-engine/link-figures';
import { confirmOffModel } from '../../../../shared/link-engine/confirm-off-model';
import type { DeviceInfo, ModeInfo } from '../../../../shared/link';
import type { Plan, ScoreSummary } from '../../../../shared/numeric';
import { createVectorModel, type VectorConfig, type VectorPlan, type VectorScoreSummary } from '../../../../shared/vectoring';
import type { ConnectionRecording } from './connection-recording';
import { LiveSamples } from './live-samples';
import { newRun, takeResults } from './new-run';
import { recordedLink } from './recorded-link';
import { ScoreClient } from './score-client';
import type { ToneResult } from './score-protocol';
import { TrafficLog } from './traffic-log';
import { fromStoredRun, restoredProgress, toStoredRun, type RunOutcome, type RunRecord } from './unsaved-run';
import { unsavedRunStore, type UnsavedRunStore } from './unsaved-run-store';
import { VectorLiveSamples } from './vector-live-samples';
import { fromStoredVectorRun, isStoredVectorRun, newVectorRun, takeVectorResults, toStoredVectorRun, type VectorRunRecord } from './vector-run';
import { VectorScoreClient } from './vector-score-client';

export type { RunRecord } from './unsaved-run';
export type { VectorRunRecord } from './vector-run';

/** What a run computes: cos/sin of angles, or atan2 and magnitude of (x, y) pairs. */
export type RunMode = 'rotation' | 'vectoring';

export interface BenchSnapshot {
  status: 'idle' | 'connecting' | 'connected' | 'closed';
  transportLabel: string | null;
  info: DeviceInfo | null;
  /** What the board serves (MODE_INFO; a version-1 board only rotates). */
  modes: ModeInfo | null;
  /** A plain-words problem with the connection, shown where it happened. */
  linkMessage: string | null;
  run: {
    state: 'running' | 'paused' | 'finished';
    mode: RunMode;
    progress: RunProgress | null;
    result: RunOutcome | null;
    summary: ScoreSummary | null;
    /** A vectoring run's statistics (summary stays null). */
    vectorSummary: VectorScoreSummary | null;
    tone: ToneResult | null;
    figures: LinkFigures | null;
    error: string | null;
    plan: Plan | VectorPlan;
    /** Set when the run was brought back from the browser's store. */
    restoredFrom: number | null;
  } | null;
  /** An unsaved run found in the browser's store, offered for restoring; when it was stored. */
  restorable: { storedAt: number; plan: Plan | VectorPlan; answered: number } | null;
  /** A problem keeping or reading the unsaved run. */
  storeMessage: string | null;
}

const clock = {
  now: () => performance.now(),
  after: (ms: number, fn: () => void) => {
    const t = setTimeout(fn, ms);
    return () => clearTimeout(t);
  },
};

/** Progress reaches React at most this often; the engine reports every 100 ms. */
const PROGRESS_EVERY_MS = 250;

export class BenchController {
  readonly traffic = new TrafficLog();
  samples: LiveSamples | null = null;
  /** A vectoring run's chart data; null while the latest run rotates. */
  vectorSamples: VectorLiveSamples | null = null;
  /** The latest run's results (for saving); null before the first run. */
  record: RunRecord | VectorRunRecord | null = null;
  private baud = 0;
  private snap: BenchSnapshot = { status: 'idle', transportLabel: null, info: null, modes: null, linkMessage: null, run: null, restorable: null, storeMessage: null };
  private listeners = new Set<() => void>();
  private link: ByteLink | null = null;
  private engine: LinkEngine | null = null;
  private recording: ConnectionRecording | null = null;
  private handle: RunControls | null = null;
  private scorer: ScoreClient | VectorScoreClient | null = null;
  private lastProgressAt = 0;

  constructor(private readonly store: UnsavedRunStore = unsavedRunStore) {}

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

  /** Open a link (made by the caller), say HELLO and keep INFO. Everything on it is recorded. */
  async connect(open: () => Promise<ByteLink>, label: string, baud: number) {
    this.baud = baud;
    this.set({ status: 'connecting', transportLabel: label, linkMessage: null, info: null, modes: null });
    try {
      const onClose = (link: ByteLink, r: LinkCloseReason) => {
        if (this.link !== link) return;
        this.link = null;
        this.engine = null;
        this.set({ status: 'closed', linkMessage: r.requested ? null : r.message });
      };
      const { link, engine, recording } = recordedLink(await open(), { label, baud, clock, traffic: this.traffic, onClose });
      [this.link, this.engine, this.recording] = [link, engine, recording];
      const info = await engine.hello();
      recording.info(info, clock.now());
      // A version-2 board says whether it also vectors; a version-1 board is not asked.
      const modes = await engine.modes();
      this.set({ status: 'connected', info, modes });
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
    const { request, record } = newRun(plan, configInput, { transportLabel: this.snap.transportLabel, baud: this.baud, info: this.snap.info });
    const codes = record.codes;
    this.record = record;
    const scorer = this.startScoring(record);
    this.set({ restorable: null, run: { state: 'running', mode: 'rotation', progress: null, result: null, summary: null, vectorSummary: null, tone: null, figures: null, error: null, plan, restoredFrom: null } });
    const engine = this.engine;
    this.recording?.markRun();
    const handle = engine.run(request, {
      // On a damaged line, an answer off the model is asked for again before it is taken.
      confirm: confirmOffModel(record.config),
      onResults: (b) => {
        takeResults(record, b);
        scorer.queue(codes, b.indexes, b.cos, b.sin);
      },
      onProgress: this.progressReporter(engine),
    });
    this.settle(handle, record, scorer);
  }

  /** Start a vectoring plan on a board whose MODE_INFO has a vectoring core, scored against `config`. Throws for a bad plan. */
  startVectorRun(plan: VectorPlan, config: VectorConfig) {
    if (!this.engine) throw new Error('Connect to a board first');
    if (!this.snap.modes?.vectoring) throw new Error('The connected board serves no vectoring core');
    const { request, record } = newVectorRun(plan, config, this.engine.profile, { transportLabel: this.snap.transportLabel, baud: this.baud, info: this.snap.info, modes: this.snap.modes });
    this.record = record;
    const scorer = this.startVectorScoring(record);
    this.set({ restorable: null, run: { state: 'running', mode: 'vectoring', progress: null, result: null, summary: null, vectorSummary: null, tone: null, figures: null, error: null, plan, restoredFrom: null } });
    const engine = this.engine;
    this.recording?.markRun();
    const model = createVectorModel(config);
    const handle = engine.runVectors(request, {
      // On a damaged line, an answer off the model is asked for again before it is taken.
      confirm: (x, y, angle, magnitude) => {
        const m = model.answer(x, y);
        return m.angle !== angle || m.magnitude !== magnitude;
      },
      onResults: (b) => {
        takeVectorResults(record, b);
        scorer.queue(record.xs, record.ys, b.indexes, b.angle, b.magnitude);
      },
      onProgress: this.progressReporter(engine),
    });
    this.settle(handle, record, scorer);
  }

  /** Progress for the snapshot, at most every PROGRESS_EVERY_MS. */
  private progressReporter(engine: LinkEngine) {
    const rxAtStart = engine.figures.bytesReceived;
    return (p: RunProgress) => {
      const now = clock.now();
      if (now - this.lastProgressAt < PROGRESS_EVERY_MS) return;
      this.lastProgressAt = now;
      // The engine fills in line use at the end; meanwhile it is worked out here the same way.
      const rxBytes = engine.figures.bytesReceived - rxAtStart;
      const lineShare = p.elapsedMs > 0 ? (rxBytes * 1000) / p.elapsedMs / (this.baud / 10) : 0;
      this.setRun({ progress: p, figures: { ...engine.figures, naks: { ...engine.figures.naks }, lineShare, resultsPerS: p.ratePerS } });
    };
  }

  /** The run's end, whatever its mode: outcome into the record, scoring finished, the run put away. */
  private settle(handle: RunControls & { done: Promise<{ status: RunOutcome['status']; message?: string; elapsedMs: number; missing: unknown[]; figures: LinkFigures }> }, record: RunRecord | VectorRunRecord, scorer: ScoreClient | VectorScoreClient) {
    this.handle = handle;
    handle.done.then(
      (res) => {
        record.outcome = { status: res.status, message: res.message, elapsedMs: res.elapsedMs, missing: res.missing.length };
        record.figures = res.figures;
        this.endRun(record, scorer);
        this.setRun({ state: 'finished', progress: handle.progress(), figures: res.figures, result: record.outcome });
      },
      (err: Error) => {
        this.endRun(record, scorer);
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

  /** Look for an unsaved run from an earlier visit and offer it. */
  async findUnsaved() {
    try {
      const raw = (await this.store.get()) as { storedAt?: number; plan?: Plan | VectorPlan; answered?: Uint8Array } | undefined;
      if (!raw || this.snap.run) return;
      let answered = 0;
      for (const a of raw.answered ?? []) answered += a ? 1 : 0;
      this.set({ restorable: { storedAt: raw.storedAt ?? 0, plan: raw.plan as Plan, answered } });
    } catch (err) {
      this.set({ storeMessage: `An unsaved run could not be read back: ${(err as Error).message}` });
    }
  }

  /** Bring the offered run back: scored again in the worker, so charts and figures return. */
  async restoreUnsaved() {
    try {
      const raw = await this.store.get();
      const storedAt = (raw as { storedAt: number }).storedAt;
      if (isStoredVectorRun(raw)) return this.restoreVectorRun(fromStoredVectorRun(raw), storedAt);
      const record = fromStoredRun(raw);
      this.record = record;
      const scorer = this.startScoring(record);
      this.set({
        restorable: null,
        storeMessage: null,
        run: { state: 'finished', mode: 'rotation', progress: restoredProgress(record), result: record.outcome, summary: null, vectorSummary: null, tone: null, figures: record.figures, error: null, plan: record.plan, restoredFrom: storedAt },
      });
      const indexes: number[] = [];
      for (let i = 0; i < record.codes.length; i++) if (record.answered[i]) indexes.push(i);
      scorer.queue(record.codes, indexes, indexes.map((i) => record.cos[i]), indexes.map((i) => record.sin[i]));
      scorer.finish();
    } catch (err) {
      this.set({ restorable: null, storeMessage: `The unsaved run could not be restored: ${(err as Error).message}` });
    }
  }

  private restoreVectorRun(record: VectorRunRecord, storedAt: number) {
    this.record = record;
    const scorer = this.startVectorScoring(record);
    const indexes: number[] = [];
    for (let i = 0; i < record.answered.length; i++) if (record.answered[i]) indexes.push(i);
    const answered = indexes.length;
    const missing = record.outcome?.missing ?? record.xs.length - answered;
    const progress: RunProgress = { done: answered + missing, answered, missing, total: record.xs.length, ratePerS: record.figures?.resultsPerS ?? 0, etaS: null, elapsedMs: record.outcome?.elapsedMs ?? 0, paused: false };
    this.set({
      restorable: null,
      storeMessage: null,
      run: { state: 'finished', mode: 'vectoring', progress, result: record.outcome, summary: null, vectorSummary: null, tone: null, figures: record.figures, error: null, plan: record.plan, restoredFrom: storedAt },
    });
    scorer.queue(record.xs, record.ys, indexes, indexes.map((i) => record.angle[i]), indexes.map((i) => record.magnitude[i]));
    scorer.finish();
  }

  /** Forget the stored run: it was saved to the server, or the operator discarded it. */
  async forgetUnsaved() {
    this.set({ restorable: null });
    try {
      await this.store.clear();
    } catch (err) {
      this.set({ storeMessage: `The unsaved run could not be removed from this browser: ${(err as Error).message}` });
    }
  }

  dispose() {
    void this.disconnect();
    this.scorer?.terminate();
    this.listeners.clear();
  }

  private startScoring(record: RunRecord): ScoreClient {
    this.scorer?.terminate();
    const samples = new LiveSamples(record.config);
    this.samples = samples;
    this.vectorSamples = null;
    const scorer: ScoreClient = new ScoreClient(record.config, record.plan, samples, {
      summary: (summary, tone) => scorer === this.scorer && this.setRun({ summary, tone }),
      error: (message) => scorer === this.scorer && this.setRun({ error: message }),
    });
    this.scorer = scorer;
    return scorer;
  }

  private startVectorScoring(record: VectorRunRecord): VectorScoreClient {
    this.scorer?.terminate();
    const samples = new VectorLiveSamples(record.config);
    this.vectorSamples = samples;
    this.samples = null;
    const scorer: VectorScoreClient = new VectorScoreClient(record.config, samples, {
      summary: (vectorSummary) => scorer === this.scorer && this.setRun({ vectorSummary }),
      error: (message) => scorer === this.scorer && this.setRun({ error: message }),
    });
    this.scorer = scorer;
    return scorer;
  }

  /** The run is over: score what is left, keep the capture and put the run away until saved. */
  private endRun(record: RunRecord | VectorRunRecord, scorer: ScoreClient | VectorScoreClient) {
    record.endedAt = new Date();
    record.archive = this.recording?.runArchive() ?? null;
    scorer.finish();
    this.set({ restorable: null });
    this.store.put('mode' in record ? toStoredVectorRun(record, Date.now()) : toStoredRun(record, Date.now())).then(
      () => this.snap.storeMessage && this.set({ storeMessage: null }),
      (err: Error) => this.set({ storeMessage: `This run is not kept in the browser, so a reload loses it: ${err.message}` }),
    );
  }
}
