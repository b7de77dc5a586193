// The capture archive, versions 1 and 2. Byte layout in docs/archive.md; in short:
//   "ABRC" · version u8 · header length u16 · header · records … · END record
// Version 2 is version 1 plus one record type, VECTOR_FORMATS (a vectoring core's formats from
// MODE_INFO); an archive without one is written as version 1, byte for byte as before.
// Every record opens with a type byte (low 4 bits: type; bit 7: direction, 1 = to-host) and the
// time in ms as float64. Frames are stored as references into the recorded byte stream.
import { ByteCursor, ByteLog, EndOfBytesError } from './byte-log';
import { isCrc8Name, type Crc8Name } from './crc8';
import type { AcceptedKinds, DecodedFrame, SkipEvent, SkipReason } from './decoder';
import type { VectoringFormats } from './payloads';
import { HEADER_BYTES, FRAME_OVERHEAD, SYNC } from './frame';
import { validateProfile, validateVectorProfile, WireProfileError, type WireProfile } from './wire-profile';
import { decodeUtf8, encodeUtf8 } from './text-codec';

/** First four bytes of an archive: ASCII "ABRC". */
export const ARCHIVE_MAGIC = Uint8Array.of(0x41, 0x42, 0x52, 0x43);
/** The newest format version this code writes and reads (it reads every version from 1). */
export const ARCHIVE_VERSION = 2;
/** The version of an archive that holds no VECTOR_FORMATS record. */
export const ARCHIVE_BASE_VERSION = 1;
/** Offset of the version byte, which the recorder raises to 2 once it writes vectoring formats. */
export const ARCHIVE_VERSION_OFFSET = 4;

/** Which way bytes travelled. */
export type Direction = 'to-device' | 'to-host';

/** What a capture was made with: enough to replay it through fresh decoders. */
export interface ArchiveHeader {
  /** The profile both decoders started with. */
  profile: WireProfile;
  crc: Crc8Name;
  /** KIND sets of the decoder of each direction. */
  accept: Record<Direction, AcceptedKinds>;
  /** Free text (UTF-8), e.g. the board and build. */
  label: string;
}

/** One record of an archive, in recording order. */
export type ArchiveRecord =
  | { type: 'chunk'; direction: Direction; timeMs: number; bytes: Uint8Array }
  | { type: 'frame'; direction: Direction; timeMs: number; frame: DecodedFrame }
  | { type: 'skip'; direction: Direction; timeMs: number; event: SkipEvent }
  | { type: 'profile'; direction: Direction; timeMs: number; offset: number; profile: WireProfile }
  /** Version 2: the decoder of `direction` took a vectoring core's formats (MODE_INFO) at `offset`. */
  | { type: 'vector-formats'; direction: Direction; timeMs: number; offset: number; formats: VectoringFormats }
  | { type: 'finish'; direction: Direction; timeMs: number };

/** An archive read back: header, records, and each direction's bytes in one array. */
export interface Archive {
  /** 1, or 2 when it holds VECTOR_FORMATS records. */
  version: number;
  header: ArchiveHeader;
  records: ArchiveRecord[];
  streams: Record<Direction, Uint8Array>;
}

/** Raised when bytes are not a readable archive; `code` says why. */
export class ArchiveError extends Error {
  constructor(readonly code: 'bad-magic' | 'unsupported-version' | 'truncated' | 'corrupt', message: string) {
    super(message);
    this.name = 'ArchiveError';
  }
}

/** Raised when an archive ends early (a capture cut off, a partial download). */
export class ArchiveTruncatedError extends ArchiveError {
  constructor(message: string) {
    super('truncated', message);
    this.name = 'ArchiveTruncatedError';
  }
}

/** Record types (low 4 bits of a record's first byte). */
export const RecordType = { End: 0, Chunk: 1, Frame: 2, Skip: 3, Profile: 4, Finish: 5, VectorFormats: 6 } as const;
const TO_HOST_BIT = 0x80;
const REASONS: readonly SkipReason[] = ['garbage', 'bad-check', 'bad-length', 'unknown-kind', 'truncated'];
const ACCEPTS: readonly AcceptedKinds[] = ['all', 'requests', 'replies'];
const OPTIONAL = ['kind', 'tag', 'len', 'check', 'expected'] as const;
const FORMATS = ['turn', 'rad'] as const;

/** Writes magic, version and header. */
export function writeHeader(log: ByteLog, h: ArchiveHeader): void {
  const p = validateProfile(h.profile);
  const crc = encodeUtf8(h.crc);
  const label = encodeUtf8(h.label);
  if (label.length > 0xffff - 16) throw new RangeError('label must be under 65,519 bytes of UTF-8');
  log.bytes(ARCHIVE_MAGIC);
  log.u8(ARCHIVE_BASE_VERSION);
  log.u16(3 + 1 + crc.length + 2 + 2 + label.length);
  log.u8(FORMATS.indexOf(p.angleFormat));
  log.u8(p.angleBits);
  log.u8(p.outBits);
  log.u8(crc.length);
  log.bytes(crc);
  log.u8(ACCEPTS.indexOf(h.accept['to-device']));
  log.u8(ACCEPTS.indexOf(h.accept['to-host']));
  log.u16(label.length);
  log.bytes(label);
}

/** Writes the type byte and the time shared by every record. */
export function writeRecordStart(log: ByteLog, type: number, direction: Direction, timeMs: number): void {
  log.u8(type | (direction === 'to-host' ? TO_HOST_BIT : 0));
  log.f64(timeMs);
}

/** Writes the body of a SKIP record. */
export function writeSkipBody(log: ByteLog, e: SkipEvent): void {
  log.u8(REASONS.indexOf(e.reason));
  log.varint(e.offset);
  log.varint(e.bytes);
  let flags = 0;
  OPTIONAL.forEach((f, i) => {
    if (e[f] !== undefined) flags |= 1 << i;
  });
  log.u8(flags);
  for (const f of OPTIONAL) if (e[f] !== undefined) log.u8(e[f]);
}

/** Writes the body of a PROFILE record. */
export function writeProfileBody(log: ByteLog, offset: number, p: WireProfile): void {
  validateProfile(p);
  log.varint(offset);
  log.u8(FORMATS.indexOf(p.angleFormat));
  log.u8(p.angleBits);
  log.u8(p.outBits);
}

/** The 8 format bytes of a VECTOR_FORMATS record, in MODE_INFO's order (protocol.md section 8). */
export const VECTOR_FORMATS_BYTES = 8;

/** Writes the body of a VECTOR_FORMATS record: offset, then MODE_INFO's format bytes 1–8. */
export function writeVectorFormatsBody(log: ByteLog, offset: number, f: VectoringFormats): void {
  checkVectorFormats(f);
  log.varint(offset);
  for (const v of [f.inBits, f.inFrac, FORMATS.indexOf(f.angleFormat), f.angleBits, f.angleFrac, f.magBits, f.magFrac, f.iterations]) log.u8(v);
}

function checkVectorFormats(f: VectoringFormats): VectoringFormats {
  try {
    validateVectorProfile({ inBits: f.inBits, angleFormat: f.angleFormat, angleBits: f.angleBits, magBits: f.magBits });
  } catch (e) {
    if (e instanceof WireProfileError) throw new ArchiveError('corrupt', `archive holds invalid vectoring formats: ${e.message}`);
    throw e;
  }
  for (const k of ['inFrac', 'angleFrac', 'magFrac', 'iterations'] as const) {
    if (!Number.isInteger(f[k]) || f[k] < 0 || f[k] > 255) throw new ArchiveError('corrupt', `archive holds invalid vectoring formats: ${k} must be a byte, got ${f[k]}`);
  }
  return f;
}

function readVectorFormats(c: ByteCursor): VectoringFormats {
  const [inBits, inFrac, format, angleBits, angleFrac, magBits, magFrac, iterations] = Array.from(c.bytes(VECTOR_FORMATS_BYTES));
  const angleFormat = FORMATS[format];
  if (!angleFormat) throw new ArchiveError('corrupt', `archive holds an unknown vectoring angle format ${format}`);
  return checkVectorFormats({ inBits, inFrac, angleFormat, angleBits, angleFrac, magBits, magFrac, iterations });
}

function readProfile(c: ByteCursor): WireProfile {
  const format = FORMATS[c.u8()];
  const profile = { angleFormat: format, angleBits: c.u8(), outBits: c.u8() };
  try {
    return validateProfile(profile);
  } catch (e) {
    if (e instanceof WireProfileError) throw new ArchiveError('corrupt', `archive holds an invalid profile: ${e.message}`);
    throw e;
  }
}

function readHeader(c: ByteCursor): ArchiveHeader & { version: number } {
  const magic = c.bytes(4);
  if (!magic.every((b, i) => b === ARCHIVE_MAGIC[i])) throw new ArchiveError('bad-magic', 'not an Anglebench capture archive (magic is not "ABRC")');
  const version = c.u8();
  if (version < ARCHIVE_BASE_VERSION || version > ARCHIVE_VERSION) {
    throw new ArchiveError('unsupported-version', `archive version ${version} is not supported (this reader knows ${ARCHIVE_BASE_VERSION} to ${ARCHIVE_VERSION})`);
  }
  const h = new ByteCursor(c.bytes(c.u16()));
  const profile = readProfile(h);
  const crc = decodeUtf8(h.bytes(h.u8()));
  if (!isCrc8Name(crc)) throw new ArchiveError('corrupt', `archive names an unknown CRC-8 "${crc}"`);
  const toDevice = ACCEPTS[h.u8()];
  const toHost = ACCEPTS[h.u8()];
  if (!toDevice || !toHost) throw new ArchiveError('corrupt', 'archive header has an unknown decoder KIND set');
  const label = decodeUtf8(h.bytes(h.u16()));
  return { version, profile, crc, accept: { 'to-device': toDevice, 'to-host': toHost }, label };
}

function concatViews(parts: Uint8Array[]): Uint8Array {
  const out = new Uint8Array(parts.reduce((n, p) => n + p.length, 0));
  let o = 0;
  for (const p of parts) {
    out.set(p, o);
    o += p.length;
  }
  return out;
}

/** Reads an archive; throws ArchiveTruncatedError if it ends early, ArchiveError if it is not one. */
export function readArchive(bytes: Uint8Array): Archive {
  const c = new ByteCursor(bytes);
  try {
    const { version, ...header } = readHeader(c);
    const records: ArchiveRecord[] = [];
    const parts: Record<Direction, Uint8Array[]> = { 'to-device': [], 'to-host': [] };
    const pendingFrames: Array<{ direction: Direction; frame: DecodedFrame; len: number }> = [];
    for (;;) {
      const typeByte = c.u8();
      const type = typeByte & 0x0f;
      const direction: Direction = typeByte & TO_HOST_BIT ? 'to-host' : 'to-device';
      if (typeByte & 0x70) throw new ArchiveError('corrupt', `record type byte 0x${typeByte.toString(16)} at offset ${c.pos - 1} has reserved bits set`);
      if (type === RecordType.End) {
        const count = c.varint();
        const toDevice = c.varint();
        const toHost = c.varint();
        if (c.remaining !== 0) throw new ArchiveError('corrupt', `${c.remaining} bytes follow the END record`);
        if (count !== records.length) throw new ArchiveError('corrupt', `END says ${count} records, archive holds ${records.length}`);
        const streams = { 'to-device': concatViews(parts['to-device']), 'to-host': concatViews(parts['to-host']) };
        if (streams['to-device'].length !== toDevice || streams['to-host'].length !== toHost) {
          throw new ArchiveError('corrupt', 'END byte counts do not match the chunks recorded');
        }
        for (const { direction: d, frame, len } of pendingFrames) resolvePayload(streams[d], frame, len);
        return { version, header, records, streams };
      }
      const timeMs = c.f64();
      switch (type) {
        case RecordType.Chunk: {
          const chunk = c.bytes(c.varint());
          parts[direction].push(chunk);
          records.push({ type: 'chunk', direction, timeMs, bytes: chunk });
          break;
        }
        case RecordType.Frame: {
          const offset = c.varint();
          const frame: DecodedFrame = { kind: c.u8(), tag: c.u8(), payload: new Uint8Array(0), check: 0, offset };
          const len = c.u8();
          frame.check = c.u8();
          pendingFrames.push({ direction, frame, len });
          records.push({ type: 'frame', direction, timeMs, frame });
          break;
        }
        case RecordType.Skip: {
          const reason = REASONS[c.u8()];
          if (!reason) throw new ArchiveError('corrupt', `unknown skip reason at offset ${c.pos - 1}`);
          const event: SkipEvent = { reason, offset: c.varint(), bytes: c.varint() };
          const flags = c.u8();
          OPTIONAL.forEach((f, i) => {
            if (flags & (1 << i)) event[f] = c.u8();
          });
          records.push({ type: 'skip', direction, timeMs, event });
          break;
        }
        case RecordType.Profile: {
          const offset = c.varint();
          records.push({ type: 'profile', direction, timeMs, offset, profile: readProfile(c) });
          break;
        }
        case RecordType.Finish:
          records.push({ type: 'finish', direction, timeMs });
          break;
        case RecordType.VectorFormats: {
          if (version < 2) throw new ArchiveError('corrupt', `a version-${version} archive has no record type ${type} (offset ${c.pos - 9})`);
          const offset = c.varint();
          records.push({ type: 'vector-formats', direction, timeMs, offset, formats: readVectorFormats(c) });
          break;
        }
        default:
          throw new ArchiveError('corrupt', `unknown record type ${type} at offset ${c.pos - 9}`);
      }
    }
  } catch (e) {
    if (e instanceof EndOfBytesError) {
      throw new ArchiveTruncatedError(`archive is truncated: it ends at byte ${bytes.length} inside a record or before its END record`);
    }
    // The byte cursor's only RangeError: a varint longer than any this format writes.
    if (e instanceof RangeError) throw new ArchiveError('corrupt', `archive is corrupt: ${e.message}`);
    throw e;
  }
}

/** Points a frame record's payload at the recorded stream and checks the stream agrees. */
function resolvePayload(stream: Uint8Array, frame: DecodedFrame, len: number): void {
  const o = frame.offset;
  const ok =
    o + len + FRAME_OVERHEAD <= stream.length &&
    stream[o] === SYNC &&
    stream[o + 1] === frame.kind &&
    stream[o + 2] === frame.tag &&
    stream[o + 3] === len &&
    stream[o + HEADER_BYTES + len] === frame.check;
  if (!ok) throw new ArchiveError('corrupt', `frame record at stream offset ${o} does not match the recorded bytes`);
  frame.payload = stream.subarray(o + HEADER_BYTES, o + HEADER_BYTES + len);
}
