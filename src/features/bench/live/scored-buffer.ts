// Scored results waiting to go back to the page, grown in typed arrays and handed over whole.

export interface ScoredBatch {
  codes: Float64Array;
  cos: Int32Array;
  sin: Int32Array;
  errCos: Float32Array;
  errSin: Float32Array;
}

export class ScoredBuffer {
  private b: ScoredBatch = ScoredBuffer.empty(1024);
  private n = 0;

  private static empty(cap: number): ScoredBatch {
    return { codes: new Float64Array(cap), cos: new Int32Array(cap), sin: new Int32Array(cap), errCos: new Float32Array(cap), errSin: new Float32Array(cap) };
  }

  get length() {
    return this.n;
  }

  /** Append a batch; errCos(k) and errSin(k) give the k-th result's errors in LSB. */
  append(codes: ArrayLike<number>, cos: ArrayLike<number>, sin: ArrayLike<number>, errCos: (k: number) => number, errSin: (k: number) => number) {
    const add = codes.length;
    if (this.n + add > this.b.codes.length) {
      const bigger = ScoredBuffer.empty(Math.max(this.b.codes.length * 2, this.n + add));
      for (const key of ['codes', 'cos', 'sin', 'errCos', 'errSin'] as const) bigger[key].set(this.b[key].subarray(0, this.n) as never);
      this.b = bigger;
    }
    for (let k = 0; k < add; k++) {
      const at = this.n + k;
      this.b.codes[at] = codes[k];
      this.b.cos[at] = cos[k];
      this.b.sin[at] = sin[k];
      this.b.errCos[at] = errCos(k);
      this.b.errSin[at] = errSin(k);
    }
    this.n += add;
  }

  /** Everything appended since the last take, in arrays of exactly that length; null when empty. */
  take(): ScoredBatch | null {
    if (this.n === 0) return null;
    const out: ScoredBatch = {
      codes: this.b.codes.slice(0, this.n),
      cos: this.b.cos.slice(0, this.n),
      sin: this.b.sin.slice(0, this.n),
      errCos: this.b.errCos.slice(0, this.n),
      errSin: this.b.errSin.slice(0, this.n),
    };
    this.n = 0;
    return out;
  }
}
