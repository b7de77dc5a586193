// The upload's sample format, the same as the runner's: one 12-byte record per answered result,
// angle code, cos and sin, each a little-endian int32, in request order. The runner's packer sits
// next to Node-only code, so the browser keeps this small copy of it.

/** Pack the answered results (`answered[i]` non-zero) for POST /api/sessions. */
export function packSamples(codes: ArrayLike<number>, cos: ArrayLike<number>, sin: ArrayLike<number>, answered: ArrayLike<number>): Uint8Array<ArrayBuffer> {
  let n = 0;
  for (let i = 0; i < codes.length; i++) if (answered[i]) n++;
  const out = new Uint8Array(n * 12);
  const view = new DataView(out.buffer);
  let at = 0;
  for (let i = 0; i < codes.length; i++) {
    if (!answered[i]) continue;
    // Unsigned angle codes above 2^31 keep their 32 bits.
    view.setInt32(at, codes[i] | 0, true);
    view.setInt32(at + 4, cos[i], true);
    view.setInt32(at + 8, sin[i], true);
    at += 12;
  }
  return out;
}

/** How many results were answered. */
export function answeredCount(answered: ArrayLike<number>): number {
  let n = 0;
  for (let i = 0; i < answered.length; i++) if (answered[i]) n++;
  return n;
}
