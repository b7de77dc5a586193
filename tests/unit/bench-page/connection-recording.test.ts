import { describe, expect, it } from 'vitest';
import { LinkEngine } from '../../../shared/link-engine/link-engine';
import { samplesFromArchive } from '../../../shared/link-engine/archive-samples';
import { Kind, readArchive, replayArchive } from '../../../shared/link';
import { ConnectionRecording } from '../../../src/features/bench/live/connection-recording';
import { inProcessBoard, realEngineClock } from '../../support/in-process-board';

/** The engine wired to a recording the way the Bench page wires them. */
async function recordedRun(count: number) {
  const board = inProcessBoard({ baud: 12_000_000 });
  const rec = new ConnectionRecording({ transport: 'in-process board', baud: 12_000_000, openedAt: '2026-03-01T10:00:00.000Z' });
  const now = () => realEngineClock.now();
  const frames: number[] = [];
  const engine = new LinkEngine({
    link: board.link,
    clock: realEngineClock,
    baud: 12_000_000,
    onTraffic: (d, bytes, at) => rec.traffic(d, bytes, at),
    onFrame: (f, at) => {
      frames.push(f.kind);
      rec.frame(f, at);
    },
    onSkip: (e, at) => rec.skip(e, at),
  });
  rec.info(await engine.hello(), now());
  const result = await engine.run({ kind: 'sweep', start: 100, step: 3, count }).done;
  return { board, rec, result, frames, engine, now };
}

describe('the capture of a bench connection', () => {
  it('holds every byte each way, from HELLO on, and replays to the same frames', async () => {
    const { board, rec, result, frames, engine, now } = await recordedRun(4096);
    expect(result.status).toBe('complete');
    await board.link.close();
    rec.finish(now());
    const bytes = rec.toArchive();
    const archive = readArchive(bytes);
    expect(JSON.parse(archive.header.label)).toEqual({ recordedBy: 'anglebench bench', transport: 'in-process board', baud: 12_000_000, openedAt: '2026-03-01T10:00:00.000Z' });
    expect(archive.streams['to-device'].length).toBe(engine.figures.bytesSent);
    expect(archive.streams['to-host'].length).toBe(engine.figures.bytesReceived);
    const replayed = replayArchive(bytes).frames.filter((f) => f.direction === 'to-host');
    expect(replayed.map((f) => f.frame.kind)).toEqual(frames);
    expect(archive.records.filter((r) => r.type === 'profile')).toHaveLength(2);
    expect(archive.records.filter((r) => r.type === 'finish')).toHaveLength(2);
  });

  it('scores again from the archive alone to the run’s own answers', async () => {
    const { board, rec, result } = await recordedRun(2048);
    await board.link.close();
    const found = samplesFromArchive(rec.toArchive());
    expect(Array.from(found.codes)).toEqual(Array.from(result.codes));
    expect(found.cos).toEqual(result.cos);
    expect(found.sin).toEqual(result.sin);
  });

  it('gives a run the preamble and its own traffic only, the earlier run left out', async () => {
    const { board, rec, engine } = await recordedRun(512);
    rec.markRun();
    const second = await engine.run({ kind: 'codes', codes: Float64Array.of(7, 9000, 41) }).done;
    await board.link.close();
    const run = samplesFromArchive(rec.runArchive());
    expect(run.info?.name).toBe(engine.info?.name);
    expect(Array.from(run.codes)).toEqual([7, 9000, 41]);
    expect(run.cos).toEqual(second.cos);
    expect(samplesFromArchive(rec.toArchive()).codes.length).toBe(512 + 3);
  });

  it('gives a soak the preamble and its traffic from a pass start taken earlier: the latest whole pass on', async () => {
    const { board, rec, engine } = await recordedRun(512);
    const second = rec.mark();
    const pass2 = await engine.run({ kind: 'codes', codes: Float64Array.of(5, 6) }).done;
    const third = rec.mark();
    await engine.run({ kind: 'codes', codes: Float64Array.of(70, 80, 90) }).done;
    // Pass 2 was whole when pass 3 started, and pass 3 was cut: the capture runs from pass 2 on.
    rec.markRun(second);
    await board.link.close();
    expect(Array.from(samplesFromArchive(rec.runArchive()).codes)).toEqual([5, 6, 70, 80, 90]);
    expect(samplesFromArchive(rec.runArchive()).cos.subarray(0, 2)).toEqual(pass2.cos);
    rec.markRun(third);
    expect(Array.from(samplesFromArchive(rec.runArchive()).codes)).toEqual([70, 80, 90]);
  });

  it('records nothing after the link has closed', async () => {
    const { board, rec, now } = await recordedRun(256);
    await board.link.close();
    rec.finish(now());
    const before = rec.byteLength;
    rec.traffic('rx', Uint8Array.of(1, 2, 3), now());
    expect(rec.byteLength).toBe(before);
  });

  it("keeps a vectoring board's formats in a run's archive (version 2), so its VEC_RESULTS replay at their own widths", async () => {
    // 20-bit angles: 3-byte angle fields where the default core has 2.
    const board = inProcessBoard({ baud: 12_000_000, vector: { core: { inBits: 12, angleBits: 20 } } });
    const rec = new ConnectionRecording({ transport: 'in-process board', baud: 12_000_000, openedAt: '2026-03-01T10:00:00.000Z' });
    const now = () => realEngineClock.now();
    const engine = new LinkEngine({
      link: board.link,
      clock: realEngineClock,
      baud: 12_000_000,
      onTraffic: (d, bytes, at) => rec.traffic(d, bytes, at),
      onFrame: (f, at) => rec.frame(f, at),
      onSkip: (e, at) => rec.skip(e, at),
    });
    rec.info(await engine.hello(), now());
    const modes = await engine.modes();
    rec.modes(modes, now());
    rec.markRun();
    const r = await engine.runVectors({ kind: 'grid', x0: -2048, dx: 128, nx: 32, y0: -2048, dy: 128, ny: 32 }).done;
    expect(r.status).toBe('complete');
    await board.link.close();
    const replay = replayArchive(rec.runArchive());
    expect(replay.archive.version).toBe(2);
    expect(replay.archive.records.flatMap((x) => (x.type === 'vector-formats' ? [x.formats] : []))).toEqual([modes.vectoring, modes.vectoring]);
    expect(replay.skips).toEqual([]);
    const pair = 3 + Math.ceil(modes.vectoring!.magBits / 8);
    const answers = replay.frames.filter((f) => f.direction === 'to-host' && f.frame.kind === Kind.VecResults).reduce((n, f) => n + (f.frame.payload.length - 4) / pair, 0);
    expect(answers).toBe(1024);
  });
});
