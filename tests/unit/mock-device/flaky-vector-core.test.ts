// The flaky fault on a vectoring board: one bit of the angle or of the magnitude flipped now and
// then, the same flips for the same seed, and every answer off the model one the board says it flipped.
import { describe, expect, it } from 'vitest';
import { LinkEngine } from '../../../shared/link-engine/link-engine';
import { createVectorModel, parseVectorConfig } from '../../../shared/vectoring';
import { parseFlakyFault } from '../../../mock-device/flaky-core';
import { createFlakyVectorCore, flipCodeBit, type VectorCoreFlip } from '../../../mock-device/flaky-vector-core';
import { createSimVectorCore } from '../../../mock-device/vector-core';
import { inProcessBoard, realEngineClock } from '../../support/in-process-board';

const GRID = { kind: 'grid', x0: -32768, dx: 1024, nx: 64, y0: -32768, dy: 1024, ny: 64 } as const;

/** A 64 × 64 grid on an in-process flaky vectoring board; the board's flips and the answers that left the model. */
async function flakyGrid(seed: number, rate = 'flaky:0.01') {
  const flips: VectorCoreFlip[] = [];
  const board = inProcessBoard({ baud: 12_000_000, vector: { core: {} }, flaky: parseFlakyFault(rate), seed, onVectorFlip: (f) => flips.push(f) });
  const engine = new LinkEngine({ link: board.link, clock: realEngineClock, baud: 12_000_000 });
  try {
    await engine.hello();
    await engine.modes();
    const r = await engine.runVectors(GRID).done;
    const model = createVectorModel({});
    const off: Array<{ x: number; y: number; angle: number; magnitude: number }> = [];
    for (let i = 0; i < r.xs.length; i++) {
      const m = model.answer(r.xs[i], r.ys[i]);
      if (m.angle !== r.angle[i] || m.magnitude !== r.magnitude[i]) off.push({ x: r.xs[i], y: r.ys[i], angle: r.angle[i], magnitude: r.magnitude[i] });
    }
    return { r, flips, off };
  } finally {
    await board.link.close();
  }
}

describe('a flaky vectoring board', { timeout: 30_000 }, () => {
  it('flips the same vectors for the same seed, and every answer off the model is one of its flips', async () => {
    const a = await flakyGrid(7);
    const b = await flakyGrid(7);
    const c = await flakyGrid(8);
    expect(a.r.status).toBe('complete');
    expect(a.r.figures.retries).toBe(0);
    // 4,096 answers at 1 %: about 41 flips (binomial, σ ≈ 6.4); far outside that would be a broken draw.
    expect(a.flips.length).toBeGreaterThan(15);
    expect(a.flips.length).toBeLessThan(80);
    const strip = (fs: VectorCoreFlip[]) => fs.map(({ atMs: _atMs, ...f }) => f);
    expect(strip(b.flips)).toEqual(strip(a.flips));
    expect(strip(c.flips)).not.toEqual(strip(a.flips));
    // What the host got wrong is exactly what the board says it flipped, answer for answer.
    expect(a.off).toEqual(a.flips.map((f) => ({ x: f.x, y: f.y, ...f.answer })));
    const model = createVectorModel({});
    for (const f of a.flips) expect(f.healthy).toEqual(model.answer(f.x, f.y));
  });

  it('flips exactly one bit of one output within its format, high bits more often, and stays healthy until its onset', () => {
    for (const config of [{}, { angleFormat: 'rad', angleBits: 16, angleFrac: 13 } as const]) {
      const v = parseVectorConfig(config);
      let now = 0;
      const seen: VectorCoreFlip[] = [];
      const core = createFlakyVectorCore(createSimVectorCore(config), parseFlakyFault('flaky:0.5@2'), { seed: 3, now: () => now, onFlip: (f) => seen.push(f) });
      for (let i = 0; i < 1000; i++) core.answer(i * 37 - 18_000, 9000 - i * 11);
      expect(seen).toEqual([]);
      now = 2000;
      for (let i = 0; i < 20_000; i++) core.answer(((i * 7919) % 65_536) - 32_768, ((i * 104_729) % 65_536) - 32_768);
      expect(seen.length).toBeGreaterThan(9000);
      expect(seen.some((f) => f.channel === 'angle') && seen.some((f) => f.channel === 'magnitude')).toBe(true);
      const signedAngle = v.angleFormat === 'rad';
      for (const f of seen) {
        const width = f.channel === 'angle' ? v.angleBits : v.magBits;
        const [a, h] = f.channel === 'angle' ? [f.answer.angle, f.healthy.angle] : [f.answer.magnitude, f.healthy.magnitude];
        // The other output is untouched; this one differs in exactly bit f.bit of its width.
        if (f.channel === 'angle') expect(f.answer.magnitude).toBe(f.healthy.magnitude);
        else expect(f.answer.angle).toBe(f.healthy.angle);
        expect(((a ^ h) & (2 ** width - 1)) >>> 0).toBe(2 ** f.bit);
        const signed = f.channel === 'magnitude' || signedAngle;
        expect(a).toBeGreaterThanOrEqual(signed ? -(2 ** (width - 1)) : 0);
        expect(a).toBeLessThan(signed ? 2 ** (width - 1) : 2 ** width);
      }
      const angleFlips = seen.filter((f) => f.channel === 'angle');
      expect(angleFlips.filter((f) => f.bit >= v.angleBits / 2).length).toBeGreaterThan(3 * angleFlips.filter((f) => f.bit < v.angleBits / 2).length);
    }
  });

  it('flips a code bit in two’s complement or unsigned as the format is', () => {
    // Worked by hand: -1 in 8 bits is 0xFF; bit 7 cleared gives 0x7F = 127. 0x80 unsigned with bit 7 cleared is 0.
    expect(flipCodeBit(-1, 8, true, 7)).toBe(127);
    expect(flipCodeBit(127, 8, true, 7)).toBe(-1);
    expect(flipCodeBit(128, 8, false, 7)).toBe(0);
    expect(flipCodeBit(0, 16, false, 15)).toBe(32_768);
    expect(flipCodeBit(5, 18, true, 1)).toBe(7);
  });
});
