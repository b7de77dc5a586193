import { describe, expect, it } from 'vitest';
import { samplesFromArchive } from '../../../shared/link-engine/archive-samples';
import { readArchive, type Direction } from '../../../shared/link/archive';
import { Kind } from '../../../shared/link/kinds';
import { encodeMessage, type DeviceInfo } from '../../../shared/link/payloads';
import { RecordedDecoder, Recorder, replayArchive } from '../../../shared/link/recorder';
import type { WireProfile } from '../../../shared/link/wire-profile';
import { concat } from './arbitraries';

const p16: WireProfile = { angleFormat: 'turn', angleBits: 16, outBits: 16 };
const p24: WireProfile = { angleFormat: 'turn', angleBits: 16, outBits: 24 };
const info: DeviceInfo = { version: 1, angleFormat: 'turn', angleBits: 16, angleFrac: 0, outBits: 24, outFrac: 22, iterations: 24, queueDepth: 1024, buildId: 7, clockKHz: 100000, name: 'bench board C' };

const hello = encodeMessage({ kind: Kind.Hello }, 1, p16);
const infoFrame = encodeMessage({ kind: Kind.Info, info }, 1, p16);
const ask = (code: number, tag: number) => encodeMessage({ kind: Kind.One, angleCode: code }, tag, p24);
const answer = (cos: number, sin: number, tag: number) => encodeMessage({ kind: Kind.Results, firstIndex: 0, cos: Int32Array.of(cos), sin: Int32Array.of(sin) }, tag, p24);

/** A connection recorded the way a link engine records it: HELLO → INFO, then runs of ONE requests. */
function connection() {
  let t = 0;
  const nowMs = () => (t += 0.5);
  const recorder = new Recorder({ label: 'bench C', accept: { 'to-host': 'replies', 'to-device': 'requests' } });
  const side = (direction: Direction) => {
    const d: RecordedDecoder = new RecordedDecoder({ recorder, direction, nowMs, onFrame: (f) => f.kind === Kind.Info && d.setProfile(p24) });
    return d;
  };
  const host = side('to-host');
  const device = side('to-device');
  device.push(hello);
  host.push(infoFrame);
  return { recorder, host, device, preambleEnd: recorder.mark() };
}

const kinds = (frames: Array<{ direction: Direction; frame: { kind: number; tag: number } }>, d: Direction) =>
  frames.filter((f) => f.direction === d).map((f) => [f.frame.kind, f.frame.tag]);

describe('a recorder excerpt: the preamble and one run', () => {
  it('leaves out the earlier run, keeps HELLO → INFO, and reads and replays back', () => {
    const { recorder, host, device, preambleEnd } = connection();
    device.push(ask(100, 2));
    const first = answer(1_000_000, 2_000_000, 2);
    host.push(first.subarray(0, 6));
    host.push(first.subarray(6));
    const from = recorder.mark();
    device.push(ask(200, 3));
    const second = answer(-3_000_000, 1_500_000, 3);
    host.push(second.subarray(0, 3));
    host.push(second.subarray(3));
    host.finish();
    device.finish();

    const whole = samplesFromArchive(recorder.toArchive());
    expect(Array.from(whole.codes)).toEqual([100, 200]);

    const bytes = recorder.excerpt(preambleEnd, from);
    const a = readArchive(bytes);
    expect(a.header.label).toBe('bench C');
    expect(a.streams['to-device']).toEqual(concat([hello, ask(200, 3)]));
    expect(a.streams['to-host']).toEqual(concat([infoFrame, second]));
    expect(a.records.filter((r) => r.type === 'profile')).toMatchObject([{ direction: 'to-host', offset: infoFrame.length, profile: p24 }]);
    expect(a.records.filter((r) => r.type === 'finish')).toHaveLength(2);
    const recorded = a.records.flatMap((r) => (r.type === 'frame' ? [{ direction: r.direction, frame: r.frame }] : []));
    expect(kinds(recorded, 'to-host')).toEqual([[Kind.Info, 1], [Kind.Results, 3]]);
    expect(recorded.find((f) => f.frame.kind === Kind.Results)?.frame.offset).toBe(infoFrame.length);

    const replay = replayArchive(bytes);
    expect(kinds(replay.frames, 'to-device')).toEqual([[Kind.Hello, 1], [Kind.One, 3]]);
    expect(replay.frames.filter((f) => f.direction === 'to-host')).toEqual(recorded.filter((f) => f.direction === 'to-host'));
    expect(replay.skips).toEqual([]);

    const run = samplesFromArchive(bytes);
    expect(run.info).toEqual(info);
    expect(Array.from(run.codes)).toEqual([200]);
    expect(Array.from(run.cos)).toEqual([-3_000_000]);
    expect(Array.from(run.sin)).toEqual([1_500_000]);
  });

  it('drops a late frame begun before the mark; its tail replays as a skip, not as a result', () => {
    const { recorder, host, device, preambleEnd } = connection();
    device.push(ask(100, 2));
    const late = answer(5, 6, 2);
    host.push(late.subarray(0, 5));
    const from = recorder.mark();
    host.push(late.subarray(5));
    device.push(ask(300, 2));
    host.push(answer(7, 8, 2));

    const bytes = recorder.excerpt(preambleEnd, from);
    const a = readArchive(bytes);
    const recorded = a.records.flatMap((r) => (r.type === 'frame' ? [{ direction: r.direction, frame: r.frame }] : []));
    expect(kinds(recorded, 'to-host')).toEqual([[Kind.Info, 1], [Kind.Results, 2]]);
    expect(recorded.find((f) => f.frame.kind === Kind.Results)?.frame.offset).toBe(infoFrame.length + late.length - 5);
    const replay = replayArchive(bytes);
    expect(replay.skips.map((s) => [s.event.reason, s.event.offset, s.event.bytes])).toEqual([['garbage', infoFrame.length, late.length - 5]]);
    const run = samplesFromArchive(bytes);
    expect(Array.from(run.codes)).toEqual([300]);
    expect(Array.from(run.cos)).toEqual([7]);
  });

  it('refuses marks out of order', () => {
    const { recorder, device, preambleEnd } = connection();
    device.push(ask(1, 2));
    expect(() => recorder.excerpt(recorder.mark(), preambleEnd)).toThrow(RangeError);
  });
});
