// The device end of the bench link, as docs/protocol.md describes it, over any byte pipe. It keeps at
// most queueDepth result pairs pending, generates sweeps (and vectoring grids) itself as the line
// drains, and answers whatever it cannot take with the matching NAK. A rotating board speaks
// version 1 exactly; a vectoring board speaks version 2 without ONE, LIST and SWEEP (NAK 3).
import { DEFAULT_CRC8, type Crc8Name } from '../shared/link/crc8';
import { FrameDecoder, type DecodedFrame, type SkipEvent } from '../shared/link/decoder';
import { Kind, NakReason, ROTATION_REQUEST_KINDS, SweepStatus, VECTOR_REQUEST_KINDS } from '../shared/link/kinds';
import { decodePayload, encodeMessage, gridVector, sweepAngleCode, type DeviceInfo, type Message, type VectorGrid } from '../shared/link/payloads';
import { isAngleCodeInRange, isInputCodeInRange, maxResultPairs, maxVectorResultPairs, type WireProfile } from '../shared/link/wire-profile';
import type { SimCore } from './faulty-core';
import type { SimVectorCore } from './vector-core';

export interface BoardOptions {
  /** The core: a rotating one (SimCore) or a vectoring one (`{ vector: SimVectorCore }`). */
  core: SimCore | { vector: SimVectorCore };
  queueDepth: number;
  buildId: number;
  clockKHz: number;
  name: string;
  crc?: Crc8Name;
  /** Bytes for the line; returns how many bytes wait on it (the board fills up to a low mark). */
  send: (bytes: Uint8Array) => number;
  /** Bytes a sweep keeps queued on the line (default DEFAULT_LINE_LOW_MARK). */
  lineLowMark?: number;
}

type Job =
  | { kind: 'list'; tag: number; codes: number[]; next: number }
  | { kind: 'sweep'; tag: number; start: number; step: number; count: number; next: number }
  | { kind: 'vectors'; tag: number; xs: number[]; ys: number[]; next: number }
  | { kind: 'grid'; tag: number; grid: VectorGrid; count: number; next: number };

/**
 * How much a sweep keeps queued on the line by default. Little, so PAUSE and ABORT take effect
 * quickly; but a queue shorter than a few timer ticks of line time runs dry whenever the event
 * loop is late, and the line idles (board-session.ts sizes it to the baud rate).
 */
export const DEFAULT_LINE_LOW_MARK = 1024;

export class SimulatedBoard {
  private readonly decoder: FrameDecoder;
  private readonly profile: WireProfile;
  private readonly crc: Crc8Name;
  private readonly jobs: Job[] = [];
  private pendingPairs = 0;
  private paused = false;
  private readonly pairsPerFrame: number;
  private readonly rotating: SimCore | null;
  private readonly vectoring: SimVectorCore | null;

  constructor(private readonly o: BoardOptions) {
    this.rotating = 'vector' in o.core ? null : o.core;
    this.vectoring = 'vector' in o.core ? o.core.vector : null;
    if (this.vectoring) {
      const v = this.vectoring.config;
      // INFO's format fields carry the angle and magnitude outputs (docs/protocol.md section 8).
      this.profile = {
        angleFormat: v.angleFormat,
        angleBits: v.angleBits,
        outBits: v.magBits,
        vector: { inBits: v.inBits, angleFormat: v.angleFormat, angleBits: v.angleBits, magBits: v.magBits },
      };
      this.pairsPerFrame = maxVectorResultPairs(this.profile);
    } else {
      const c = this.rotating!.config;
      this.profile = { angleFormat: c.angleFormat, angleBits: c.angleBits, outBits: c.outBits };
      this.pairsPerFrame = maxResultPairs(this.profile);
    }
    this.crc = o.crc ?? DEFAULT_CRC8;
    this.decoder = new FrameDecoder({
      crc: this.crc,
      profile: this.profile,
      // Any other KIND is unknown to this board: NAK 3, as version 1 has it.
      accept: this.vectoring ? VECTOR_REQUEST_KINDS : ROTATION_REQUEST_KINDS,
      onFrame: (f) => this.onFrame(f),
      onSkip: (e) => this.onSkip(e),
    });
  }

  /** Bytes from the host, in any chunking. */
  receive(bytes: Uint8Array) {
    this.decoder.push(bytes);
    this.fill(0);
  }

  /** The line has room again: produce more results. `queued` is what still waits on it. */
  fill(queued: number) {
    let waiting = queued;
    while (!this.paused && waiting < (this.o.lineLowMark ?? DEFAULT_LINE_LOW_MARK) && this.jobs.length > 0) waiting = this.produce();
  }

  private reply(m: Message, tag: number): number {
    return this.o.send(encodeMessage(m, tag, this.profile, this.crc));
  }

  private nak(refused: number, reason: number, tag: number) {
    this.reply({ kind: Kind.Nak, refused, reason }, tag);
  }

  private onSkip(e: SkipEvent) {
    // Only frames whose header arrived can be answered; garbage is dropped silently.
    if (e.kind === undefined || e.tag === undefined) return;
    const reason = e.reason === 'bad-check' ? NakReason.BadCheck : e.reason === 'bad-length' ? NakReason.BadLength : e.reason === 'unknown-kind' ? NakReason.UnknownKind : 0;
    if (reason) this.nak(e.kind, reason, e.tag);
  }

  private info(): DeviceInfo {
    const board = { queueDepth: this.o.queueDepth, buildId: this.o.buildId, clockKHz: this.o.clockKHz, name: this.o.name };
    if (this.vectoring) {
      const v = this.vectoring.config;
      const angleFrac = v.angleFormat === 'rad' ? v.angleFrac : 0;
      return { version: 2, angleFormat: v.angleFormat, angleBits: v.angleBits, angleFrac, outBits: v.magBits, outFrac: v.magFrac, iterations: v.iterations, ...board };
    }
    const c = this.rotating!.config;
    const angleFrac = c.angleFormat === 'rad' ? c.angleFrac : 0;
    return { version: 1, angleFormat: c.angleFormat, angleBits: c.angleBits, angleFrac, outBits: c.outBits, outFrac: c.outFrac, iterations: c.iterations, ...board };
  }

  private onFrame(f: DecodedFrame) {
    const m = decodePayload(f.kind, f.payload, this.profile);
    switch (m.kind) {
      case Kind.Hello:
        this.reply({ kind: Kind.Info, info: this.info() }, f.tag);
        return;
      case Kind.Modes: {
        const v = this.vectoring!.config;
        const vectoring = { inBits: v.inBits, inFrac: v.inFrac, angleFormat: v.angleFormat, angleBits: v.angleBits, angleFrac: v.angleFormat === 'rad' ? v.angleFrac : 0, magBits: v.magBits, magFrac: v.magFrac, iterations: v.iterations };
        this.reply({ kind: Kind.ModeInfo, modes: { rotation: false, vectoring } }, f.tag);
        return;
      }
      case Kind.VecOne:
      case Kind.VecList: {
        const xs = m.kind === Kind.VecOne ? [m.x] : m.xs;
        const ys = m.kind === Kind.VecOne ? [m.y] : m.ys;
        if (this.paused) return this.nak(f.kind, NakReason.Paused, f.tag);
        const inRange = (v: number) => isInputCodeInRange(v, this.profile);
        if (!xs.every(inRange) || !ys.every(inRange)) return this.nak(f.kind, NakReason.VectorOutOfRange, f.tag);
        if (this.pendingPairs + xs.length > this.o.queueDepth) return this.nak(f.kind, NakReason.QueueFull, f.tag);
        this.pendingPairs += xs.length;
        this.jobs.push({ kind: 'vectors', tag: f.tag, xs, ys, next: 0 });
        return;
      }
      case Kind.VecGrid: {
        if (this.paused) return this.nak(f.kind, NakReason.Paused, f.tag);
        if (!isInputCodeInRange(m.x0, this.profile) || !isInputCodeInRange(m.y0, this.profile)) return this.nak(f.kind, NakReason.VectorOutOfRange, f.tag);
        const grid = { x0: m.x0, dx: m.dx, nx: m.nx, y0: m.y0, dy: m.dy, ny: m.ny };
        // An empty grid ends at once, as its counters would.
        if (m.nx * m.ny === 0) return void this.reply({ kind: Kind.SweepEnd, done: 0, status: SweepStatus.Complete }, f.tag);
        this.jobs.push({ kind: 'grid', tag: f.tag, grid, count: m.nx * m.ny, next: 0 });
        return;
      }
      case Kind.Pause:
        this.paused = true;
        this.reply({ kind: Kind.Ack, acked: f.kind }, f.tag);
        return;
      case Kind.Resume:
        this.paused = false;
        this.reply({ kind: Kind.Ack, acked: f.kind }, f.tag);
        return;
      case Kind.Abort:
        this.abort(f.tag);
        return;
      case Kind.One:
      case Kind.List: {
        const codes = m.kind === Kind.One ? [m.angleCode] : m.angleCodes;
        if (this.paused) return this.nak(f.kind, NakReason.Paused, f.tag);
        if (!codes.every((code) => isAngleCodeInRange(code, this.profile))) return this.nak(f.kind, NakReason.AngleOutOfRange, f.tag);
        if (this.pendingPairs + codes.length > this.o.queueDepth) return this.nak(f.kind, NakReason.QueueFull, f.tag);
        this.pendingPairs += codes.length;
        this.jobs.push({ kind: 'list', tag: f.tag, codes, next: 0 });
        return;
      }
      case Kind.Sweep:
        if (this.paused) return this.nak(f.kind, NakReason.Paused, f.tag);
        if (!isAngleCodeInRange(m.start, this.profile)) return this.nak(f.kind, NakReason.AngleOutOfRange, f.tag);
        this.jobs.push({ kind: 'sweep', tag: f.tag, start: m.start, step: m.step, count: m.count, next: 0 });
        return;
      default:
        // A reply KIND sent to the device: the decoder only accepts requests, so not reached.
        return;
    }
  }

  private abort(tag: number) {
    this.reply({ kind: Kind.Ack, acked: Kind.Abort }, tag);
    for (const job of this.jobs.splice(0)) {
      if (job.kind === 'sweep' || job.kind === 'grid') this.reply({ kind: Kind.SweepEnd, done: job.next, status: SweepStatus.Aborted }, job.tag);
    }
    this.pendingPairs = 0;
  }

  /** Emit the next RESULTS or VEC_RESULTS frame (and SWEEP_END when a sweep or grid is done); returns bytes waiting. */
  private produce(): number {
    const job = this.jobs[0];
    const total = job.kind === 'list' ? job.codes.length : job.kind === 'vectors' ? job.xs.length : job.count;
    const n = Math.min(this.pairsPerFrame, total - job.next);
    const a = new Int32Array(n);
    const b = new Int32Array(n);
    for (let j = 0; j < n; j++) {
      const i = job.next + j;
      if (job.kind === 'list' || job.kind === 'sweep') {
        const code = job.kind === 'list' ? job.codes[i] : sweepAngleCode(job.start, job.step, i, this.profile);
        const r = this.rotating!.evaluate(code);
        a[j] = r.cos;
        b[j] = r.sin;
      } else {
        const v = job.kind === 'vectors' ? { x: job.xs[i], y: job.ys[i] } : gridVector(job.grid, i, this.profile);
        const r = this.vectoring!.answer(v.x, v.y);
        a[j] = r.angle;
        b[j] = r.magnitude;
      }
    }
    const vector = job.kind === 'vectors' || job.kind === 'grid';
    // An empty sweep or grid is answered with its SWEEP_END alone, never an empty RESULTS frame.
    let waiting = n === 0 ? 0 : this.reply(vector ? { kind: Kind.VecResults, firstIndex: job.next, angle: a, magnitude: b } : { kind: Kind.Results, firstIndex: job.next, cos: a, sin: b }, job.tag);
    job.next += n;
    if (job.kind === 'list' || job.kind === 'vectors') this.pendingPairs -= n;
    if (job.next >= total) {
      this.jobs.shift();
      if (job.kind === 'sweep' || job.kind === 'grid') waiting = this.reply({ kind: Kind.SweepEnd, done: job.next, status: SweepStatus.Complete }, job.tag);
    }
    return waiting;
  }
}
