import { describe, expect, it } from 'vitest';
import { LinkEvents, type ByteLink } from '../../../shared/bench/byte-link';
import { LinkEngine, type RunResult } from '../../../shared/bench/link-engine';
import { defaultBoardSettings, openBoardSession } from '../../../mock-device/board-session';
import { manualClock } from '../../support/manual-clock';

const TIMEOUT_MS = 100;

/**
 * The engine and the simulated board on one manual clock. The board's bytes can be held back,
 * as a socket's are while the host's event loop is blocked: they wait until `release()`.
 */
function bench() {
  const time = manualClock();
  const events = new LinkEvents();
  const held: Uint8Array[] = [];
  let holding = false;
  const session = openBoardSession({ ...defaultBoardSettings(), baud: 3_000_000 }, (b) => (holding ? held.push(b) : events.emitBytes(b)), time.clock);
  const link: ByteLink = {
    get closed() {
      return events.closed;
    },
    write: async (bytes) => {
      time.clock.after(0, () => session.receive(bytes));
    },
    onBytes: (l) => events.onBytes(l),
    onWarning: (l) => events.onWarning(l),
    onClose: (l) => events.onClose(l),
    close: async () => {
      session.close();
      events.emitClose({ requested: true, message: 'closed' });
    },
  };
  const engine = new LinkEngine({ link, clock: time.clock, baud: 3_000_000, timeoutMs: TIMEOUT_MS });
  const settle = () => new Promise((r) => setImmediate(r));
  return {
    engine,
    time,
    hold: () => (holding = true),
    release: () => {
      holding = false;
      for (const b of held.splice(0)) events.emitBytes(b);
    },
    /** Moves time on 1 ms at a time, letting promises settle between steps. */
    async run(ms: number) {
      for (let t = 0; t < ms; t++) {
        time.advance(1);
        await settle();
      }
    },
    settle,
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
    const hello = b.engine.hello();
    await b.run(20);
    await hello;
    const run = b.engine.run({ kind: 'codes', codes });
    await b.run(5);
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
    const hello = b.engine.hello();
    await b.run(20);
    await hello;
    const run = b.engine.run({ kind: 'codes', codes });
    await b.run(5);
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
