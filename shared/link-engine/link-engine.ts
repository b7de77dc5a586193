// The host side of the bench link: HELLO, then runs that keep the device's queue full without
// overflowing it, match every reply to its request by TAG and index, and ask again for whatever
// was refused, lost or corrupted, until each code is answered exactly once or listed as missing.
//
// Loss is detected two ways: a device answers requests in order, so a request overtaken by a
// later one's reply has lost what it still lacks; and a line silent for timeoutMs while requests
// are in flight has lost all of them. Both feed the same bounded retry path.
import type { ByteLink } from './byte-link';
import { emptyFigures, type LinkFigures, type RunProgress } from './link-figures';
import { expandRequest, expandVectorRequest, type RunRequest, type VectorRunRequest } from './run-request';
import { Kind, NakReason } from '../link/kinds';
import { encodeFrame } from '../link/frame';
import { FrameDecoder, type DecodedFrame, type SkipEvent } from '../link/decoder';
import { DEFAULT_CRC8, type Crc8Name } from '../link/crc8';
import type { WireProfile } from '../link/wire-profile';
import { decodePayload, profileFromInfo, vectorWireProfile, type DeviceInfo, type Message, type MessageOf, type ModeInfo } from '../link/payloads';
import { Run, type RunOutcome } from './link-run';
import { rotationSource, vectorSource } from './run-source';

/** Time and timers, injected: shared/ has no clock of its own. */
export interface EngineClock {
  now(): number;
  after(ms: number, fn: () => void): () => void;
}

export interface LinkEngineOptions {
  link: ByteLink;
  clock: EngineClock;
  crc?: Crc8Name;
  /** The line rate, for the share-of-line figure. Default 3,000,000. */
  baud?: number;
  /** Silence after which requests in flight count as lost. Default 300 ms. */
  timeoutMs?: number;
  /** Times one code is asked for again before it is listed missing. Default 8. */
  maxRetries?: number;
  /** Codes per SWEEP request; smaller segments cost less to repeat. Default 8192. */
  sweepSegment?: number;
  /** Every byte chunk in each direction, for the recorder and the traffic pane. */
  onTraffic?: (direction: 'tx' | 'rx', bytes: Uint8Array, atMs: number) => void;
  onFrame?: (frame: DecodedFrame, atMs: number) => void;
  onSkip?: (event: SkipEvent, atMs: number) => void;
}

/** One frame of results as it arrived: run indexes and their codes. */
export interface ResultBatch {
  indexes: Uint32Array;
  cos: Int32Array;
  sin: Int32Array;
}

export interface MissingCode {
  index: number;
  code: number;
  reason: 'no answer' | 'angle out of range' | 'vector out of range' | 'aborted';
}

export interface RunResult {
  status: 'complete' | 'aborted' | 'failed';
  message?: string;
  codes: Float64Array;
  cos: Int32Array;
  sin: Int32Array;
  /** 1 where the code was answered. */
  answered: Uint8Array;
  missing: MissingCode[];
  figures: LinkFigures;
  elapsedMs: number;
}

/** Controls of a run in progress, whatever its mode. */
export interface RunControls {
  pause(): Promise<void>;
  resume(): Promise<void>;
  abort(): Promise<void>;
  progress(): RunProgress;
}

export interface RunHandle extends RunControls {
  readonly done: Promise<RunResult>;
}

/** One frame of a vectoring run's results as it arrived: run indexes and their answers. */
export interface VectorResultBatch {
  indexes: Uint32Array;
  angle: Int32Array;
  magnitude: Int32Array;
}

/** A vector never answered, and why. */
export interface MissingVector {
  index: number;
  x: number;
  y: number;
  reason: MissingCode['reason'];
}

/** A finished vectoring run: every input in request order, its answer where `answered` is 1. */
export interface VectorRunResult {
  status: RunResult['status'];
  message?: string;
  xs: Int32Array;
  ys: Int32Array;
  angle: Int32Array;
  magnitude: Int32Array;
  answered: Uint8Array;
  missing: MissingVector[];
  figures: LinkFigures;
  elapsedMs: number;
}

export interface VectorRunHandle extends RunControls {
  readonly done: Promise<VectorRunResult>;
}

export interface VectorRunHandlers {
  onResults?: (batch: VectorResultBatch) => void;
  onProgress?: (p: RunProgress) => void;
  /** As RunHandlers.confirm: true for an answer worth confirming while the line shows damage. */
  confirm?: (x: number, y: number, angle: number, magnitude: number) => boolean;
}

export interface RunHandlers {
  onResults?: (batch: ResultBatch) => void;
  onProgress?: (p: RunProgress) => void;
  /**
   * True for an answer worth confirming before it is taken: the runner and the Bench page say so
   * for answers that differ from the reference model. While the line has shown damage in the
   * last CONFIRM_WINDOW_MS, such an answer is asked for again and taken once two agree.
   */
  confirm?: (code: number, cos: number, sin: number) => boolean;
}

export class LinkError extends Error {
  constructor(
    message: string,
    /** The NAK reason when the device refused the request. */
    readonly nakReason?: number,
  ) {
    super(message);
    this.name = 'LinkError';
  }
}

/** What a board that answers no MODES serves: rotation, as every version-1 board. */
const ROTATION_ONLY: ModeInfo = { rotation: true, vectoring: null };

/** The host end of one connection. */
export class LinkEngine {
  info: DeviceInfo | null = null;
  /** What the device serves, once modes() has asked. */
  modeInfo: ModeInfo | null = null;
  readonly figures: LinkFigures = emptyFigures();
  private readonly decoder: FrameDecoder;
  private readonly o: Required<Omit<LinkEngineOptions, 'onTraffic' | 'onFrame' | 'onSkip'>> & LinkEngineOptions;
  private nextTag = 0;
  private readonly tagFreeAt = new Float64Array(256);
  private readonly tagBusy = new Uint8Array(256);
  private replyListeners = new Set<(f: DecodedFrame) => void>();
  private lastRxAt = 0;
  private lastSkipAt = -Infinity;

  constructor(options: LinkEngineOptions) {
    // An option given as undefined takes its default, as one left out does.
    const given = Object.fromEntries(Object.entries(options).filter(([, v]) => v !== undefined)) as LinkEngineOptions;
    this.o = { crc: DEFAULT_CRC8, baud: 3_000_000, timeoutMs: 300, maxRetries: 8, sweepSegment: 8192, ...given };
    this.decoder = new FrameDecoder({
      crc: this.o.crc,
      accept: 'replies',
      onFrame: (f) => this.onFrame(f),
      onSkip: (e) => {
        this.figures.skippedBytes += e.bytes;
        this.lastSkipAt = this.o.clock.now();
        if (e.reason === 'bad-check') this.figures.checkFailures++;
        this.o.onSkip?.(e, this.o.clock.now());
      },
    });
    this.o.link.onBytes((bytes) => {
      const now = this.o.clock.now();
      this.lastRxAt = now;
      this.figures.bytesReceived += bytes.length;
      this.o.onTraffic?.('rx', bytes, now);
      this.decoder.push(bytes);
    });
  }

  /** The wire profile in force (from INFO after hello()). */
  get profile(): WireProfile {
    return this.decoder.profile;
  }

  /** Say HELLO and wait for INFO; the decoder then sizes fields from it. */
  async hello(): Promise<DeviceInfo> {
    const frame = await this.request(Kind.Hello, new Uint8Array(0), (f) => f.kind === Kind.Info);
    const { info } = this.decode(frame) as MessageOf<typeof Kind.Info>;
    this.info = info;
    this.decoder.setProfile(profileFromInfo(info));
    return info;
  }

  /**
   * Which modes the device serves (after hello()). A version-1 board only rotates and is not
   * asked; a later one answers MODES with MODE_INFO, whose vectoring formats then size the VEC_*
   * fields. A board that refuses MODES (NAK 3) only rotates, whatever its INFO version said.
   */
  async modes(): Promise<ModeInfo> {
    if (!this.info) throw new LinkError('Say HELLO before asking for the modes: the device INFO tells whether it has any but rotation');
    if (this.modeInfo) return this.modeInfo;
    if (this.info.version < 2) return (this.modeInfo = ROTATION_ONLY);
    let modes: ModeInfo;
    try {
      const frame = await this.request(Kind.Modes, new Uint8Array(0), (f) => f.kind === Kind.ModeInfo);
      modes = (this.decode(frame) as MessageOf<typeof Kind.ModeInfo>).modes;
    } catch (e) {
      if (e instanceof LinkError && e.nakReason === NakReason.UnknownKind) return (this.modeInfo = ROTATION_ONLY);
      throw e;
    }
    if (modes.vectoring) this.decoder.setProfile({ ...this.decoder.profile, vector: vectorWireProfile(modes.vectoring) });
    return (this.modeInfo = modes);
  }

  /** Start a run; the handle pauses, resumes or aborts it, and `done` settles with every code accounted for. */
  run(req: RunRequest, handlers: RunHandlers = {}): RunHandle {
    if (!this.info) throw new LinkError('Say HELLO before running: the device INFO sizes every field');
    const codes = expandRequest(req, this.profile);
    const { confirm, onResults, onProgress } = handlers;
    return new Run(
      this,
      rotationSource(codes, req.kind === 'sweep' ? req : null, this.profile),
      { onResults, onProgress, confirm: confirm ? (i, cos, sin) => confirm(codes[i], cos, sin) : undefined },
      (o: RunOutcome): RunResult => ({ ...o, codes }),
    );
  }

  /**
   * Start a vectoring run (after modes() found a vectoring core): VEC_LIST requests for a list,
   * VEC_GRID segments for a grid, with the same queue, retry and accounting rules as run().
   */
  runVectors(req: VectorRunRequest, handlers: VectorRunHandlers = {}): VectorRunHandle {
    if (!this.modeInfo?.vectoring) throw new LinkError('The device serves no vectoring core: say HELLO, ask modes(), and run vectors only on a board whose MODE_INFO has the vectoring bit');
    const { xs, ys } = expandVectorRequest(req, this.profile);
    const { confirm, onResults, onProgress } = handlers;
    return new Run(
      this,
      vectorSource(xs, ys, req.kind === 'grid' ? req : null, this.profile),
      {
        onProgress,
        onResults: onResults ? (b) => onResults({ indexes: b.indexes, angle: b.cos, magnitude: b.sin }) : undefined,
        confirm: confirm ? (i, angle, magnitude) => confirm(xs[i], ys[i], angle, magnitude) : undefined,
      },
      (o: RunOutcome): VectorRunResult => ({
        status: o.status,
        message: o.message,
        xs,
        ys,
        angle: o.cos,
        magnitude: o.sin,
        answered: o.answered,
        missing: o.missing.map((m) => ({ index: m.index, x: xs[m.index], y: ys[m.index], reason: m.reason })),
        figures: o.figures,
        elapsedMs: o.elapsedMs,
      }),
    );
  }

  // ---- used by Run ------------------------------------------------------------------------

  /** @internal */ get options() {
    return this.o;
  }
  /** @internal */ get lastReplyAt() {
    return this.lastRxAt;
  }
  /** @internal When the decoder last skipped bytes (damage, or noise before a frame). */
  get lastDamageAt() {
    return this.lastSkipAt;
  }

  /** @internal A free TAG, or -1 when all 256 are busy or cooling down after a loss. */
  takeTag(): number {
    const now = this.o.clock.now();
    for (let k = 0; k < 256; k++) {
      const t = (this.nextTag + k) & 0xff;
      if (!this.tagBusy[t] && this.tagFreeAt[t] <= now) {
        this.nextTag = (t + 1) & 0xff;
        this.tagBusy[t] = 1;
        return t;
      }
    }
    return -1;
  }

  /** @internal Release a TAG; after a loss it cools down so a late reply cannot be misread. */
  releaseTag(tag: number, lost: boolean) {
    this.tagBusy[tag] = 0;
    this.tagFreeAt[tag] = lost ? this.o.clock.now() + 4 * this.o.timeoutMs : 0;
  }

  /** @internal Decode a frame the decoder accepted (its LEN already fits the profile). */
  decode(f: DecodedFrame): Message {
    return decodePayload(f.kind, f.payload, this.profile);
  }

  /** @internal */ send(kind: number, tag: number, payload: Uint8Array) {
    const bytes = encodeFrame(kind, tag, payload, this.o.crc);
    this.figures.framesSent++;
    this.figures.bytesSent += bytes.length;
    this.o.onTraffic?.('tx', bytes, this.o.clock.now());
    return this.o.link.write(bytes);
  }

  /** @internal Listen to every reply frame (the run's dispatcher). */
  listen(l: (f: DecodedFrame) => void) {
    this.replyListeners.add(l);
    return () => this.replyListeners.delete(l);
  }

  /** @internal Send a control request and wait for its reply, repeating on silence. */
  async request(kind: number, payload: Uint8Array, isReply: (f: DecodedFrame) => boolean, attempts = 4): Promise<DecodedFrame> {
    for (let attempt = 0; attempt < attempts; attempt++) {
      const tag = this.takeTag();
      if (tag < 0) throw new LinkError('No free TAG for a control request');
      let cancel = () => {};
      let unlisten = () => false as boolean;
      const reply = new Promise<DecodedFrame | null>((resolve) => {
        unlisten = this.listen((f) => {
          if (f.tag !== tag) return;
          if (f.kind === Kind.Nak && (this.decode(f) as MessageOf<typeof Kind.Nak>).refused === kind) resolve(f);
          else if (isReply(f)) resolve(f);
        });
        cancel = this.o.clock.after(Math.max(this.o.timeoutMs, 250), () => resolve(null));
      });
      await this.send(kind, tag, payload);
      const f = await reply;
      cancel();
      unlisten();
      this.releaseTag(tag, f === null);
      if (f && f.kind === Kind.Nak) {
        const nak = this.decode(f) as MessageOf<typeof Kind.Nak>;
        if (nak.reason === NakReason.BadCheck) continue;
        throw new LinkError(`The device refused ${kindLabel(kind)} (NAK reason ${nak.reason})`, nak.reason);
      }
      if (f) return f;
    }
    throw new LinkError(`No reply to ${kindLabel(kind)} after ${attempts} tries: is the device connected and at the right baud rate?`);
  }

  private onFrame(f: DecodedFrame) {
    this.figures.framesReceived++;
    this.o.onFrame?.(f, this.o.clock.now());
    if (f.kind === Kind.Nak) {
      const { reason } = this.decode(f) as MessageOf<typeof Kind.Nak>;
      this.figures.naks[reason] = (this.figures.naks[reason] ?? 0) + 1;
    }
    for (const l of this.replyListeners) l(f);
  }
}

const kindLabel = (kind: number) => ({ [Kind.Hello]: 'HELLO', [Kind.Modes]: 'MODES', [Kind.Pause]: 'PAUSE', [Kind.Resume]: 'RESUME', [Kind.Abort]: 'ABORT' })[kind] ?? `KIND 0x${kind.toString(16)}`;

