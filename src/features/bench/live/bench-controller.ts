// One bench connection and its runs, outside React: the page reads a small snapshot through
// useSyncExternalStore (status, INFO, progress, summary); live samples and traffic bypass React.
// The connection is recorded from open to close; a run keeps the HELLO → INFO preamble and its
// own traffic. The latest run is kept in IndexedDB until it is saved or discarded, so a reload
// does not lose it. A soak repeats the plan through the shared soak loop (shared/soak/soak-run.ts):
// the charts and figures follow the pass under way, the soak's books reach the page at most once a
// frame, and what is kept for saving is the last whole pass with the books.
import type { LinkEngine, ResultBatch, RunControls, RunHandle, VectorRunHandle } from '../../../../shared/link-engine/link-engine';
import type { RunRequest } from '../../../../shared/link-engine/run-request';
import type { ByteLink, LinkCloseReason } from '../../../../shared/link-engine/byte-link';
import type { RunProgress, LinkFigures } from '../../../../shared/link-engine/link-figures';
import { confirmOffModel } from '../../../../shared/link-engine/confirm-off-model';
import type { Crc8Name, DeviceInfo, ModeInfo } from '../../../../shared/link';
import type { Plan, ScoreSummary } from '../../../../shared/numeric';
import { runSoak, scorePass, type SoakSpec } from '../../../../shared/soak';
import { createVectorModel, type VectorConfig, type VectorPlan, type VectorScoreSummary } from '../../../../shared/vectoring';
import type { ConnectionRecording } from './connection-recording';
import type { RecorderMark } from '../../../../shared/link/recorder';
import { LiveSamples } from './live-samples';
import { newRun } from './new-run';
import { clearAnswers, ROTATION_COLUMNS, takeAnswers, VECTOR_COLUMNS } from './run-record';
import { recordedLink } from './recorded-link';
import { slotGate } from './frame-slot';
import { ScoreClient } from './score-client';
import { SoakLive, type SoakView } from './soak-live';
import type { ToneResult } from './score-protocol';
import { TrafficLog } from './traffic-log';
import { fromStoredRun, restoredProgress, toStoredRun, type RunOutcome, type RunRecord } from './unsaved-run';
import { unsavedRunStore, type UnsavedRunStore } from './unsaved-run-store';
import { VectorLiveSamples } from './vector-live-samples';
import { fromStoredVectorRun, isStoredVectorRun, newVectorRun, toStoredVectorRun, type VectorRunRecord } from './vector-run';
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
    /** A soak's pass under way and its books so far; null for a single run. */
    soak: SoakView | null;
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
  /** The soak under way or last run (its timeline chart reads it every frame); null for a single run. */
  soak: SoakLive | null = null;
  /** Asked for by the operator: the next pass of a soak starts paused, and none starts after an abort. */
  private pausedByOperator = false;
  private soakStopped = false;
  private soakFrame = 0;
  private soakRunning = false;
  private pendingRun: Partial<NonNullable<BenchSnapshot['run']>> | null = null;
  private deferred: Partial<NonNullable<BenchSnapshot['run']>> | null = null;
  private frame = 0;
  private readonly slotStart = slotGate();

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
  /** While a soak runs, changes to the run reach the page together, at most once a frame. */
  private setRun(patch: Partial<NonNullable<BenchSnapshot['run']>>) {
    // What waits for the next frame slot goes first, so a later change is never overwritten by it.
    const waiting = this.deferred;
    this.deferred = null;
    if (!this.snap.run) return;
    if (!this.soakRunning) return this.set({ run: { ...this.snap.run, ...waiting, ...patch } });
    this.pendingRun = { ...this.pendingRun, ...waiting, ...patch };
    this.soakFrame ||= requestAnimationFrame(this.flushRun);
  }

  /**
   * Progress and interim figures reach React in the first frame of a frame slot, where the charts
   * and traffic change too: one render, layout and paint for all of them, a few times a second.
   * Without animation frames (outside a browser) they go at once.
   */
  private setRunInSlot(patch: Partial<NonNullable<BenchSnapshot['run']>>) {
    if (typeof requestAnimationFrame === 'undefined') return this.setRun(patch);
    this.deferred = { ...this.deferred, ...patch };
    if (this.frame) return;
    const due = this.slotStart;
    const wait = (now: number) => {
      // Called every frame while something waits, so the gate sees each slot's first frame.
      if (!due(now) || !this.deferred) {
        this.frame = this.deferred ? requestAnimationFrame(wait) : 0;
        return;
      }
      this.frame = 0;
      this.setRun({});
    };
    // The gate must see the frame before a slot's first one, so the first check only primes it.
    due(performance.now());
    this.frame = requestAnimationFrame(wait);
  }
  private flushRun = () => {
    this.soakFrame = 0;
    const patch = { ...this.pendingRun, ...(this.soak ? { soak: this.soak.view() } : {}) };
    this.pendingRun = null;
    if (this.snap.run) this.set({ run: { ...this.snap.run, ...patch } });
  };

  /** Open a link (made by the caller), say HELLO and keep INFO. Everything on it is recorded. `crc`: the board's frame check, when not the protocol's default. */
  async connect(open: () => Promise<ByteLink>, label: string, baud: number, crc?: Crc8Name) {
    this.baud = baud;
    this.set({ status: 'connecting', transportLabel: label, linkMessage: null, info: null, modes: null });
    try {
      const onClose = (link: ByteLink, r: LinkCloseReason) => {
        if (this.link !== link) return;
        this.link = null;
        this.engine = null;
        this.set({ status: 'closed', linkMessage: r.requested ? null : r.message });
      };
      const { link, engine, recording } = recordedLink(await open(), { label, baud, crc, clock, traffic: this.traffic, onClose });
      [this.link, this.engine, this.recording] = [link, engine, recording];
      const info = await engine.hello();
      recording.info(info, clock.now());
      // A version-2 board says whether it also vectors; a version-1 board is not asked.
      const modes = await engine.modes();
      recording.modes(modes, clock.now());
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

  /** Start a plan, scored against `configInput` (prefilled from INFO); a soak repeats it. Throws for a bad plan or profile. */
  startRun(plan: Plan, configInput: unknown, soak: SoakSpec | null = null) {
    if (!this.engine) throw new Error('Connect to a board first');
    const { request, record } = newRun(plan, configInput, { transportLabel: this.snap.transportLabel, baud: this.baud, info: this.snap.info });
    this.record = record;
    this.pausedByOperator = false;
    this.soakStopped = false;
    this.soak = soak ? new SoakLive(soak) : null;
    const scorer = this.startScoring(record);
    this.deferred = null;
    this.set({ restorable: null, run: { state: 'running', mode: 'rotation', progress: null, result: null, summary: null, vectorSummary: null, tone: null, figures: null, error: null, plan, restoredFrom: null, soak: this.soak?.view() ?? null } });
    const engine = this.engine;
    this.recording?.markRun();
    if (soak) return this.runSoak(engine, request, record, soak);
    const handle = engine.run(request, this.passHandlers(engine, record));
    this.handle = handle;
    this.settle(handle, record, scorer);
  }

  /** What every run or pass does with its answers and progress: into the record, the scorer and the page. */
  private passHandlers(engine: LinkEngine, record: RunRecord) {
    const codes = record.codes;
    return {
      // On a damaged line, an answer off the model is asked for again before it is taken.
      confirm: confirmOffModel(record.config),
      onResults: (b: ResultBatch) => {
        takeAnswers(record, ROTATION_COLUMNS, b);
        if (this.scorer instanceof ScoreClient) this.scorer.queue(codes, b.indexes, b.cos, b.sin);
      },
      ...this.progressReporter(engine),
    };
  }

  /** Progress for the snapshot, at most every PROGRESS_EVERY_MS, in the page's frame slots. */
  private progressReporter(engine: LinkEngine) {
    let rxAtStart = engine.figures.bytesReceived;
    return {
      onProgress: (p: RunProgress) => {
        const now = clock.now();
        if (now - this.lastProgressAt < PROGRESS_EVERY_MS) return;
        this.lastProgressAt = now;
        // The engine fills in line use at the end; meanwhile it is worked out here the same way.
        const rxBytes = engine.figures.bytesReceived - rxAtStart;
        const lineShare = p.elapsedMs > 0 ? (rxBytes * 1000) / p.elapsedMs / (this.baud / 10) : 0;
        this.setRunInSlot({ progress: p, figures: { ...engine.figures, naks: { ...engine.figures.naks }, lineShare, resultsPerS: p.ratePerS } });
      },
      /** A soak's next pass: line use is measured over it alone. */
      restart: () => void (rxAtStart = engine.figures.bytesReceived),
    };
  }

  /** Start a vectoring plan on a board whose MODE_INFO has a vectoring core, scored against `config`. Throws for a bad plan. */
  startVectorRun(plan: VectorPlan, config: VectorConfig) {
    if (!this.engine) throw new Error('Connect to a board first');
    if (!this.snap.modes?.vectoring) throw new Error('The connected board serves no vectoring core');
    const { request, record } = newVectorRun(plan, config, this.engine.profile, { transportLabel: this.snap.transportLabel, baud: this.baud, info: this.snap.info, modes: this.snap.modes });
    this.record = record;
    this.soak = null;
    const scorer = this.startVectorScoring(record);
    this.deferred = null;
    this.set({ restorable: null, run: { state: 'running', mode: 'vectoring', progress: null, result: null, summary: null, vectorSummary: null, tone: null, figures: null, error: null, plan, restoredFrom: null, soak: null } });
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
        takeAnswers(record, VECTOR_COLUMNS, b);
        scorer.queue(record.xs, record.ys, b.indexes, b.angle, b.magnitude);
      },
      onProgress: this.progressReporter(engine).onProgress,
    });
    this.handle = handle;
    this.settle(handle, record, scorer);
  }

  /**
   * The plan pass after pass. Each pass starts with an empty record and fresh scoring, so the
   * charts and figures are the pass under way; at the end the record is the last whole pass (the
   * session's samples, as the runner saves them) and carries the books.
   */
  private runSoak(engine: LinkEngine, request: RunRequest, record: RunRecord, spec: SoakSpec) {
    const soak = this.soak!;
    const { restart, ...handlers } = this.passHandlers(engine, record);
    let passStart: RecorderMark | null = null;
    this.soakRunning = true;
    runSoak({
      engine,
      request,
      spec,
      clock,
      handlers,
      keepGoing: () => !this.soakStopped,
      onPassStart: (pass, handle) => {
        this.handle = handle;
        passStart = this.recording?.mark() ?? null;
        // A pause asked for as the last pass ended holds the next one from its start.
        if (this.pausedByOperator) void handle.pause();
        soak.passStarted(pass);
        if (pass > 1) {
          clearAnswers(record, ROTATION_COLUMNS);
          this.startScoring(record);
          restart();
          this.setRun({ summary: null, tone: null, progress: null });
        }
        this.setRun({});
      },
      score: (result) => scorePass(record.config, result),
      onPass: (_point, acc) => {
        // The capture keeps the preamble and the latest whole pass on (what the samples are).
        if (passStart) this.recording?.markRun(passStart);
        soak.passBooked(acc);
        this.setRun({});
      },
    }).then(
      (out) => {
        const last = out.last?.result;
        // Cut short after whole passes: the session is the last whole one, scored again for the page.
        const cutAfterWhole = last !== undefined && out.cut !== null;
        if (last) {
          record.cos.set(last.cos);
          record.sin.set(last.sin);
          record.answered.set(last.answered);
        }
        const ended = last ?? out.cut!;
        const soakMs = out.acc.passes > 0 ? out.acc.summary().elapsedMs : ended.elapsedMs;
        record.outcome = { status: out.status, message: out.message, elapsedMs: soakMs, missing: ended.missing.length };
        record.figures = ended.figures;
        record.soak = out.acc.passes > 0 ? out.acc.record(spec) : null;
        const scorer = cutAfterWhole ? this.rescore(record) : (this.scorer as ScoreClient);
        this.endRun(record, scorer);
        const progress = cutAfterWhole ? restoredProgress(record) : this.handle!.progress();
        this.endSoak();
        this.setRun({ state: 'finished', progress, figures: ended.figures, result: record.outcome });
      },
      (err: Error) => {
        this.endRun(record, this.scorer as ScoreClient);
        this.endSoak();
        this.setRun({ state: 'finished', error: err.message });
      },
    );
  }

  /** The soak is over: what was waiting for the next frame goes now, and changes go straight through again. */
  private endSoak() {
    this.soakRunning = false;
    if (this.soakFrame) cancelAnimationFrame(this.soakFrame);
    this.flushRun();
  }

  async pause() {
    this.pausedByOperator = true;
    const h = this.handle;
    await h?.pause();
    // A soak's pass that ended meanwhile: the next one was already held at its start.
    this.setRun({ state: 'paused' });
  }
  async resume() {
    this.pausedByOperator = false;
    await this.handle?.resume();
    this.setRun({ state: 'running' });
  }
  async abort() {
    this.soakStopped = true;
    this.pausedByOperator = false;
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
      this.soak = null;
      this.deferred = null;
      this.set({
        restorable: null,
        storeMessage: null,
        run: { state: 'finished', mode: 'rotation', progress: restoredProgress(record), result: record.outcome, summary: null, vectorSummary: null, tone: null, figures: record.figures, error: null, plan: record.plan, restoredFrom: storedAt, soak: null },
      });
      this.rescore(record).finish();
    } catch (err) {
      this.set({ restorable: null, storeMessage: `The unsaved run could not be restored: ${(err as Error).message}` });
    }
  }

  private restoreVectorRun(record: VectorRunRecord, storedAt: number) {
    this.record = record;
    this.soak = null;
    this.deferred = null;
    const scorer = this.startVectorScoring(record);
    const indexes: number[] = [];
    for (let i = 0; i < record.answered.length; i++) if (record.answered[i]) indexes.push(i);
    const answered = indexes.length;
    const missing = record.outcome?.missing ?? record.xs.length - answered;
    const progress: RunProgress = { done: answered + missing, answered, missing, total: record.xs.length, ratePerS: record.figures?.resultsPerS ?? 0, etaS: null, elapsedMs: record.outcome?.elapsedMs ?? 0, paused: false };
    this.set({
      restorable: null,
      storeMessage: null,
      run: { state: 'finished', mode: 'vectoring', progress, result: record.outcome, summary: null, vectorSummary: null, tone: null, figures: record.figures, error: null, plan: record.plan, restoredFrom: storedAt, soak: null },
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
    this.soakStopped = true;
    if (this.soakFrame) cancelAnimationFrame(this.soakFrame);
    if (this.frame) cancelAnimationFrame(this.frame);
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
      summary: (summary, tone, final) => scorer === this.scorer && (final ? this.setRun({ summary, tone }) : this.setRunInSlot({ summary, tone })),
      error: (message) => scorer === this.scorer && this.setRun({ error: message }),
    });
    this.scorer = scorer;
    return scorer;
  }

  /** Fresh scoring of every answer the record holds (queued, not yet finished). */
  private rescore(record: RunRecord): ScoreClient {
    const scorer = this.startScoring(record);
    const indexes: number[] = [];
    for (let i = 0; i < record.codes.length; i++) if (record.answered[i]) indexes.push(i);
    scorer.queue(record.codes, indexes, indexes.map((i) => record.cos[i]), indexes.map((i) => record.sin[i]));
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

  /** A single run's end, either way: its outcome into the record, then endRun and the finished state. */
  private settle(handle: RunHandle | VectorRunHandle, record: RunRecord | VectorRunRecord, scorer: ScoreClient | VectorScoreClient) {
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
