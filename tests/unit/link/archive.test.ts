import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { ArchiveError, ArchiveTruncatedError, readArchive, type Direction } from '../../../shared/link/archive';
import type { DecodedFrame, SkipEvent } from '../../../shared/link/decoder';
import { encodeFrame } from '../../../shared/link/frame';
import { Kind } from '../../../shared/link/kinds';
import { encodeMessage, type DeviceInfo } from '../../../shared/link/payloads';
import { RecordedDecoder, Recorder, replayArchive } from '../../../shared/link/recorder';
import type { WireProfile } from '../../../shared/link/wire-profile';
import { concat, rawFrameArb, streamOf } from './arbitraries';

const p16: WireProfile = { angleFormat: 'turn', angleBits: 16, outBits: 16 };
const p24: WireProfile = { angleFormat: 'turn', angleBits: 16, outBits: 24 };
const info: DeviceInfo = { version: 1, angleFormat: 'turn', angleBits: 16, angleFrac: 0, outBits: 24, outFrac: 22, iterations: 24, queueDepth: 1024, buildId: 42, clockKHz: 125000, name: 'lab-bench rev B' };

/** A session as a link engine would record it, with a fake clock that ticks 0.25 ms a call. */
function recordSession(toHostChunks: Uint8Array[], toDeviceChunks: Uint8Array[], label = 'bench 3, build 42') {
  let t = 1000.125;
  const nowMs = () => (t += 0.25);
  const recorder = new Recorder({ label, accept: { 'to-host': 'replies', 'to-device': 'requests' } });
  const live = { frames: [] as Array<{ direction: Direction; frame: DecodedFrame }>, skips: [] as Array<{ direction: Direction; event: SkipEvent }> };
  const side = (direction: Direction) => {
    const d: RecordedDecoder = new RecordedDecoder({
      recorder,
      direction,
      nowMs,
      onFrame: (frame) => {
        live.frames.push({ direction, frame });
        if (frame.kind === Kind.Info) d.setProfile(p24);
      },
      onSkip: (event) => live.skips.push({ direction, event }),
    });
    return d;
  };
  const host = side('to-host');
  const device = side('to-device');
  const n = Math.max(toHostChunks.length, toDeviceChunks.length);
  for (let i = 0; i < n; i++) {
    if (i < toDeviceChunks.length) device.push(toDeviceChunks[i]);
    if (i < toHostChunks.length) host.push(toHostChunks[i]);
  }
  host.finish();
  device.finish();
  return { recorder, live, archive: recorder.toArchive() };
}

const hello = encodeMessage({ kind: Kind.Hello }, 1, p16);
const one = encodeMessage({ kind: Kind.One, angleCode: 5461 }, 2, p16);
const infoFrame = encodeMessage({ kind: Kind.Info, info }, 1, p16);
const wideResults = encodeMessage({ kind: Kind.Results, firstIndex: 0, cos: Int32Array.of(3632030), sin: Int32Array.of(2097152) }, 2, p24);
const damaged = wideResults.slice();
damaged[7] ^= 0x10;

describe('capture archive', () => {
  const toHost = concat([Uint8Array.of(0, 0x13), infoFrame, damaged, wideResults, wideResults.subarray(0, 6)]);
  const hostChunks = [toHost.subarray(0, 5), toHost.subarray(5, 30), toHost.subarray(30)];
  const deviceChunks = [hello, concat([one, Uint8Array.of(0xa5, 0x99)])];

  it('writes, reads back and replays a session to the same frames and events', () => {
    const { live, archive } = recordSession(hostChunks, deviceChunks);
    expect(live.frames.map((f) => f.frame.kind)).toEqual([Kind.Hello, Kind.One, Kind.Info, Kind.Results]);
    expect(live.skips.map((s) => s.event.reason)).toContain('bad-check');
    expect(live.skips.map((s) => s.event.reason)).toContain('truncated');
    const replay = replayArchive(archive);
    expect(replay.frames).toEqual(live.frames);
    expect(replay.skips).toEqual(live.skips);
  });

  it('reads back the header, every record with its exact time, and both byte streams', () => {
    const { live, archive, recorder } = recordSession(hostChunks, deviceChunks);
    const a = readArchive(archive);
    expect(a.header).toEqual({ profile: p16, crc: 'CRC-8/SMBUS', accept: { 'to-host': 'replies', 'to-device': 'requests' }, label: 'bench 3, build 42' });
    expect(a.records).toHaveLength(recorder.recordCount);
    expect(a.streams['to-host']).toEqual(toHost);
    expect(a.streams['to-device']).toEqual(concat(deviceChunks));
    const frames = a.records.flatMap((r) => (r.type === 'frame' ? [{ direction: r.direction, frame: r.frame }] : []));
    expect(frames).toEqual(live.frames);
    const skips = a.records.flatMap((r) => (r.type === 'skip' ? [{ direction: r.direction, event: r.event }] : []));
    expect(skips).toEqual(live.skips);
    const times = a.records.map((r) => r.timeMs);
    expect(times[0]).toBe(1000.375);
    expect(times.every((t, i) => i === 0 || t > times[i - 1])).toBe(true);
    expect(a.records.filter((r) => r.type === 'profile')).toMatchObject([{ direction: 'to-host', offset: 2 + infoFrame.length, profile: p24 }]);
  });

  it('replays random sessions, garbage and damage included, to what was seen live', () => {
    fc.assert(
      fc.property(
        fc.array(fc.oneof(rawFrameArb.map((f) => streamOf([f]).bytes), fc.uint8Array({ maxLength: 12 }), fc.constant(infoFrame)), { maxLength: 8 }),
        fc.array(fc.nat(), { maxLength: 6 }),
        fc.array(fc.tuple(fc.nat(), fc.integer({ min: 1, max: 255 })), { maxLength: 3 }),
        (parts, rawCuts, flips) => {
          const stream = concat(parts);
          for (const [at, mask] of flips) if (stream.length) stream[at % stream.length] ^= mask;
          const cuts = [...new Set(rawCuts.map((c) => (stream.length ? c % stream.length : 0)))].sort((a, b) => a - b);
          const chunks = [0, ...cuts].map((c, i, all) => stream.subarray(c, i + 1 < all.length ? all[i + 1] : stream.length));
          const { live, archive } = recordSession(chunks, chunks.slice().reverse());
          const replay = replayArchive(archive);
          expect(replay.frames).toEqual(live.frames);
          expect(replay.skips).toEqual(live.skips);
        },
      ),
    );
  });

  it('gives ArchiveTruncatedError for every cut-off prefix of an archive', () => {
    const { archive } = recordSession(hostChunks, deviceChunks);
    for (let n = 0; n < archive.length; n++) {
      expect(() => readArchive(archive.subarray(0, n)), `prefix of ${n} bytes`).toThrow(ArchiveTruncatedError);
    }
    expect(() => readArchive(archive.subarray(0, archive.length - 1))).toThrow(/truncated/);
  });

  it('names a wrong magic, an unknown version and extra bytes after END', () => {
    const { archive } = recordSession([one], []);
    const wrongMagic = archive.slice();
    wrongMagic[0] = 0x58;
    expect(() => readArchive(wrongMagic)).toThrow(expect.objectContaining({ name: 'ArchiveError', code: 'bad-magic' }));
    const v9 = archive.slice();
    v9[4] = 9;
    expect(() => readArchive(v9)).toThrow(expect.objectContaining({ code: 'unsupported-version' }));
    expect(() => readArchive(concat([archive, Uint8Array.of(0)]))).toThrow(expect.objectContaining({ code: 'corrupt' }));
  });

  it('refuses a frame record that does not match the recorded bytes', () => {
    const recorder = new Recorder();
    recorder.chunk('to-host', 0, one);
    recorder.frame('to-host', 1, { kind: Kind.One, tag: 9, payload: one.subarray(4, 6), check: one[6], offset: 0 });
    expect(() => readArchive(recorder.toArchive())).toThrow(ArchiveError);
  });

  it('stays compact: a frame record costs at most 18 bytes on top of the line bytes', () => {
    const frame = encodeFrame(Kind.Results, 1, new Uint8Array(4 + 62 * 4));
    const recorder = new Recorder();
    let t = 0;
    const d = new RecordedDecoder({ recorder, direction: 'to-host', nowMs: () => (t += 0.01), onFrame: () => {} });
    const block = concat(Array.from({ length: 16 }, () => frame));
    for (let i = 0; i < 1000; i++) d.push(block);
    const lineBytes = block.length * 1000;
    expect(d.decoder.framesDecoded).toBe(16000);
    // Frame record: type 1 + time 8 + offset varint ≤ 5 + KIND, TAG, LEN, CHECK 4; chunk record: 1 + 8 + 3.
    expect(recorder.byteLength).toBeLessThan(lineBytes + 16000 * 18 + 1000 * 12 + 100);
    expect(readArchive(recorder.toArchive()).streams['to-host']).toHaveLength(lineBytes);
  });

  it('keeps recording after toArchive, each archive complete on its own', () => {
    const recorder = new Recorder();
    recorder.chunk('to-device', 0.5, hello);
    const first = readArchive(recorder.toArchive());
    recorder.chunk('to-device', 1.5, one);
    const second = readArchive(recorder.toArchive());
    expect(first.records).toHaveLength(1);
    expect(second.streams['to-device']).toEqual(concat([hello, one]));
  });

  it('writes the byte-for-byte example of docs/archive.md', () => {
    const recorder = new Recorder();
    recorder.chunk('to-device', 2.5, encodeMessage({ kind: Kind.Hello }, 1, p16));
    const doc = '41 42 52 43 01 13 00 00 10 10 0B 43 52 43 2D 38 2F 53 4D 42 55 53 00 00 00 00 01 00 00 00 00 00 00 04 40 05 A5 01 01 00 7E 00 01 05 00';
    expect(recorder.toArchive()).toEqual(Uint8Array.from(doc.split(' '), (h) => parseInt(h, 16)));
  });
});

describe('capture archive version 2: a vectoring core’s formats', () => {
  /** 12-bit inputs, 20-bit rad angles, 8-bit magnitudes: 4-byte pairs where the default core has 5. */
  const formats = { inBits: 12, inFrac: 10, angleFormat: 'rad', angleBits: 20, angleFrac: 17, magBits: 8, magFrac: 4, iterations: 14 } as const;
  const vp: WireProfile = { ...p16, vector: { inBits: 12, angleFormat: 'rad', angleBits: 20, magBits: 8 } };
  const modeInfo = encodeMessage({ kind: Kind.ModeInfo, modes: { rotation: false, vectoring: formats } }, 2, p16);
  const results = encodeMessage({ kind: Kind.VecResults, firstIndex: 0, angle: Int32Array.of(-(2 ** 19), 5, 2 ** 19 - 1), magnitude: Int32Array.of(-128, 0, 127) }, 3, vp);

  /** The board's side of a session: MODE_INFO, then VEC_RESULTS at the formats it announced. */
  function vectoringSession() {
    const recorder = new Recorder();
    let t = 0;
    const seen: DecodedFrame[] = [];
    const host: RecordedDecoder = new RecordedDecoder({
      recorder,
      direction: 'to-host',
      nowMs: () => (t += 1),
      onFrame: (f) => {
        seen.push(f);
        if (f.kind === Kind.ModeInfo) host.setVectorFormats(formats);
      },
    });
    host.push(concat([modeInfo, results]));
    const preamble = recorder.mark();
    host.push(results);
    return { recorder, seen, preamble };
  }

  it('replays VEC_* frames at the announced widths, and says version 2', () => {
    const { recorder, seen } = vectoringSession();
    expect(seen.map((f) => f.kind)).toEqual([Kind.ModeInfo, Kind.VecResults, Kind.VecResults]);
    const bytes = recorder.toArchive();
    expect(bytes[4]).toBe(2);
    const replay = replayArchive(bytes);
    expect(replay.archive.version).toBe(2);
    expect(replay.archive.records.filter((r) => r.type === 'vector-formats')).toEqual([{ type: 'vector-formats', direction: 'to-host', timeMs: 3, offset: modeInfo.length, formats }]);
    expect(replay.skips).toEqual([]);
    expect(replay.frames.map((f) => f.frame)).toEqual(seen);
  });

  it('keeps the formats in an excerpt, and a rotating capture stays version 1', () => {
    const { recorder, preamble } = vectoringSession();
    const cut = readArchive(recorder.excerpt(preamble, preamble));
    expect(cut.version).toBe(2);
    expect(cut.records.some((r) => r.type === 'vector-formats')).toBe(true);
    const { archive } = recordSession([one], []);
    expect(archive[4]).toBe(1);
    expect(readArchive(archive).version).toBe(1);
  });

  it('refuses the record in a version-1 archive, bad formats in it, and a version it does not know', () => {
    const bytes = vectoringSession().recorder.toArchive();
    const asV1 = bytes.slice();
    asV1[4] = 1;
    expect(() => readArchive(asV1)).toThrow(expect.objectContaining({ code: 'corrupt', message: expect.stringMatching(/version-1 archive has no record type 6/) }));
    const v3 = bytes.slice();
    v3[4] = 3;
    expect(() => readArchive(v3)).toThrow(expect.objectContaining({ code: 'unsupported-version', message: expect.stringMatching(/knows 1 to 2/) }));
    const recorder = new Recorder();
    expect(() => recorder.vectorFormats('to-host', 0, 0, { ...formats, angleBits: 40 })).toThrow(/angleBits/);
  });

  it('writes the byte-for-byte example of docs/archive.md', () => {
    const recorder = new Recorder();
    recorder.vectorFormats('to-host', 4, 0, { inBits: 16, inFrac: 14, angleFormat: 'turn', angleBits: 16, angleFrac: 0, magBits: 18, magFrac: 14, iterations: 16 });
    const doc = '41 42 52 43 02 13 00 00 10 10 0B 43 52 43 2D 38 2F 53 4D 42 55 53 00 00 00 00 86 00 00 00 00 00 00 10 40 00 10 0E 00 10 00 12 0E 10 00 01 00 00';
    expect(recorder.toArchive()).toEqual(Uint8Array.from(doc.split(' '), (h) => parseInt(h, 16)));
  });
});
