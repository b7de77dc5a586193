// The device end of the bench link, as docs/protocol.md describes it, over any byte pipe. It keeps at
// most queueDepth result pairs pending, generates sweeps itself as the line drains, and answers
// whatever it cannot take with the matching NAK.
import { DEFAULT_CRC8, type Crc8Name } from '../shared/link/crc8';
import { FrameDecoder, type DecodedFrame, type SkipEvent } from '../shared/link/decoder';
import { Kind, NakReason, SweepStatus } from '../shared/link/kinds';
import { decodePayload, encodeMessage, sweepAngleCode, type Message } from '../shared/link/payloads';
import { isAngleCodeInRange, maxResultPairs, type WireProfile } from '../shared/link/wire-profile';
import type { SimCore } from './faulty-core';

export interface BoardOptions {
  core: SimCore;
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
  | { kind: 'sweep'; tag: number; start: number; step: number; count: number; next: number };

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

  constructor(private readonly o: BoardOptions) {
    const c = o.core.config;
    this.profile = { angleFormat: c.angleFormat, angleBits: c.angleBits, outBits: c.outBits };
    this.crc = o.crc ?? DEFAULT_CRC8;
    this.pairsPerFrame = maxResultPairs(this.profile);
    this.decoder = new FrameDecoder({
      crc: this.crc,
      profile: this.profile,
      accept: 'requests',
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

  private onFrame(f: DecodedFrame) {
    const m = decodePayload(f.kind, f.payload, this.profile);
    const c = this.o.core.config;
    switch (m.kind) {
      case Kind.Hello:
        this.reply(
          {
            kind: Kind.Info,
            info: {
              version: 1,
              angleFormat: c.angleFormat,
              angleBits: c.angleBits,
              angleFrac: c.angleFormat === 'rad' ? c.angleFrac : 0,
              outBits: c.outBits,
              outFrac: c.outFrac,
              iterations: c.iterations,
              queueDepth: this.o.queueDepth,
              buildId: this.o.buildId,
              clockKHz: this.o.clockKHz,
              name: this.o.name,
            },
          },
          f.tag,
        );
        return;
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
      if (job.kind === 'sweep') this.reply({ kind: Kind.SweepEnd, done: job.next, status: SweepStatus.Aborted }, job.tag);
    }
    this.pendingPairs = 0;
  }

  /** Emit the next RESULTS frame (and SWEEP_END when a sweep is done); returns bytes waiting. */
  private produce(): number {
    const job = this.jobs[0];
    const total = job.kind === 'list' ? job.codes.length : job.count;
    const n = Math.min(this.pairsPerFrame, total - job.next);
    const cos = new Int32Array(n);
    const sin = new Int32Array(n);
    for (let j = 0; j < n; j++) {
      const i = job.next + j;
      const code = job.kind === 'list' ? job.codes[i] : sweepAngleCode(job.start, job.step, i, this.profile);
      const r = this.o.core.evaluate(code);
      cos[j] = r.cos;
      sin[j] = r.sin;
    }
    let waiting = this.reply({ kind: Kind.Results, firstIndex: job.next, cos, sin }, job.tag);
    job.next += n;
    if (job.kind === 'list') this.pendingPairs -= n;
    if (job.next >= total) {
      this.jobs.shift();
      if (job.kind === 'sweep') waiting = this.reply({ kind: Kind.SweepEnd, done: job.next, status: SweepStatus.Complete }, job.tag);
    }
    return waiting;
  }
}
