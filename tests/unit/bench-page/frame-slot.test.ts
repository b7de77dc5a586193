import { describe, expect, it } from 'vitest';
import { FRAME_SLOT_MS, slotGate } from '../../../src/features/bench/live/frame-slot';

describe('the Bench page’s frame slots', () => {
  it('opens on the first frame of each slot and on no other', () => {
    const gate = slotGate();
    // Frames 16.7 ms apart from t = 1000 ms, as a 60 Hz display gives them.
    const times = Array.from({ length: 60 }, (_, i) => 1000 + i * (1000 / 60));
    const opened = times.filter((t) => gate(t));
    expect(opened.map((t) => Math.floor(t / FRAME_SLOT_MS))).toEqual([4, 5, 6, 7]);
    // Each is the first frame of its slot: the frame before it lies in the slot before.
    for (const t of opened.slice(1)) expect(Math.floor((t - 1000 / 60) / FRAME_SLOT_MS)).toBe(Math.floor(t / FRAME_SLOT_MS) - 1);
  });

  it('gives two loops that see the same frames the same answer', () => {
    const a = slotGate();
    const b = slotGate();
    const times = [0, 100, 240, 251, 260, 499, 500, 1200, 1201];
    expect(times.map(a)).toEqual(times.map(b));
    expect(times.map((t, i) => (i === 0 ? true : Math.floor(t / FRAME_SLOT_MS) !== Math.floor(times[i - 1] / FRAME_SLOT_MS)))).toEqual(times.map(slotGate()));
  });
});
