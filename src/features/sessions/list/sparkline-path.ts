// The SVG path of a session's error profile: one point per angle bin (largest |error| in LSB),
// broken where a bin has no sample (-1). Cheap enough for a row of every list page.

export interface Sparkline {
  /** Path data, "" when no bin has a sample. */
  d: string;
  /** The LSB value at the top of the box. */
  topLsb: number;
  /** Largest value drawn, null when none. */
  maxLsb: number | null;
}

const round = (v: number) => Math.round(v * 10) / 10;

/**
 * @param profile bins in angle order; a negative value means "no sample in this bin"
 * @param topLsb  the value at the top edge (e.g. the core's limit); the data's max if larger
 */
export function sparklinePath(profile: readonly number[], widthPx: number, heightPx: number, topLsb = 0): Sparkline {
  let max: number | null = null;
  for (const v of profile) if (v >= 0 && Number.isFinite(v) && (max === null || v > max)) max = v;
  const top = Math.max(topLsb, max ?? 0) || 1;
  const n = profile.length;
  const xOf = (i: number) => round(((i + 0.5) / n) * widthPx);
  // 1 px kept clear at the top and bottom so a flat line at 0 or at the top is still seen.
  const yOf = (v: number) => round(heightPx - 1 - (v / top) * (heightPx - 2));
  const parts: string[] = [];
  let run: number[] = [];
  const flush = () => {
    if (run.length === 1) {
      // A lone bin: a short dash, since a one-point path draws nothing.
      const [i] = run;
      parts.push(`M${round(xOf(i) - 1)} ${yOf(profile[i])}H${round(xOf(i) + 1)}`);
    } else if (run.length > 1) {
      parts.push(run.map((i, k) => `${k === 0 ? 'M' : 'L'}${xOf(i)} ${yOf(profile[i])}`).join(''));
    }
    run = [];
  };
  for (let i = 0; i < n; i++) {
    const v = profile[i];
    if (v >= 0 && Number.isFinite(v)) run.push(i);
    else flush();
  }
  flush();
  return { d: parts.join(''), topLsb: top, maxLsb: max };
}
