import { describe, expect, it } from 'vitest';
import { C, frameSummary, profilesByRecord, recordLines, stamp } from '../../../src/features/sessions/capture/capture-lines';
import { encodeMessage, Kind, readArchive, RecordedDecoder, Recorder, type DeviceInfo, type WireProfile } from '../../../shared/link';

const p16: WireProfile = { angleFormat: 'turn', angleBits: 16, outBits: 16 };
const p24: WireProfile = { angleFormat: 'turn', angleBits: 16, outBits: 24 };
const info: DeviceInfo = { version: 1, angleFormat: 'turn', angleBits: 16, angleFrac: 0, outBits: 24, outFrac: 22, iterations: 24, queueDepth: 1024, buildId: 42, clockKHz: 125000, name: 'lab-bench rev B' };
// The ANSI colour codes of capture-lines, taken off to read the text.
const plain = (s: string) => Object.values(C).reduce((t, code) => t.split(code).join(''), s);

/** A HELLO, an INFO that switches the host side to 24-bit outputs, then two RESULTS. */
function capture() {
  let t = 5000;
  const recorder = new Recorder({ accept: { 'to-host': 'replies', 'to-device': 'requests' } });
  const host: RecordedDecoder = new RecordedDecoder({ recorder, direction: 'to-host', nowMs: () => (t += 1.5), onFrame: (f) => f.kind === Kind.Info && host.setProfile(p24) });
  const device = new RecordedDecoder({ recorder, direction: 'to-device', nowMs: () => (t += 1.5), onFrame: () => undefined });
  device.push(encodeMessage({ kind: Kind.Hello }, 1, p16));
  host.push(encodeMessage({ kind: Kind.Info, info }, 1, p16));
  host.push(encodeMessage({ kind: Kind.Results, firstIndex: 7, cos: Int32Array.of(4194304, 0), sin: Int32Array.of(0, 4194304) }, 2, p24));
  return readArchive(recorder.toArchive());
}

describe('capture records as terminal lines', () => {
  const archive = capture();
  const profiles = profilesByRecord(archive.records, archive.header.profile);
  const t0 = archive.records[0].timeMs;
  const lines = archive.records.flatMap((r, i) => recordLines(r, t0, profiles[i]).map(plain));

  it('shows the time since the first record in seconds', () => {
    expect(stamp(5001.5, 5000)).toBe('+    0.002 s');
    expect(lines[0].startsWith('+    0.000 s')).toBe(true);
  });

  it('writes bytes in hex and ASCII with their direction', () => {
    const hello = encodeMessage({ kind: Kind.Hello }, 1, p16);
    const hex = Array.from(hello, (b) => b.toString(16).padStart(2, '0')).join(' ');
    expect(lines[0]).toContain(`TX → ${hex}`);
    // ASCII starts after time (12), arrow (4), 16 hex bytes (47) and the spaces between.
    const rx = lines.findIndex((l) => l.includes('RX ←'));
    const ascii = lines.slice(rx, rx + 4).map((l) => l.slice(12 + 1 + 4 + 1 + 47 + 2)).join('');
    expect(ascii).toContain('lab-bench rev B');
  });

  it('summarises each decoded frame from its payload, under the profile then in force', () => {
    expect(lines.some((l) => l.includes('⇒ HELLO tag 1'))).toBe(true);
    expect(lines.some((l) => l.includes('⇐ INFO tag 1: "lab-bench rev B", turn 16-bit angles, 24-bit outputs (22 fraction bits)'))).toBe(true);
    // Only readable as 24-bit results because the profile switch after INFO was followed.
    expect(lines.some((l) => l.includes('⇐ RESULTS tag 2: 2 results from index 7'))).toBe(true);
    expect(lines.some((l) => l.includes('to-host: profile now turn, 16-bit angles, 24-bit outputs'))).toBe(true);
  });

  it('says so when a payload cannot be read instead of throwing', () => {
    const bad = { kind: Kind.Results, tag: 9, payload: Uint8Array.of(1, 2, 3), check: 0, offset: 0 };
    expect(frameSummary(bad, p16)).toMatch(/^RESULTS tag 9: payload not readable/);
  });

  it('colours a skip as a warning', () => {
    const line = recordLines({ type: 'skip', direction: 'to-host', timeMs: t0 + 2, event: { reason: 'bad-check', offset: 12, bytes: 1 } }, t0, p16)[0];
    expect(line).toContain(C.warn);
    expect(plain(line)).toContain('to-host: skipped 1 B (bad-check) at offset 12');
  });

  it("follows a vectoring board's formats and summarises its VEC_* frames at their widths", () => {
    // 20-bit angles: VEC_RESULTS pairs of 3 + 3 bytes, unreadable at the default core's 2 + 3.
    const formats = { inBits: 16, inFrac: 14, angleFormat: 'turn', angleBits: 20, angleFrac: 0, magBits: 18, magFrac: 14, iterations: 16 } as const;
    const vp: WireProfile = { ...p16, vector: { inBits: 16, angleFormat: 'turn', angleBits: 20, magBits: 18 } };
    const recorder = new Recorder({ accept: { 'to-host': 'replies', 'to-device': 'requests' } });
    let t = 0;
    const host: RecordedDecoder = new RecordedDecoder({ recorder, direction: 'to-host', nowMs: () => (t += 1), onFrame: (f) => f.kind === Kind.ModeInfo && host.setVectorFormats(formats) });
    host.push(encodeMessage({ kind: Kind.ModeInfo, modes: { rotation: false, vectoring: formats } }, 3, p16));
    host.push(encodeMessage({ kind: Kind.VecResults, firstIndex: 4, angle: Int32Array.of(2 ** 19, 5), magnitude: Int32Array.of(26981, 0) }, 4, vp));
    const a = readArchive(recorder.toArchive());
    const ps = profilesByRecord(a.records, a.header.profile);
    const text = a.records.flatMap((r, i) => recordLines(r, 0, ps[i]).map(plain));
    expect(text.some((l) => l.includes('⇐ MODE_INFO tag 3: vectoring, 16-bit x/y, turn 20-bit angles, 18-bit magnitudes'))).toBe(true);
    expect(text.some((l) => l.includes('to-host: vectoring formats now 16-bit x/y, turn 20-bit angles, 18-bit magnitudes'))).toBe(true);
    expect(text.some((l) => l.includes('⇐ VEC_RESULTS tag 4: 2 vector results from index 4'))).toBe(true);
  });
});
