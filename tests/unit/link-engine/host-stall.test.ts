import { describe, expect, it } from 'vitest';
import { LinkEngine, type RunResult } from '../../../shared/link-engine/link-engine';
import { inProcessBoard } from '../../support/in-process-board';
import { manualClock } from '../../support/manual-clock';

const TIMEOUT_MS = 100;

/**
 * The engine and the simulated board on one manual clock. The board's bytes can be held back,
 * as a socket's are while the host's event loop is blocked: they wait until `release()`.
 */
function bench() {
  const time = manualClock();
  const held: Uint8Array[] = [];
  let holding = false;
  let emitToHost: (bytes: Uint8Array) => void = () => {};
  const { link } = inProcessBoard(
    { baud: 3_000_000 },
    {
      clock: time.clock,
      toHost: (bytes, emit) => {
        emitToHost = emit;
        if (holding) held.push(bytes);
        else emit(bytes);
      },
    },
  );
  const engine = new LinkEngine({ link, clock: time.clock, baud: 3_000_000, timeoutMs: TIMEOUT_MS });
  const settle = () => new Promise((r) => setImmediate(r));
  /** Moves time on 1 ms at a time, letting promises settle between steps. */
  const run = async (ms: number) => {
    for (let t = 0; t < ms; t++) {
      time.advance(1);
      await settle();
    }
  };
  return {
    engine,
    time,
    run,
    settle,
    hold: () => (holding = true),
    release: () => {
      holding = false;
      for (const b of held.splice(0)) emitToHost(b);
    },
    /** HELLO, then a LIST run of `codes` a few milliseconds under way. */
    async startRun(codes: number[]) {
      const hello = engine.hello();
      await run(20);
      await hello;
      const handle = engine.run({ kind: 'codes', codes });
      await run(5);
      return handle;
    },
  };
}

async function finish(b: ReturnType<typeof bench>, done: Promise<RunResult>): Promise<RunResult> {
  let result: RunResult | null = null;
  void done.then((r) => (result = r));
  for (let ms = 0; ms < 5000 && !result; ms++) await b.run(1);
  if (!result) throw new Error('the run did not finish in 5 s of clock time');
  return result;
}

describe('a run when the host stalls', () => {
  const codes = Array.from({ length: 3000 }, (_, i) => (i * 40_503) % 65_536);

  it('does not take a blocked event loop for a silent line: no request is retried', async () => {
    const b = bench();
    const run = await b.startRun(codes);
    // The host freezes for ten timeouts; the board goes on answering into the socket.
    b.hold();
    b.time.stall(10 * TIMEOUT_MS);
    await b.settle();
    b.release();
    const result = await finish(b, run.done);
    expect(result.status).toBe('complete');
    expect(result.missing).toEqual([]);
    expect(result.figures.retries).toBe(0);
  });

  it('still declares requests lost when the line really is silent, and asks again', async () => {
    const b = bench();
    const run = await b.startRun(codes);
    // The host keeps running on time, but nothing arrives for three timeouts.
    b.hold();
    await b.run(3 * TIMEOUT_MS);
    b.release(); // the answers that do arrive late are duplicates or overtaken, and ignored
    const result = await finish(b, run.done);
    expect(result.status).toBe('complete');
    expect(result.missing).toEqual([]);
    expect(result.figures.retries).toBeGreaterThan(0);
  });
});
