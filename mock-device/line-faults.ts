/**
 * Faults injected on the simulated board's reply direction: bit errors at a rate, dropped bytes,
 * and latency jitter — seeded, so a failing run can be reproduced exactly.
 */
export interface LineFaultSettings {
  /** Probability that any one bit is flipped. */
  ber: number;
  /** Probability that any one byte is lost. */
  drop: number;
  /** Extra delay of each chunk, uniform in [0, jitterMs]; order is kept. */
  jitterMs: number;
  seed: number;
}

export const noLineFaults: LineFaultSettings = { ber: 0, drop: 0, jitterMs: 0, seed: 1 };

const KEYS: Record<string, keyof LineFaultSettings> = { ber: 'ber', drop: 'drop', 'jitter-ms': 'jitterMs', seed: 'seed' };

/** Parse `ber=1e-5,drop=1e-6,jitter-ms=2,seed=7`; any key may be left out. */
export function parseLineFaults(text: string): LineFaultSettings {
  const out = { ...noLineFaults };
  for (const part of text.split(',').map((p) => p.trim()).filter(Boolean)) {
    const [key, value, extra] = part.split('=');
    const field = KEYS[key];
    const num = Number(value);
    if (!field || extra !== undefined) throw new Error(`--line-faults: unknown setting "${part}" (use ber, drop, jitter-ms, seed)`);
    if (value === undefined || value === '' || !Number.isFinite(num) || num < 0) throw new Error(`--line-faults: ${key} must be a number ≥ 0, got "${value ?? ''}"`);
    if ((field === 'ber' || field === 'drop') && num > 1) throw new Error(`--line-faults: ${key} is a probability, at most 1`);
    out[field] = num;
  }
  return out;
}

/** mulberry32: a small, fast, seedable PRNG; plenty for fault injection. */
export function seededRandom(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

export interface FaultCounts {
  bitsFlipped: number;
  bytesDropped: number;
}

/** Applies the faults to chunks on their way to the host. */
export class LineFaults {
  readonly counts: FaultCounts = { bitsFlipped: 0, bytesDropped: 0 };
  private readonly random: () => number;

  constructor(readonly settings: LineFaultSettings) {
    this.random = seededRandom(settings.seed);
  }

  get active() {
    return this.settings.ber > 0 || this.settings.drop > 0 || this.settings.jitterMs > 0;
  }

  /** A corrupted copy of `chunk` (the input is left alone). */
  corrupt(chunk: Uint8Array): Uint8Array {
    const { ber, drop } = this.settings;
    if (ber === 0 && drop === 0) return chunk;
    const out = new Uint8Array(chunk.length);
    let n = 0;
    for (let i = 0; i < chunk.length; i++) {
      if (drop > 0 && this.random() < drop) {
        this.counts.bytesDropped++;
        continue;
      }
      let b = chunk[i];
      // One draw per byte decides whether any bit flips; exact for small rates.
      if (ber > 0 && this.random() < 8 * ber) {
        b ^= 1 << Math.floor(this.random() * 8);
        this.counts.bitsFlipped++;
      }
      out[n++] = b;
    }
    return out.subarray(0, n);
  }

  /** The extra delay for the next chunk, in ms. */
  jitter(): number {
    return this.settings.jitterMs > 0 ? this.random() * this.settings.jitterMs : 0;
  }
}
