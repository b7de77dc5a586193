// The CORDIC iteration's shift, as both models (rotation and vectoring) define it: v · 2^−i,
// floored as an arithmetic right shift floors, or with `nearest` shift rounding from the second
// iteration on, 2^(i−1) added first (docs/model.md). On doubles the shift is a multiply by 2^−i,
// exact, as dividing by 2^i is, on integers below 2^53 and cheaper in the loop.

// Both configurations allow at most 40 iterations; 64 leaves room.
const POW2 = Float64Array.from({ length: 64 }, (_, i) => 2 ** i);
const INV_POW2 = POW2.map((p) => 1 / p);

/** v · 2^−i with the core's shift rounding, for integers v below 2^53 in magnitude. */
export function shiftRound(v: number, i: number, nearest: boolean): number {
  return nearest && i > 0 ? Math.floor((v + POW2[i - 1]) * INV_POW2[i]) : Math.floor(v * INV_POW2[i]);
}

/**
 * The same step for 32-bit paths, whose shift is `>>`: `(v + add[i]) >> i` equals
 * shiftRound(v, i, nearest) wherever v + add[i] stays a 32-bit integer.
 */
export function shiftRoundAddends32(iterations: number, nearest: boolean): Int32Array {
  return Int32Array.from({ length: iterations }, (_, i) => (nearest && i > 0 ? 2 ** (i - 1) : 0));
}
