// A long soak in the runner keeps its memory bounded: 200 exhaustive passes of a 16-bit core
// (65,536 codes each, 13.1 million answers) against a flaky simulated board in this process,
// paced by a clock that runs eight times faster than real time (tests/support/fast-clock.ts).
import { describe, expect, it } from 'vitest';
import { runRunCommand } from '../../cli/run';
import { parseFlakyFault } from '../../mock-device/flaky-core';
import { fastClock } from '../support/fast-clock';
import { inProcessBoard } from '../support/in-process-board';

/**
 * The bound: 64 MB of heap at any pass end. Keeping every answer, even packed as two Int32 per
 * answer, would take 200 × 65,536 × 8 B ≈ 105 MB; the soak's books take about 1.4 MB (21 B a code)
 * plus one pass's buffers in flight.
 */
const HEAP_BOUND = 64 * 1024 * 1024;
const PASSES = 200;

describe('a 200-pass soak of 65,536 codes', () => {
  it(`keeps the heap under ${HEAP_BOUND / 2 ** 20} MB at every pass`, { timeout: 150_000 }, async () => {
    const clock = fastClock(8);
    const heap: number[] = [];
    let out = '';
    const io = {
      stdout: (t: string) => void (out += t),
      stderr: (t: string) => {
        if (t.startsWith('soak pass')) heap.push(process.memoryUsage().heapUsed);
      },
      readFile: () => '',
    };
    const openLink = async () => inProcessBoard({ baud: 20_000_000, flaky: parseFlakyFault('flaky:1e-5'), seed: 3 }, { clock }).link;
    const status = await runRunCommand(['--device', 'in-process', '--plan', 'exhaustive', '--core', 'reference-16', '--soak', String(PASSES), '--json'], io, { stderrIsTty: false, openLink });
    expect(status).toBe(0);
    const summary = JSON.parse(out);
    expect(summary.soak.summary).toMatchObject({ passes: PASSES, codesPerPass: 65_536, answered: PASSES * 65_536 });
    expect(summary.soak.unstable.count).toBeGreaterThan(0);
    expect(heap).toHaveLength(PASSES);
    expect(Math.max(...heap)).toBeLessThan(HEAP_BOUND);
  });
});
