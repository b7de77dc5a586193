// Ctrl-C during a run: the first SIGINT asks the run to stop (the engine aborts, what was captured
// is still scored and written to --out), a second one quits at once. Either way the exit status is
// 130, the shell's 128 + SIGINT, so a script can tell an interrupted run from a failed one.
import type { CliIo } from './io';

export const INTERRUPTED_STATUS = 130;

/** A request to stop, from the terminal or from a test. */
export interface Interrupt {
  readonly requested: boolean;
  /** Calls `listener` once when a stop is requested (at once if it already was); returns an unsubscribe. */
  onRequest(listener: () => void): () => void;
}

/** An interrupt nothing outside raises until `request()` is called (tests; the process one below). */
export function createInterrupt(): Interrupt & { request(): void } {
  let requested = false;
  const listeners = new Set<() => void>();
  return {
    get requested() {
      return requested;
    },
    onRequest(listener) {
      if (requested) {
        listener();
        return () => undefined;
      }
      listeners.add(listener);
      return () => listeners.delete(listener);
    },
    request() {
      if (requested) return;
      requested = true;
      for (const l of [...listeners]) l();
      listeners.clear();
    },
  };
}

/** What withSigint needs of the process, passed in so it can be tried without real signals. */
export interface SignalSource {
  on(signal: 'SIGINT', listener: () => void): unknown;
  off(signal: 'SIGINT', listener: () => void): unknown;
  exit(code: number): never;
}

/**
 * SIGINT for the length of `work`: the first asks it to stop, the second exits with 130 at once.
 * Installing a listener replaces Node's default (die at once), so the run can finish cleanly.
 */
export async function withSigint<T>(io: CliIo, work: (interrupt: Interrupt) => Promise<T>, source: SignalSource = process): Promise<T> {
  const interrupt = createInterrupt();
  const onSigint = () => {
    if (interrupt.requested) {
      io.stderr('\ninterrupted again: quitting without finishing\n');
      source.exit(INTERRUPTED_STATUS);
    }
    io.stderr('\ninterrupted: stopping the run (Ctrl-C again to quit at once)\n');
    interrupt.request();
  };
  source.on('SIGINT', onSigint);
  try {
    return await work(interrupt);
  } finally {
    source.off('SIGINT', onSigint);
  }
}
