import { describe, expect, it } from 'vitest';
import { ChunkCoalescer } from '../../../shared/link-engine/chunk-coalescer';
import { manualClock } from '../../support/manual-clock';

const bytes = (...v: number[]) => Uint8Array.from(v);

describe('ChunkCoalescer', () => {
  it('holds small chunks until the delay passes, then sends them as one, in order', () => {
    const { clock, advance } = manualClock();
    const out: number[][] = [];
    const c = new ChunkCoalescer({ clock, emit: (b) => out.push([...b]), maxDelayMs: 5, flushBytes: 100 });
    c.push(bytes(1, 2));
    advance(2);
    c.push(bytes(3));
    advance(2);
    expect(out).toEqual([]);
    advance(1); // 5 ms after the first byte
    expect(out).toEqual([[1, 2, 3]]);
    c.push(bytes(4));
    advance(5);
    expect(out).toEqual([[1, 2, 3], [4]]);
  });

  it('sends at once when enough bytes wait, and no empty chunk afterwards', () => {
    const { clock, advance, pending } = manualClock();
    const out: number[][] = [];
    const c = new ChunkCoalescer({ clock, emit: (b) => out.push([...b]), maxDelayMs: 5, flushBytes: 4 });
    c.push(bytes(1, 2));
    c.push(bytes(3, 4, 5));
    expect(out).toEqual([[1, 2, 3, 4, 5]]);
    expect(pending()).toBe(0);
    advance(10);
    expect(out).toHaveLength(1);
  });

  it('keeps every byte across many pushes and loses none at flush', () => {
    const { clock, advance } = manualClock();
    const got: number[] = [];
    const c = new ChunkCoalescer({ clock, emit: (b) => got.push(...b), maxDelayMs: 3, flushBytes: 64 });
    const sent: number[] = [];
    for (let i = 0; i < 1000; i++) {
      const chunk = Array.from({ length: i % 7 }, (_, k) => (i + k) & 0xff);
      sent.push(...chunk);
      c.push(Uint8Array.from(chunk));
      if (i % 5 === 0) advance(1);
    }
    c.flush();
    expect(got).toEqual(sent);
  });

  it('drops what waits and ignores later pushes once closed', () => {
    const { clock, advance, pending } = manualClock();
    const out: number[][] = [];
    const c = new ChunkCoalescer({ clock, emit: (b) => out.push([...b]) });
    c.push(bytes(9));
    c.close();
    expect(pending()).toBe(0);
    c.push(bytes(10));
    advance(100);
    expect(out).toEqual([]);
  });
});
