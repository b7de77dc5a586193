// Streaming, mergeable summaries of one error quantity: moments with the angle code of the
// worst case, and a fixed-bin histogram. Merging two summaries gives what one pass over both
// sets would give (up to the order of floating-point additions), so pieces can be scored apart.

/** Count, sum, sum of squares and the largest |value| with the angle code where it occurred. */
export class ErrorMoments {
  count = 0;
  sum = 0;
  sumSq = 0;
  maxAbs = 0;
  /** Angle code of maxAbs; the lowest code wins a tie, so merging is order-independent. */
  maxAbsCode: number | null = null;

  /** Adds one value observed at one angle code. */
  add(value: number, code: number): void {
    this.count++;
    this.sum += value;
    this.sumSq += value * value;
    const a = Math.abs(value);
    if (this.maxAbsCode === null || a > this.maxAbs || (a === this.maxAbs && code < this.maxAbsCode)) {
      this.maxAbs = a;
      this.maxAbsCode = code;
    }
  }

  /** Adds values[0..n) observed at codes[0..n): add() per value, in one tight loop. */
  addAll(values: Float64Array, codes: ArrayLike<number>, n: number): void {
    let { sum, sumSq, maxAbs, maxAbsCode } = this;
    for (let k = 0; k < n; k++) {
      const v = values[k];
      sum += v;
      sumSq += v * v;
      const a = Math.abs(v);
      if (a >= maxAbs) {
        const code = codes[k];
        if (maxAbsCode === null || a > maxAbs || code < maxAbsCode) {
          maxAbs = a;
          maxAbsCode = code;
        }
      }
    }
    this.count += n;
    this.sum = sum;
    this.sumSq = sumSq;
    this.maxAbs = maxAbs;
    this.maxAbsCode = maxAbsCode;
  }

  /** Folds another summary into this one. */
  merge(o: ErrorMoments): this {
    this.count += o.count;
    this.sum += o.sum;
    this.sumSq += o.sumSq;
    if (o.maxAbsCode !== null && (this.maxAbsCode === null || o.maxAbs > this.maxAbs || (o.maxAbs === this.maxAbs && o.maxAbsCode < this.maxAbsCode))) {
      this.maxAbs = o.maxAbs;
      this.maxAbsCode = o.maxAbsCode;
    }
    return this;
  }

  /** Mean (the bias); 0 when empty. */
  get mean(): number {
    return this.count === 0 ? 0 : this.sum / this.count;
  }

  /** Root mean square; 0 when empty. */
  get rms(): number {
    return this.count === 0 ? 0 : Math.sqrt(this.sumSq / this.count);
  }
}

/** Histogram bins: `binsPerLsb` bins per LSB over [−limitLsb, +limitLsb). */
export interface HistogramOptions {
  limitLsb: number;
  binsPerLsb: number;
}

/** Default bins: quarter-LSB resolution over ±8 LSB, enough to see a core that is off by a few. */
export const DEFAULT_HISTOGRAM: Readonly<HistogramOptions> = { limitLsb: 8, binsPerLsb: 4 };

/** A fixed-bin histogram of errors in LSB, with counts below and above its range. */
export class ErrorHistogram {
  readonly counts: Float64Array;
  below = 0;
  above = 0;

  constructor(readonly options: Readonly<HistogramOptions> = DEFAULT_HISTOGRAM) {
    const bins = 2 * options.limitLsb * options.binsPerLsb;
    if (!Number.isInteger(bins) || bins < 1 || bins > 1 << 20) {
      throw new RangeError(`histogram: 2 · limitLsb · binsPerLsb must be a whole number 1..2^20, got ${bins}`);
    }
    this.counts = new Float64Array(bins);
  }

  /** Adds one error in LSB. */
  add(errLsb: number): void {
    // The bin is floor(t); for 0 ≤ t < bins that is t | 0, without a call.
    const t = (errLsb + this.options.limitLsb) * this.options.binsPerLsb;
    if (t < 0) this.below++;
    else if (t >= this.counts.length) this.above++;
    else this.counts[t | 0]++;
  }

  /** Adds errors[0..n) in LSB. */
  addAll(errLsb: Float64Array, n: number): void {
    const { limitLsb, binsPerLsb } = this.options;
    const counts = this.counts;
    const bins = counts.length;
    let below = 0;
    let above = 0;
    for (let k = 0; k < n; k++) {
      // As add(): the bin is floor(t); for 0 ≤ t < bins that is t | 0, without a call.
      const t = (errLsb[k] + limitLsb) * binsPerLsb;
      if (t < 0) below++;
      else if (t >= bins) above++;
      else counts[t | 0]++;
    }
    this.below += below;
    this.above += above;
  }

  /** Folds another histogram with the same bins into this one. */
  merge(o: ErrorHistogram): this {
    if (o.options.limitLsb !== this.options.limitLsb || o.options.binsPerLsb !== this.options.binsPerLsb) {
      throw new RangeError('histogram: cannot merge histograms with different bins');
    }
    for (let i = 0; i < this.counts.length; i++) this.counts[i] += o.counts[i];
    this.below += o.below;
    this.above += o.above;
    return this;
  }

  /** Lower edge of each bin, in LSB. */
  edgesLsb(): number[] {
    return Array.from(this.counts, (_, i) => i / this.options.binsPerLsb - this.options.limitLsb);
  }
}
