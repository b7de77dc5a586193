// When a station tries the server again after losing it: exponential, capped, with jitter so a
// lab's stations do not all knock at the same instant when the server comes back. "Equal jitter":
// half the step is kept, the other half drawn at random (common practice, no source).

export interface BackoffOptions {
  /** The first step, ms. */
  baseMs: number;
  /** No wait is longer than this, ms. */
  capMs: number;
  /** A number in [0, 1); injectable so tests are repeatable. Default Math.random. */
  random?: () => number;
}

export class Backoff {
  private attempt = 0;

  constructor(private readonly o: BackoffOptions) {
    if (!(o.baseMs > 0) || !(o.capMs >= o.baseMs)) throw new Error('backoff needs 0 < baseMs <= capMs');
  }

  /** The wait before the next try, ms; each call doubles the step up to the cap. */
  next(): number {
    const step = Math.min(this.o.capMs, this.o.baseMs * 2 ** Math.min(this.attempt, 30));
    this.attempt++;
    const r = (this.o.random ?? Math.random)();
    return step / 2 + r * (step / 2);
  }

  /** A connection held: start from the first step again. */
  reset(): void {
    this.attempt = 0;
  }

  get attempts(): number {
    return this.attempt;
  }
}
