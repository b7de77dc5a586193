// Spectral figures of a coherently sampled tone (IEEE Std 1241 terms): the tone sits in one FFT
// bin, so no window is needed and every other bin is noise or distortion.
import FFT from 'fft.js';

/** Figures of merit of one tone. Powers are one-sided, in squared input units. */
export interface ToneFigures {
  /** Signal power over the largest other bin (DC excluded), dBc. */
  sfdrDbc: number;
  /** Signal over noise, harmonics excluded, dB. */
  snrDb: number;
  /** Signal over noise and distortion, dB. */
  sinadDb: number;
  /** (SINAD − 1.76) / 6.02: bits, referred to the tone's own amplitude as full scale. */
  enob: number;
  /** Total harmonic distortion relative to the signal, dBc. */
  thdDbc: number;
  signalPower: number;
  noisePower: number;
  distortionPower: number;
  /** Bin of the largest spur. */
  spurBin: number;
}

/** Options of toneFigures. */
export interface ToneOptions {
  /** Harmonics 2..h counted as distortion (default 9). */
  harmonics?: number;
}

/** Raised when samples or the tone cannot give spectral figures. */
export class SpectralError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'SpectralError';
  }
}

const db = (ratio: number) => 10 * Math.log10(ratio);

/** Greatest common divisor of two non-negative integers. */
export function gcd(a: number, b: number): number {
  while (b !== 0) [a, b] = [b, a % b];
  return a;
}

/** True for 2, 4, 8, …: the sizes the FFT accepts. */
export function isPowerOfTwo(n: number): boolean {
  return Number.isInteger(n) && n >= 2 && (n & (n - 1)) === 0;
}

/**
 * One-sided power spectrum of real samples, bins 0..N/2, scaled so a sine of amplitude A puts
 * A²/2 in its bin (its mean power).
 */
export function powerSpectrum(samples: ArrayLike<number>): Float64Array {
  const n = samples.length;
  if (!isPowerOfTwo(n) || n < 4) throw new SpectralError(`samples: the FFT needs a power-of-two length ≥ 4, got ${n}`);
  const fft = new FFT(n);
  const input = new Array<number>(n);
  for (let i = 0; i < n; i++) input[i] = samples[i];
  const out = fft.createComplexArray() as number[];
  fft.realTransform(out, input);
  const p = new Float64Array(n / 2 + 1);
  for (let k = 0; k <= n / 2; k++) {
    const re = out[2 * k];
    const im = out[2 * k + 1];
    // Bins other than DC and Nyquist stand for their mirror image too.
    p[k] = ((re * re + im * im) / (n * n)) * (k === 0 || k === n / 2 ? 1 : 2);
  }
  return p;
}

/** The bin a frequency of `cycles` cycles per record lands in after aliasing. */
function aliasBin(cycles: number, n: number): number {
  const k = cycles % n;
  return k > n / 2 ? n - k : k;
}

/**
 * SFDR, SNR, SINAD, ENOB and THD of a coherent tone of `cycles` cycles in `samples.length`
 * samples (cycles and length coprime).
 */
export function toneFigures(samples: ArrayLike<number>, cycles: number, options: ToneOptions = {}): ToneFigures {
  const n = samples.length;
  if (!Number.isInteger(cycles) || cycles < 1 || cycles >= n / 2) throw new SpectralError(`cycles: must be an integer 1..${n / 2 - 1}, got ${cycles}`);
  if (gcd(cycles, n) !== 1) throw new SpectralError(`cycles: ${cycles} and ${n} samples share a factor, so the tone is not coherent`);
  const harmonics = options.harmonics ?? 9;
  const p = powerSpectrum(samples);
  const signalPower = p[cycles];
  const harmonicBins = new Set<number>();
  for (let h = 2; h <= harmonics; h++) {
    const b = aliasBin(h * cycles, n);
    if (b !== 0 && b !== cycles) harmonicBins.add(b);
  }
  let noisePower = 0;
  let distortionPower = 0;
  let spur = 0;
  let spurBin = -1;
  for (let k = 1; k < p.length; k++) {
    if (k === cycles) continue;
    if (harmonicBins.has(k)) distortionPower += p[k];
    else noisePower += p[k];
    if (p[k] > spur) [spur, spurBin] = [p[k], k];
  }
  const sinadDb = db(signalPower / (noisePower + distortionPower));
  return {
    sfdrDbc: db(signalPower / spur),
    snrDb: db(signalPower / noisePower),
    sinadDb,
    enob: (sinadDb - 1.76) / 6.02,
    thdDbc: db(distortionPower / signalPower),
    signalPower,
    noisePower,
    distortionPower,
    spurBin,
  };
}
