// How long a soak runs: a number of passes of the plan, or a duration (the pass in progress when
// it runs out is finished, so every pass is whole).
export type SoakSpec = { kind: 'passes'; passes: number } | { kind: 'duration'; ms: number };

export const MAX_SOAK_PASSES = 1_000_000;
/** A week: longer than any chamber soak a lab leaves unattended. Common practice, no source. */
export const MAX_SOAK_MS = 7 * 24 * 3600 * 1000;

export class SoakSpecError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'SoakSpecError';
  }
}

const UNIT_MS: Record<string, number> = { s: 1000, m: 60_000, h: 3_600_000 };

/** `50` (passes), or `90s`, `30m`, `2h` (a duration). */
export function parseSoakSpec(text: string): SoakSpec {
  const t = text.trim();
  const passes = /^\d+$/.exec(t);
  if (passes) {
    const n = Number(t);
    if (n === 0) throw new SoakSpecError('a soak needs at least 1 pass, got 0');
    if (n > MAX_SOAK_PASSES) throw new SoakSpecError(`a soak is at most ${MAX_SOAK_PASSES.toLocaleString('en-US')} passes, got ${t}`);
    return { kind: 'passes', passes: n };
  }
  const d = /^(\d+(?:\.\d+)?)([smh])$/.exec(t);
  if (!d) throw new SoakSpecError(`a soak is a number of passes (50) or a duration (90s, 30m, 2h), got "${text}"`);
  const ms = Math.round(Number(d[1]) * UNIT_MS[d[2]]);
  if (ms < 1000) throw new SoakSpecError(`a soak lasts at least 1 s, got "${t}"`);
  if (ms > MAX_SOAK_MS) throw new SoakSpecError(`a soak lasts at most 7 days, got "${t}"`);
  return { kind: 'duration', ms };
}

/** Whether another pass starts: after `done` passes, `elapsedMs` into the soak. */
export function soakWantsAnotherPass(spec: SoakSpec, done: number, elapsedMs: number): boolean {
  return spec.kind === 'passes' ? done < spec.passes : elapsedMs < spec.ms;
}

export function describeSoak(spec: SoakSpec): string {
  if (spec.kind === 'passes') return `${spec.passes} pass${spec.passes === 1 ? '' : 'es'}`;
  const s = spec.ms / 1000;
  if (s % 3600 === 0) return `${s / 3600} h`;
  if (s % 60 === 0) return `${s / 60} min`;
  return `${s} s`;
}
