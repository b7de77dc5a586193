import { describe, expect, it } from 'vitest';
import { LinkEngine } from '../../../shared/link-engine/link-engine';
import { createCordicModel } from '../../../shared/numeric';
import { parseLineFaults } from '../../../mock-device/line-faults';
import { parseCoreFault } from '../../../mock-device/faulty-core';
import { inProcessBoard, realEngineClock } from '../../support/in-process-board';
import { manualClock } from '../../support/manual-clock';

const model = createCordicModel({});

function expectBitExact(result: { codes: Float64Array; cos: Int32Array; sin: Int32Array; answered: Uint8Array }) {
  const cos = new Int32Array(result.codes.length);
  const sin = new Int32Array(result.codes.length);
  model.evaluateInto(result.codes, cos, sin);
  let mismatches = 0;
  for (let i = 0; i < cos.length; i++) if (result.answered[i] && (cos[i] !== result.cos[i] || sin[i] !== result.sin[i])) mismatches++;
  return mismatches;
}

async function connect(overrides: Parameters<typeof inProcessBoard>[0] = {}, baud = 12_000_000) {
  const board = inProcessBoard({ baud, ...overrides });
  const engine = new LinkEngine({ link: board.link, clock: realEngineClock, baud, timeoutMs: 100 });
  const info = await engine.hello();
  return { board, engine, info };
}

describe('the link engine against the simulated board, in process', () => {
  it('says HELLO and reads the INFO of the default core', async () => {
    const { info, board } = await connect();
    expect(info).toMatchObject({ version: 1, angleFormat: 'turn', angleBits: 16, outBits: 16, outFrac: 14, iterations: 16, queueDepth: 256 });
    await board.link.close();
  });

  it('runs an exhaustive 16-bit sweep bit-exact with the model, every code once', async () => {
    const { engine, board } = await connect();
    let delivered = 0;
    const run = engine.run({ kind: 'sweep', start: 0, step: 1, count: 65_536 }, { onResults: (b) => (delivered += b.indexes.length) });
    const result = await run.done;
    expect(result.status).toBe('complete');
    expect(result.missing).toEqual([]);
    expect(delivered).toBe(65_536);
    expect(result.answered.every((a) => a === 1)).toBe(true);
    expect(expectBitExact(result)).toBe(0);
    expect(result.figures.retries).toBe(0);
    await board.link.close();
  });

  it('keeps LIST requests within the queue depth and gets every code of a list once', async () => {
    const { engine, board } = await connect({ queueDepth: 100 });
    const codes = Array.from({ length: 5000 }, (_, i) => (i * 7919) % 65_536);
    const result = await engine.run({ kind: 'codes', codes }).done;
    expect(result.status).toBe('complete');
    expect(result.missing).toEqual([]);
    expect(result.figures.naks[5]).toBe(0);
    expect(expectBitExact(result)).toBe(0);
    await board.link.close();
  });

  it('with bit errors and dropped bytes still ends with every code answered exactly once', async () => {
    const lineFaults = parseLineFaults('ber=1e-4,drop=1e-5,jitter-ms=1,seed=7');
    const { engine, board } = await connect({ lineFaults });
    let delivered = 0;
    const result = await engine.run({ kind: 'sweep', start: 0, step: 1, count: 65_536 }, { onResults: (b) => (delivered += b.indexes.length) }).done;
    expect(result.status).toBe('complete');
    expect(result.missing).toEqual([]);
    expect(delivered).toBe(65_536); // never counted twice
    expect(result.figures.checkFailures).toBeGreaterThan(0);
    expect(result.figures.retries).toBeGreaterThan(0);
    await board.link.close();
  });

  it('shows a missing quadrant fold as errors only beyond ±90°', async () => {
    const { engine, board } = await connect({ coreFault: parseCoreFault('fold') });
    const result = await engine.run({ kind: 'sweep', start: 0, step: 1, count: 65_536 }).done;
    let inside = 0;
    let outside = 0;
    const cos = new Int32Array(65_536);
    const sin = new Int32Array(65_536);
    model.evaluateInto(result.codes, cos, sin);
    for (let i = 0; i < 65_536; i++) {
      if (cos[i] === result.cos[i] && sin[i] === result.sin[i]) continue;
      const signed = i >= 32_768 ? i - 65_536 : i;
      if (Math.abs(signed) <= 16_384) inside++;
      else outside++;
    }
    expect(inside).toBe(0);
    expect(outside).toBeGreaterThan(10_000);
    await board.link.close();
  });

  it('answers a code outside the angle range with NAK 6 and lists it missing', async () => {
    const { engine, board } = await connect({ core: { angleBits: 12 } });
    const result = await engine.run({ kind: 'codes', codes: [1, 2, 5000] }).done;
    expect(result.missing.map((m) => [m.code, m.reason])).toContainEqual([5000, 'angle out of range']);
    expect(result.figures.naks[6]).toBeGreaterThan(0);
    await board.link.close();
  });

  it('pauses, resumes and aborts a long sweep', async () => {
    // The engine and the board on one manual clock: time moves only when the test moves it.
    const time = manualClock();
    const board = inProcessBoard({ baud: 921_600 }, { clock: time.clock });
    const engine = new LinkEngine({ link: board.link, clock: time.clock, baud: 921_600, timeoutMs: 100 });
    const step = async (ms: number) => {
      for (let t = 0; t < ms; t++) {
        time.advance(1);
        await new Promise((r) => setImmediate(r));
      }
    };
    /** Moves time on until `p` settles (at most `maxMs` of clock time). */
    const until = async <T>(p: Promise<T>, maxMs = 1000): Promise<T> => {
      let settled = false;
      void p.finally(() => (settled = true)).catch(() => undefined);
      for (let t = 0; t < maxMs && !settled; t++) await step(1);
      if (!settled) throw new Error(`still waiting after ${maxMs} ms of clock time`);
      return p;
    };
    await until(engine.hello());
    const run = engine.run({ kind: 'sweep', start: 0, step: 1, count: 65_536 });
    await step(100); // at 921,600 baud, about 2,200 results' worth of line time
    await until(run.pause());
    const atPause = run.progress().answered;
    expect(atPause).toBeGreaterThan(1000);
    await step(200);
    expect(run.progress().answered - atPause).toBeLessThan(1500); // what was already on the line
    const afterPause = run.progress().answered;
    await step(200);
    expect(run.progress().answered).toBe(afterPause); // the line is quiet while paused
    await until(run.resume());
    await step(100);
    expect(run.progress().answered).toBeGreaterThan(afterPause + 1000);
    await until(run.abort());
    const result = await until(run.done);
    expect(result.status).toBe('aborted');
    expect(result.missing.length + result.answered.reduce((a, b) => a + b, 0)).toBe(65_536);
    expect(result.missing.every((m) => m.reason === 'aborted')).toBe(true);
    await board.link.close();
  });
});
