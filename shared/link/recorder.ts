// Records a bench session as it happens (bytes both ways, frames, decoder events) into the
// archive format of archive.ts, and replays an archive through fresh decoders.
import { ByteLog } from './byte-log';
import { DEFAULT_CRC8, type Crc8Name } from './crc8';
import { FrameDecoder, type AcceptedKinds, type DecodedFrame, type FrameDecoderOptions, type SkipEvent } from './decoder';
import { FRAME_OVERHEAD } from './frame';
import { DEFAULT_PROFILE, validateProfile, type WireProfile } from './wire-profile';
import { vectorWireProfile, type VectoringFormats } from './payloads';
import {
  ARCHIVE_VERSION_OFFSET,
  readArchive,
  RecordType,
  writeHeader,
  writeProfileBody,
  writeRecordStart,
  writeSkipBody,
  writeVectorFormatsBody,
  type Archive,
  type ArchiveHeader,
  type Direction,
} from './archive';

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
  /** A VECTOR_FORMATS record was written: the archive is version 2. */
  private vectoring = false;

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

  /** The decoder of `direction` took a vectoring core's formats (MODE_INFO); `offset` as for profile(). */
  vectorFormats(direction: Direction, timeMs: number, offset: number, f: VectoringFormats): void {
    writeRecordStart(this.log, RecordType.VectorFormats, direction, timeMs);
    writeVectorFormatsBody(this.log, offset, f);
    this.vectoring = true;
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
      else if (r.type === 'vector-formats') out.vectorFormats(r.direction, r.timeMs, at(Math.max(r.offset, moved ? cut[r.direction] : 0)), r.formats);
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
    const bytes = this.log.toBytes(end.toBytes());
    // Version 2 only when it holds what version 1 has no record for, so a rotating capture stays version 1.
    if (this.vectoring) bytes[ARCHIVE_VERSION_OFFSET] = 2;
    return bytes;
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

  /** The vectoring formats a MODE_INFO announced: VEC_* frames are sized by them from here on, and the archive says so. */
  setVectorFormats(f: VectoringFormats): void {
    this.decoder.setProfile({ ...this.decoder.profile, vector: vectorWireProfile(f) });
    const offset = this.frameEnd >= 0 ? this.frameEnd : this.decoder.bytesReceived;
    this.rec.vectorFormats(this.direction, this.nowMs(), offset, f);
  }
}

/** What a replay produced, in order, for comparison with the recorded frames and events. */
export interface ReplayResult {
  /** The archive as read, so a caller need not read it a second time. */
  archive: Archive;
  frames: Array<{ direction: Direction; frame: DecodedFrame }>;
  skips: Array<{ direction: Direction; event: SkipEvent }>;
}

/**
 * Pushes the recorded chunks, with their original boundaries, through fresh decoders built from
 * the header, switching profile where the recording did and finishing where it finished.
 */
export function replayArchive(bytes: Uint8Array): ReplayResult {
  const archive = readArchive(bytes);
  const out: ReplayResult = { archive, frames: [], skips: [] };
  const make = (direction: Direction) => {
    const changes = archive.records.flatMap((r) => ((r.type === 'profile' || r.type === 'vector-formats') && r.direction === direction ? [r] : []));
    let next = 0;
    const apply = (r: (typeof changes)[number]) => decoder.setProfile(r.type === 'profile' ? r.profile : { ...decoder.profile, vector: vectorWireProfile(r.formats) });
    const decoder: FrameDecoder = new FrameDecoder({
      crc: archive.header.crc,
      profile: archive.header.profile,
      accept: archive.header.accept[direction],
      onFrame: (frame) => {
        out.frames.push({ direction, frame });
        const end = frame.offset + frame.payload.length + FRAME_OVERHEAD;
        while (next < changes.length && changes[next].offset === end) apply(changes[next++]);
      },
      onSkip: (event) => out.skips.push({ direction, event }),
    });
    const catchUp = () => {
      while (next < changes.length && changes[next].offset <= decoder.bytesReceived) apply(changes[next++]);
    };
    return { decoder, catchUp };
  };
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
