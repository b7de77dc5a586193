// Records a bench session as it happens (bytes both ways, frames, decoder events) into the
// archive format of archive.ts, and replays an archive through fresh decoders.
import { ByteLog } from './byte-log';
import { DEFAULT_CRC8, type Crc8Name } from './crc8';
import { FrameDecoder, type AcceptedKinds, type DecodedFrame, type FrameDecoderOptions, type SkipEvent } from './decoder';
import { FRAME_OVERHEAD } from './frame';
import { DEFAULT_PROFILE, validateProfile, type VectorWireProfile, type WireProfile } from './wire-profile';
import { Kind } from './kinds';
import { decodePayload, vectorWireProfile } from './payloads';
import { readArchive, RecordType, writeHeader, writeProfileBody, writeRecordStart, writeSkipBody, type Archive, type ArchiveHeader, type Direction } from './archive';

/** Archive header fields; each has a default (default profile, CRC-8/SMBUS, all KINDs, no label). */
export interface RecorderOptions {
  profile?: WireProfile;
  crc?: Crc8Name;
  accept?: Partial<Record<Direction, AcceptedKinds>>;
  label?: string;
}

/** Where a recorder stood: records written and bytes each way so far. */
export interface RecorderMark {
  readonly records: number;
  readonly streamBytes: Readonly<Record<Direction, number>>;
}

/**
 * Appends records to a block-grown log. Times are the caller's (ms, any origin); nothing here
 * reads a clock. `toArchive()` may be called at any time and recording may go on afterwards.
 */
export class Recorder {
  readonly header: ArchiveHeader;
  private readonly log = new ByteLog();
  private count = 0;
  private readonly streamBytes: Record<Direction, number> = { 'to-device': 0, 'to-host': 0 };

  constructor(options: RecorderOptions = {}) {
    this.header = {
      profile: { ...validateProfile(options.profile ?? DEFAULT_PROFILE) },
      crc: options.crc ?? DEFAULT_CRC8,
      accept: { 'to-device': options.accept?.['to-device'] ?? 'all', 'to-host': options.accept?.['to-host'] ?? 'all' },
      label: options.label ?? '',
    };
    writeHeader(this.log, this.header);
  }

  /** Records written so far. */
  get recordCount(): number {
    return this.count;
  }

  /** Size of the archive so far, without its END record. */
  get byteLength(): number {
    return this.log.length;
  }

  /** Bytes as they went over the line, in one direction. */
  chunk(direction: Direction, timeMs: number, bytes: Uint8Array): void {
    writeRecordStart(this.log, RecordType.Chunk, direction, timeMs);
    this.log.varint(bytes.length);
    this.log.bytes(bytes);
    this.streamBytes[direction] += bytes.length;
    this.count++;
  }

  /** A frame the decoder of `direction` delivered; stored as a reference into the bytes. */
  frame(direction: Direction, timeMs: number, f: DecodedFrame): void {
    writeRecordStart(this.log, RecordType.Frame, direction, timeMs);
    this.log.varint(f.offset);
    this.log.u8(f.kind);
    this.log.u8(f.tag);
    this.log.u8(f.payload.length);
    this.log.u8(f.check);
    this.count++;
  }

  /** A skip event of the decoder of `direction`. */
  skip(direction: Direction, timeMs: number, e: SkipEvent): void {
    writeRecordStart(this.log, RecordType.Skip, direction, timeMs);
    writeSkipBody(this.log, e);
    this.count++;
  }

  /**
   * The decoder of `direction` switched profile. `offset`: the end of the frame in whose
   * callback it switched, or the decoder's bytesReceived when it switched between pushes.
   */
  profile(direction: Direction, timeMs: number, offset: number, p: WireProfile): void {
    writeRecordStart(this.log, RecordType.Profile, direction, timeMs);
    writeProfileBody(this.log, offset, p);
    this.count++;
  }

  /** The decoder of `direction` was finished (end of stream). */
  finish(direction: Direction, timeMs: number): void {
    writeRecordStart(this.log, RecordType.Finish, direction, timeMs);
    this.count++;
  }

  /** Where the recording stands now, for `excerpt`. */
  mark(): RecorderMark {
    return { records: this.count, streamBytes: { ...this.streamBytes } };
  }

  /**
   * A complete archive, same header, of the records before `preambleEnd` and those from `from`
   * on: what came between is left out and stream positions after `from` move back by its bytes.
   * Take `from` between frames; a frame or skip that began before it is dropped (its bytes stay,
   * and replay reads them as a skip).
   */
  excerpt(preambleEnd: RecorderMark, from: RecorderMark): Uint8Array {
    if (preambleEnd.records > from.records || from.records > this.count) throw new RangeError('excerpt marks must be in recording order');
    const { records } = readArchive(this.toArchive());
    const out = new Recorder(this.header);
    const cut = from.streamBytes;
    const shift = (d: Direction, offset: number) => offset - (cut[d] - preambleEnd.streamBytes[d]);
    const copy = (r: (typeof records)[number], moved: boolean) => {
      const at = (offset: number) => (moved ? shift(r.direction, offset) : offset);
      if (r.type === 'chunk') out.chunk(r.direction, r.timeMs, r.bytes);
      else if (r.type === 'frame') out.frame(r.direction, r.timeMs, { ...r.frame, offset: at(r.frame.offset) });
      else if (r.type === 'skip') out.skip(r.direction, r.timeMs, { ...r.event, offset: at(r.event.offset) });
      else if (r.type === 'profile') out.profile(r.direction, r.timeMs, at(Math.max(r.offset, moved ? cut[r.direction] : 0)), r.profile);
      else out.finish(r.direction, r.timeMs);
    };
    for (let i = 0; i < preambleEnd.records; i++) copy(records[i], false);
    for (let i = from.records; i < records.length; i++) {
      const r = records[i];
      const begins = r.type === 'frame' ? r.frame.offset : r.type === 'skip' ? r.event.offset : Infinity;
      if (begins >= cut[r.direction]) copy(r, true);
    }
    return out.toArchive();
  }

  /** The archive so far, closed with an END record. */
  toArchive(): Uint8Array {
    const end = new ByteLog();
    end.u8(RecordType.End);
    end.varint(this.count);
    end.varint(this.streamBytes['to-device']);
    end.varint(this.streamBytes['to-host']);
    return this.log.toBytes(end.toBytes());
  }
}

/** Options of RecordedDecoder: the decoder's own, minus what the recorder's header fixes. */
export interface RecordedDecoderOptions extends Pick<FrameDecoderOptions, 'onFrame' | 'onSkip'> {
  recorder: Recorder;
  direction: Direction;
  /** The caller's clock, in ms. */
  nowMs: () => number;
}

/**
 * A FrameDecoder for one direction that records every chunk, frame, skip, profile change and
 * finish, so the archive replays exactly. Use it in place of a bare decoder.
 */
export class RecordedDecoder {
  readonly decoder: FrameDecoder;
  private readonly rec: Recorder;
  private readonly direction: Direction;
  private readonly nowMs: () => number;
  private frameEnd = -1;

  constructor(options: RecordedDecoderOptions) {
    const { recorder, direction, nowMs } = options;
    this.rec = recorder;
    this.direction = direction;
    this.nowMs = nowMs;
    const onSkip = options.onSkip;
    this.decoder = new FrameDecoder({
      crc: recorder.header.crc,
      profile: recorder.header.profile,
      accept: recorder.header.accept[direction],
      onFrame: (f) => {
        recorder.frame(direction, nowMs(), f);
        this.frameEnd = f.offset + f.payload.length + FRAME_OVERHEAD;
        try {
          options.onFrame(f);
        } finally {
          this.frameEnd = -1;
        }
      },
      onSkip: (e) => {
        recorder.skip(direction, nowMs(), e);
        onSkip?.(e);
      },
    });
  }

  push(bytes: Uint8Array): void {
    this.rec.chunk(this.direction, this.nowMs(), bytes);
    this.decoder.push(bytes);
  }

  finish(): void {
    this.rec.finish(this.direction, this.nowMs());
    this.decoder.finish();
  }

  setProfile(p: WireProfile): void {
    this.decoder.setProfile(p);
    const offset = this.frameEnd >= 0 ? this.frameEnd : this.decoder.bytesReceived;
    this.rec.profile(this.direction, this.nowMs(), offset, p);
  }
}

/** What a replay produced, in order, for comparison with the recorded frames and events. */
export interface ReplayResult {
  /** The archive as read, so a caller need not read it a second time. */
  archive: Archive;
  frames: Array<{ direction: Direction; frame: DecodedFrame }>;
  skips: Array<{ direction: Direction; event: SkipEvent }>;
}

export interface ReplayOptions {
  /**
   * Size the VEC_* frames by the vectoring formats a MODE_INFO reply announces, from that reply on,
   * as the engine did on the bench: the archive's profile records keep only the rotating fields,
   * so without this a vectoring core of other widths than the default reads as damaged frames.
   */
  vectorFormats?: boolean;
}

/**
 * Pushes the recorded chunks, with their original boundaries, through fresh decoders built from
 * the header, switching profile where the recording did and finishing where it finished.
 */
export function replayArchive(bytes: Uint8Array, options: ReplayOptions = {}): ReplayResult {
  const archive = readArchive(bytes);
  const out: ReplayResult = { archive, frames: [], skips: [] };
  let vector: VectorWireProfile | undefined;
  const withVector = (p: WireProfile): WireProfile => (vector ? { ...p, vector } : p);
  const announce = (frame: DecodedFrame, profile: WireProfile) => {
    try {
      const m = decodePayload(frame.kind, frame.payload, profile);
      if (m.kind !== Kind.ModeInfo || !m.modes.vectoring) return;
      vector = vectorWireProfile(m.modes.vectoring);
      for (const side of Object.values(sides)) side.decoder.setProfile(withVector(side.decoder.profile));
    } catch {
      // A MODE_INFO the engine could not use either: the VEC_* frames keep the default widths.
    }
  };
  const make = (direction: Direction) => {
    const changes = archive.records.flatMap((r) => (r.type === 'profile' && r.direction === direction ? [r] : []));
    let next = 0;
    const decoder: FrameDecoder = new FrameDecoder({
      crc: archive.header.crc,
      profile: archive.header.profile,
      accept: archive.header.accept[direction],
      onFrame: (frame) => {
        out.frames.push({ direction, frame });
        const end = frame.offset + frame.payload.length + FRAME_OVERHEAD;
        if (next < changes.length && changes[next].offset === end) decoder.setProfile(withVector(changes[next++].profile));
        if (options.vectorFormats && direction === 'to-host' && frame.kind === Kind.ModeInfo) announce(frame, decoder.profile);
      },
      onSkip: (event) => out.skips.push({ direction, event }),
    });
    const catchUp = () => {
      while (next < changes.length && changes[next].offset <= decoder.bytesReceived) decoder.setProfile(withVector(changes[next++].profile));
    };
    return { decoder, catchUp };
  };
  // announce() reads it from a frame callback, once both decoders exist.
  const sides = { 'to-device': make('to-device'), 'to-host': make('to-host') };
  for (const r of archive.records) {
    const side = sides[r.direction];
    if (r.type === 'chunk') {
      side.catchUp();
      side.decoder.push(r.bytes);
    } else if (r.type === 'finish') {
      side.catchUp();
      side.decoder.finish();
    }
  }
  return out;
}
