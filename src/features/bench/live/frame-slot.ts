// The Bench page changes what it shows in the same animation frames: charts, traffic and the
// figures React renders each move at most once per slot, in the first frame of that slot. Every
// requestAnimationFrame callback of one frame gets the same time stamp, so each part, deciding on
// its own, picks the same frame: the page lays out, paints and commits a few times a second, not
// once for each part at its own moment.

export const FRAME_SLOT_MS = 250;

/** The slot a frame's time stamp falls in. */
export const frameSlot = (frameTimeMs: number) => Math.floor(frameTimeMs / FRAME_SLOT_MS);

/** True on the first frame of each new slot (and on the very first call). */
export function slotGate(): (frameTimeMs: number) => boolean {
  let last = -Infinity;
  return (frameTimeMs) => {
    const slot = frameSlot(frameTimeMs);
    if (slot === last) return false;
    last = slot;
    return true;
  };
}
