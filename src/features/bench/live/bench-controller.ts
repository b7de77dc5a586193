// One bench connection and its runs, outside React: the page reads a small snapshot through
// useSyncExternalStore (status, INFO, progress, summary); live samples and traffic bypass React.
// The connection is recorded from open to close; a run keeps the HELLO → INFO preamble and its
// own traffic. The latest run is kept in IndexedDB until it is saved or discarded, so a reload
// does not lose it.
import type { LinkEngine, RunHandle } from '../../../../shared/link-engine/link-engine';
import type { ByteLink, LinkCloseReason } from '../../../../shared/link-engine/byte-link';
import type { RunProgress, LinkFigures } from '../../../../shared/link-engine/link-figures';
import { confirmOffModel } from '../../../../shared/link-engine/confirm-off-model';
import type { DeviceInfo } from '../../../../shared/link';
import type { Plan, ScoreSummary } from '../../../../shared/numeric';
import type { ConnectionRecording } from './connection-recording';
import { LiveSamples } from './live-samples';
import { newRun, takeResults } from './new-run';
import { recordedLink } from './recorded-link';
import { slotGate } from './frame-slot';
import { ScoreClient } from './score-client';
import type { ToneResult } from './score-protocol';
import { TrafficLog } from './traffic-log';
import { fromStoredRun, restoredProgress, toStoredRun, type RunOutcome, type RunRecord } from './unsaved-run';
import { unsavedRunStore, type UnsavedRunStore } from './unsaved-run-store';

export type { RunRecord } from './unsaved-run';

export interface BenchSnapshot {
  status: 'idle' | 'connecting' | 'connected' | 'closed';
  transportLabel: string | null;
  info: DeviceInfo | null;
  /** A plain-words problem with the connection, shown where it happened. */
  linkMessage: string | null;
  run: {
    state: 'running' | 'paused' | 'finished';
    progress: RunProgress | null;
    result: RunOutcome | null;
    summary: ScoreSummary | null;
    tone: ToneResult | null;
    figures: LinkFigures | null;
    error: string | null;
    plan: Plan;
    /** Set when the run was brought back from the browser's store. */
    restoredFrom: number | null;
  } | null;
  /** An unsaved run found in the browser's store, offered for restoring; when it was stored. */
  restorable: { storedAt: number; plan: Plan; answered: number } | null;
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
  /** The latest run's results (for saving); null before the first run. */
  record: RunRecord | null = null;
  private baud = 0;
  private snap: BenchSnapshot = { status: 'idle', transportLabel: null, info: null, linkMessage: null, run: null, restorable: null, storeMessage: null };
  private listeners = new Set<() => void>();
  private link: ByteLink | null = null;
  private engine: LinkEngine | null = null;
  private recording: ConnectionRecording | null = null;
  private handle: RunHandle | null = null;
  private scorer: ScoreClient | null = null;
  private lastProgressAt = 0;
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
  private setRun(patch: Partial<NonNullable<BenchSnapshot['run']>>) {
    // What waits for the next frame slot goes first, so a later change is never overwritten by it.
    const waiting = this.deferred;
    this.deferred = null;
    if (this.snap.run) this.set({ run: { ...this.snap.run, ...waiting, ...patch } });
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

  /** Open a link (made by the caller), say HELLO and keep INFO. Everything on it is recorded. */
  async connect(open: () => Promise<ByteLink>, label: string, baud: number) {
    this.baud = baud;
    this.set({ status: 'connecting', transportLabel: label, linkMessage: null, info: null });
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
    const { request, record } = newRun(plan, configInput, { transportLabel: this.snap.transportLabel, baud: this.baud, info: this.snap.info });
    const codes = record.codes;
    this.record = record;
    const scorer = this.startScoring(record);
    this.deferred = null;
    this.set({ restorable: null, run: { state: 'running', progress: null, result: null, summary: null, tone: null, figures: null, error: null, plan, restoredFrom: null } });
    const engine = this.engine;
    const rxAtStart = engine.figures.bytesReceived;
    this.recording?.markRun();
    const handle = engine.run(request, {
      // On a damaged line, an answer off the model is asked for again before it is taken.
      confirm: confirmOffModel(record.config),
      onResults: (b) => {
        takeResults(record, b);
        scorer.queue(codes, b.indexes, b.cos, b.sin);
      },
      onProgress: (p) => {
        const now = clock.now();
        if (now - this.lastProgressAt < PROGRESS_EVERY_MS) return;
        this.lastProgressAt = now;
        // The engine fills in line use at the end; meanwhile it is worked out here the same way.
        const rxBytes = engine.figures.bytesReceived - rxAtStart;
        const lineShare = p.elapsedMs > 0 ? (rxBytes * 1000) / p.elapsedMs / (this.baud / 10) : 0;
        this.setRunInSlot({ progress: p, figures: { ...engine.figures, naks: { ...engine.figures.naks }, lineShare, resultsPerS: p.ratePerS } });
      },
    });
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
      const raw = (await this.store.get()) as { storedAt?: number; plan?: Plan; answered?: Uint8Array } | undefined;
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
      const record = fromStoredRun(raw);
      const storedAt = (raw as { storedAt: number }).storedAt;
      this.record = record;
      const scorer = this.startScoring(record);
      this.deferred = null;
      this.set({
        restorable: null,
        storeMessage: null,
        run: { state: 'finished', progress: restoredProgress(record), result: record.outcome, summary: null, tone: null, figures: record.figures, error: null, plan: record.plan, restoredFrom: storedAt },
      });
      const indexes: number[] = [];
      for (let i = 0; i < record.codes.length; i++) if (record.answered[i]) indexes.push(i);
      scorer.queue(record.codes, indexes, indexes.map((i) => record.cos[i]), indexes.map((i) => record.sin[i]));
      scorer.finish();
    } catch (err) {
      this.set({ restorable: null, storeMessage: `The unsaved run could not be restored: ${(err as Error).message}` });
    }
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
    if (this.frame) cancelAnimationFrame(this.frame);
    void this.disconnect();
    this.scorer?.terminate();
    this.listeners.clear();
  }

  private startScoring(record: RunRecord): ScoreClient {
    this.scorer?.terminate();
    const samples = new LiveSamples(record.config);
    this.samples = samples;
    const scorer: ScoreClient = new ScoreClient(record.config, record.plan, samples, {
      summary: (summary, tone, final) => scorer === this.scorer && (final ? this.setRun({ summary, tone }) : this.setRunInSlot({ summary, tone })),
      error: (message) => scorer === this.scorer && this.setRun({ error: message }),
    });
    this.scorer = scorer;
    return scorer;
  }

  /** The run is over: score what is left, keep the capture and put the run away until saved. */
  private endRun(record: RunRecord, scorer: ScoreClient) {
    record.endedAt = new Date();
    record.archive = this.recording?.runArchive() ?? null;
    scorer.finish();
    this.set({ restorable: null });
    this.store.put(toStoredRun(record, Date.now())).then(
      () => this.snap.storeMessage && this.set({ storeMessage: null }),
      (err: Error) => this.set({ storeMessage: `This run is not kept in the browser, so a reload loses it: ${err.message}` }),
    );
  }
}
