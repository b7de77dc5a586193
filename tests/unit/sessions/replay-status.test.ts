import { describe, expect, it } from 'vitest';
import { framesBefore, statusText, type ReplayStatus } from '../../../src/features/sessions/capture/replay-status';
import { encodeMessage, Kind, readArchive, RecordedDecoder, Recorder } from '../../../shared/link';

const base: ReplayStatus = { phase: 'idle', framesTotal: 1057, framesShown: 0, records: 2114, durationS: 6.4, elapsedS: 0, speed: 1 };

describe('the capture pane status line', () => {
  it('says what the capture holds while browsing, with thousands grouped', () => {
    expect(statusText(base)).toBe('1,057 frames in 2,114 records, 6.4 s of traffic');
    expect(statusText({ ...base, direction: 'to the device', framesTotal: 1, records: 1, durationS: 0 })).toBe('1 frame in 1 record to the device, 0.0 s of traffic');
  });

  it('counts frames and seconds while replaying, and names a speed other than as recorded', () => {
    expect(statusText({ ...base, phase: 'replaying', framesShown: 120, elapsedS: 0.84 })).toBe('Replaying: frame 120 of 1,057, 0.8 s of 6.4 s');
    expect(statusText({ ...base, phase: 'replaying', framesShown: 1000, elapsedS: 5.96, speed: 16 })).toBe('Replaying 16× faster: frame 1,000 of 1,057, 6.0 s of 6.4 s');
  });

  it('says when silences are being skipped, while its seconds stay in recorded time', () => {
    const run = { ...base, phase: 'replaying' as const, framesTotal: 60, framesShown: 5, durationS: 151, elapsedS: 150.34, skipSilences: true };
    expect(statusText(run)).toBe('Replaying, skipping silences: frame 5 of 60, 150.3 s of 151.0 s');
    expect(statusText({ ...run, speed: 4 })).toBe('Replaying 4× faster, skipping silences: frame 5 of 60, 150.3 s of 151.0 s');
    expect(statusText({ ...run, phase: 'stopped' })).toBe('Stopped at frame 5 of 60, 150.3 s of 151.0 s');
  });

  it('counts records where the listed direction has no recorded frames (the requests of a bench capture)', () => {
    const requests = { ...base, framesTotal: 0, records: 6, durationS: 6.8, direction: 'to the device' };
    expect(statusText(requests)).toBe('No decoded frames recorded in 6 records to the device, 6.8 s of traffic');
    expect(statusText({ ...requests, phase: 'replaying', recordsShown: 2, elapsedS: 6.1 })).toBe('Replaying: record 2 of 6, 6.1 s of 6.8 s');
    expect(statusText({ ...requests, phase: 'finished', recordsShown: 6, elapsedS: 6.8 })).toBe('Replay finished: 6 records, 6.8 s of traffic');
  });

  it('never says more time has passed than the capture lasts', () => {
    // The last tick lands after the last record, by up to a frame of wall time times the speed.
    expect(statusText({ ...base, phase: 'replaying', framesShown: 1057, elapsedS: 7.3, speed: 64 })).toContain('6.4 s of 6.4 s');
  });

  it('says where a stopped replay stopped, and when a replay has finished', () => {
    expect(statusText({ ...base, phase: 'stopped', framesShown: 120, elapsedS: 1.25 })).toBe('Stopped at frame 120 of 1,057, 1.3 s of 6.4 s');
    expect(statusText({ ...base, phase: 'finished', framesShown: 1057, elapsedS: 6.4 })).toBe('Replay finished: 1,057 frames, 6.4 s of traffic');
  });
});

describe('frames counted ahead of each record', () => {
  it('counts only frame records, not the chunks they came in', () => {
    const recorder = new Recorder({});
    const device = new RecordedDecoder({ recorder, direction: 'to-device', nowMs: () => 0, onFrame: () => undefined });
    const p = { angleFormat: 'turn' as const, angleBits: 16, outBits: 16 };
    device.push(encodeMessage({ kind: Kind.Hello }, 1, p));
    device.push(Uint8Array.of(0x00, 0x00, 0x00)); // noise: a chunk, no frame
    device.push(encodeMessage({ kind: Kind.One, angleCode: 4096 }, 2, p));
    const { records } = readArchive(recorder.toArchive());
    const before = framesBefore(records);
    expect(before.length).toBe(records.length + 1);
    expect(before[records.length]).toBe(2);
    // Each step adds one exactly where the record is a frame.
    records.forEach((r, i) => expect(before[i + 1] - before[i]).toBe(r.type === 'frame' ? 1 : 0));
    expect(records.filter((r) => r.type === 'chunk').length).toBeGreaterThanOrEqual(3);
  });
});
