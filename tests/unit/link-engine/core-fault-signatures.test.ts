import { describe, expect, it } from 'vitest';
import { LinkEngine } from '../../../shared/link-engine/link-engine';
import { ScoreAccumulator } from '../../../shared/numeric';
import { parseCoreFault } from '../../../mock-device/faulty-core';
import { inProcessBoard, realEngineClock } from '../../support/in-process-board';

/** An exhaustive run against a board with one core fault, scored against the healthy model. */
async function scoreFault(fault?: string) {
  const board = inProcessBoard({ baud: 12_000_000, coreFault: fault ? parseCoreFault(fault) : undefined });
  const engine = new LinkEngine({ link: board.link, clock: realEngineClock, baud: 12_000_000 });
  await engine.hello();
  const result = await engine.run({ kind: 'sweep', start: 0, step: 1, count: 65_536 }).done;
  await board.link.close();
  expect(result.missing).toEqual([]);
  return new ScoreAccumulator({}, { keepMismatches: 100_000 }).add(result.codes, result.cos, result.sin).summary();
}

describe('each core fault shows the signature an engineer would expect', () => {
  it('a healthy board has no model mismatch and full coverage', async () => {
    const s = await scoreFault();
    expect(s.mismatches.count).toBe(0);
    expect(s.coverage.share).toBe(1);
  });

  it('stuck:0 (output bit 0 stuck at 1) disagrees only by one LSB, on about half the codes', async () => {
    const s = await scoreFault('stuck:0');
    expect(s.mismatches.maxAbsDiffLsb).toBe(1);
    expect(s.mismatches.count).toBeGreaterThan(65_536 * 0.4);
  });

  it('gain (start value for 2 iterations) makes the magnitude about 4% high, the phase stays right', async () => {
    const s = await scoreFault('gain');
    expect(s.mismatches.count).toBeGreaterThan(60_000);
    // K_2 / K_16 = 0.6325 / 0.6073 ≈ 1.041 (K_n as in docs/references.md "CORDIC, rotation mode": Volder; Walther).
    expect(s.magnitude.mean).toBeGreaterThan(0.035);
    expect(s.magnitude.mean).toBeLessThan(0.047);
    // The phase of a scaled vector is unchanged: within a few LSB of angle.
    expect(s.phase.maxAbsRad).toBeLessThan(1e-3);
  });

  it('sign:5 (iteration 5 turns the wrong way) puts a large phase error on every code', async () => {
    const s = await scoreFault('sign:5');
    expect(s.mismatches.count).toBeGreaterThan(60_000);
    // Turning the wrong way at i = 5 misplaces the angle by 2·atan(2^-5) ≈ 0.0625 rad (Volder's
    // micro-rotation angles; later iterations can make up at most Σ_{i>5} atan 2^-i ≈ 0.031 rad).
    expect(s.phase.maxAbsRad).toBeGreaterThan(0.02);
  });
});
