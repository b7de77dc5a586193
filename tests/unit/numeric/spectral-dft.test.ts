import { describe, expect, it } from 'vitest';
import { createCordicModel, planCodes, toneFigures, type ModelConfigInput } from '../../../shared/numeric';

// A second, independent reading of the spectral figures: a direct DFT written here (no fft.js, no
// code from shared/numeric/spectral.ts), with the IEEE Std 1241 definitions applied by hand —
// SFDR = signal over the largest other bin, SNR = signal over every bin but DC, the signal and
// harmonics 2..9 (docs/references.md "Spectral figures").

const db = (ratio: number) => 10 * Math.log10(ratio);

/** One-sided power of bins 0..N/2 by the definition X_k = Σ x_j e^(−2πi·jk/N), scaled to A²/2. */
function directDftPower(x: ArrayLike<number>): Float64Array {
  const n = x.length;
  // cos and sin of 2π·m/N for every m, so each term is an exact table look-up at (j·k) mod N.
  const c = Float64Array.from({ length: n }, (_, m) => Math.cos((2 * Math.PI * m) / n));
  const s = Float64Array.from({ length: n }, (_, m) => Math.sin((2 * Math.PI * m) / n));
  const p = new Float64Array(n / 2 + 1);
  for (let k = 0; k <= n / 2; k++) {
    let re = 0;
    let im = 0;
    for (let j = 0, m = 0; j < n; j++, m = (m + k) % n) {
      re += x[j] * c[m];
      im -= x[j] * s[m];
    }
    p[k] = ((re * re + im * im) / (n * n)) * (k === 0 || k === n / 2 ? 1 : 2);
  }
  return p;
}

function dftFigures(x: ArrayLike<number>, cycles: number) {
  const n = x.length;
  const p = directDftPower(x);
  const harmonics = new Set<number>();
  for (let h = 2; h <= 9; h++) {
    const k = (h * cycles) % n;
    harmonics.add(k > n / 2 ? n - k : k);
  }
  let noise = 0;
  let spur = 0;
  let spurBin = -1;
  for (let k = 1; k <= n / 2; k++) {
    if (k === cycles) continue;
    if (!harmonics.has(k)) noise += p[k];
    if (p[k] > spur) [spur, spurBin] = [p[k], k];
  }
  return { sfdrDbc: db(p[cycles] / spur), snrDb: db(p[cycles] / noise), spurBin };
}

/** The sin output of a core model for a coherent tone plan of 1021 cycles in 4096 samples. */
function coreTone(config: ModelConfigInput): Float64Array {
  const model = createCordicModel(config);
  const codes = planCodes({ kind: 'tone', cycles: 1021, samples: 4096 }, model.config);
  return Float64Array.from(codes, (code) => model.evaluate(code).sin);
}

describe('spectral figures of a real core tone, read twice', () => {
  // Pinned: the values this direct DFT read when the test was written (default core: 16 iterations,
  // 16-bit outputs with 14 fraction bits; and the same core cut to 8 iterations). A change means
  // the model's arithmetic or the figures changed, and must be explained.
  it.each([
    { name: 'the default core', config: {}, sfdrDbc: 99.76, snrDb: 85.6, spurBin: 997 },
    { name: 'an 8-iteration core', config: { iterations: 8 }, sfdrDbc: 56.24, snrDb: 46.98, spurBin: 1875 },
  ])('$name: SFDR and SNR from the FFT match a direct DFT and the pinned values', ({ config, sfdrDbc, snrDb, spurBin }) => {
    const x = coreTone(config);
    const fft = toneFigures(x, 1021);
    const dft = dftFigures(x, 1021);

    expect(fft.spurBin).toBe(dft.spurBin);
    expect(Math.abs(fft.sfdrDbc - dft.sfdrDbc)).toBeLessThan(1e-6);
    expect(Math.abs(fft.snrDb - dft.snrDb)).toBeLessThan(1e-6);

    expect(dft.spurBin).toBe(spurBin);
    expect(dft.sfdrDbc).toBeCloseTo(sfdrDbc, 2);
    expect(dft.snrDb).toBeCloseTo(snrDb, 2);
  });

  it('reads no core better than an ideal quantiser of its output grid', () => {
    // Bennett 1948: an ideal (outFrac + 1)-bit quantiser of a full-scale sine has SNR 6.02·15 + 1.76 dB.
    const dft = dftFigures(coreTone({}), 1021);
    expect(dft.snrDb).toBeLessThan(6.02 * 15 + 1.76);
  });
});
