// How the Bench page tunes the link engine for a browser tab rather than a command-line runner.

/**
 * Silence that counts as loss. A page's main thread can stall for several hundred ms (GC, layout,
 * a busy machine) while replies wait in its queue; at the engine's 300 ms default such a stall
 * re-requests everything in flight. Overtaken requests are still detected at once.
 */
export const LOSS_SILENCE_MS = 1000;

/**
 * Codes per SWEEP request: about a quarter second of results at the line rate (a result is about
 * 4 bytes on a 16-bit profile), as a power of two, at least the engine's 8,192. The engine keeps
 * two segments in flight, so the board has one queued while the page works: with ~0.1 s segments
 * a page stall longer than that left the line idle. Longer ones cost more when a loss is declared,
 * since what the segment still lacks is asked again.
 */
export function sweepSegmentFor(baud: number): number {
  const perQuarterSecond = baud / 10 / 4 / 4;
  return Math.max(8192, 2 ** Math.round(Math.log2(Math.max(1, perQuarterSecond))));
}
