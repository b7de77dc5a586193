import { describe, expect, it } from 'vitest';
import { LinePacer } from '../../../mock-device/line-pacer';
import { LineFaults, parseLineFaults } from '../../../mock-device/line-faults';
import { manualClock } from '../../support/manual-clock';

describe('the line pacer', () => {
  // 8N1 is 10 bit-times a byte: 3,000,000 baud carries 300,000 bytes/s (common practice, no source).
  it('never sends faster than baud/10 bytes per second', () => {
    const { clock, advance } = manualClock();
    const sent: number[] = [];
    const pacer = new LinePacer({ baud: 3_000_000, emit: (c) => sent.push(c.length), clock });
    pacer.write(new Uint8Array(100_000));
    for (let ms = 1; ms <= 400; ms++) {
      advance(1);
      const total = sent.reduce((a, b) => a + b, 0);
      expect(total).toBeLessThanOrEqual(Math.floor(ms * 300));
    }
    expect(sent.reduce((a, b) => a + b, 0)).toBe(100_000);
  });

  it('keeps up with the line rate: 100,000 bytes at 3 Mbaud take about 333 ms', () => {
    const { clock, advance } = manualClock();
    let total = 0;
    let doneAt = -1;
    let t = 0;
    const pacer = new LinePacer({ baud: 3_000_000, emit: (c) => (total += c.length), clock });
    pacer.write(new Uint8Array(100_000));
    while (total < 100_000 && t < 1000) {
      advance(1);
      t++;
    }
    doneAt = t;
    expect(doneAt).toBeGreaterThanOrEqual(333);
    expect(doneAt).toBeLessThanOrEqual(336);
  });

  it('delivers every byte once and in order, merged and split across chunks', () => {
    const { clock, advance } = manualClock();
    const out: number[] = [];
    const pacer = new LinePacer({ baud: 115_200, emit: (c) => out.push(...c), clock });
    const input = Array.from({ length: 5000 }, (_, i) => i & 0xff);
    for (let i = 0; i < input.length; i += 7) pacer.write(new Uint8Array(input.slice(i, i + 7)));
    advance(1000);
    expect(out).toEqual(input);
  });

  it('refuses a nonsensical baud rate with an error naming it', () => {
    expect(() => new LinePacer({ baud: 0, emit: () => undefined })).toThrow(/baud/);
  });
});

describe('line faults', () => {
  it('parses the documented option string and names a bad key', () => {
    expect(parseLineFaults('ber=1e-5,drop=1e-6,jitter-ms=2,seed=7')).toEqual({ ber: 1e-5, drop: 1e-6, jitterMs: 2, seed: 7 });
    expect(() => parseLineFaults('bre=1')).toThrow(/bre=1/);
    expect(() => parseLineFaults('ber=2')).toThrow(/probability/);
  });

  it('flips bits at about the requested rate, reproducibly from the seed', () => {
    const data = new Uint8Array(1_000_000);
    const a = new LineFaults(parseLineFaults('ber=1e-4,seed=3'));
    const b = new LineFaults(parseLineFaults('ber=1e-4,seed=3'));
    const out = a.corrupt(data);
    expect([...b.corrupt(data)]).toEqual([...out]);
    let flipped = 0;
    for (const byte of out) for (let bit = 0; bit < 8; bit++) flipped += (byte >> bit) & 1;
    // 8e6 bits at 1e-4: 800 expected; ±5σ (σ ≈ 28).
    expect(flipped).toBeGreaterThan(660);
    expect(flipped).toBeLessThan(940);
    expect(flipped).toBe(a.counts.bitsFlipped);
  });

  it('drops bytes at about the requested rate', () => {
    const f = new LineFaults(parseLineFaults('drop=1e-3,seed=9'));
    const out = f.corrupt(new Uint8Array(1_000_000));
    expect(1_000_000 - out.length).toBe(f.counts.bytesDropped);
    expect(f.counts.bytesDropped).toBeGreaterThan(850);
    expect(f.counts.bytesDropped).toBeLessThan(1150);
  });
});
