import { describe, expect, it } from 'vitest';
import { stripAnsi, TrafficLines } from '../../../src/features/bench/live/traffic-lines';

const filled = (capacity: number, count: number) => {
  const t = new TrafficLines(capacity);
  for (let i = 0; i < count; i++) t.push(`\x1b[36mline ${i}\x1b[0m ${i % 3 === 0 ? 'RESULTS' : 'a5 90'}`);
  return t;
};

describe('the traffic pane’s plain-text lines', () => {
  it('keeps the words without colour codes', () => {
    expect(stripAnsi('\x1b[90m12:00:00.000\x1b[0m \x1b[33mTX →\x1b[0m a5')).toBe('12:00:00.000 TX → a5');
    const t = filled(10, 1);
    expect(t.at(0)).toBe('line 0 RESULTS');
  });

  it('keeps only the newest lines up to its bound, numbered from the first ever written', () => {
    const t = filled(100, 250);
    expect(t.length).toBe(100);
    expect(t.first).toBe(150);
    expect(t.at(149)).toBeUndefined();
    expect(t.at(150)).toBe('line 150 RESULTS');
    expect(t.at(249)).toBe('line 249 RESULTS');
    expect(t.text().split('\n')).toHaveLength(100);
    expect(t.text(248).split('\n')).toEqual(['line 248 a5 90', 'line 249 RESULTS']);
  });

  it('finds the next and previous line holding a query, case-insensitively, wrapping round', () => {
    const t = filled(100, 10);
    expect(t.find('results', -1, 1)).toEqual({ line: 0, column: 7 });
    expect(t.find('results', 0, 1)?.line).toBe(3);
    expect(t.find('results', 9, 1)?.line).toBe(0);
    expect(t.find('results', t.written, -1)?.line).toBe(9);
    expect(t.find('results', 3, -1)?.line).toBe(0);
    expect(t.find('results', 0, -1)?.line).toBe(9);
    expect(t.find('no such text', -1, 1)).toBeNull();
    expect(t.count('RESULTS', 6)).toEqual({ total: 4, index: 3 });
  });

  it('searches only what is still kept', () => {
    const t = filled(5, 20);
    expect(t.find('line 3 ', -1, 1)).toBeNull();
    expect(t.find('line 16', -1, 1)?.line).toBe(16);
  });

  it('starts again from nothing when cleared', () => {
    const t = filled(5, 20);
    t.clear();
    expect(t.length).toBe(0);
    expect(t.written).toBe(0);
    expect(t.find('line', -1, 1)).toBeNull();
  });
});
