import { describe, expect, it } from 'vitest';
import { idealOutputCodes, planCodes, powerSpectrum, SpectralError, toneFigures } from '../../../shared/numeric';

/** An N-bit rounded sine of amplitude 2^(N-1) − 1, M cycles in L samples. */
function quantisedSine(bits: number, cycles: number, length: number): Float64Array {
  const a = 2 ** (bits - 1) - 1;
  return Float64Array.from({ length }, (_, j) => Math.round(a * Math.sin((2 * Math.PI * ((j * cycles) % length)) / length)));
}

describe('spectral figures of a coherent tone', () => {
  it('give an ideal N-bit quantised sine an SNR within 0.5 dB of 6.02·N + 1.76 dB', () => {
    // Bennett, "Spectra of Quantized Signals", BSTJ 27(3), 1948: noise Δ²/12, so SNR = 6.02·N + 1.76 dB.
    // docs/references.md "Spectral figures": a 65,536-sample, 4,099-cycle simulation gives 49.95, 74.03, 98.10, 122.17 dB.
    for (const bits of [8, 12, 16, 20]) {
      const f = toneFigures(quantisedSine(bits, 4099, 65536), 4099);
      expect(Math.abs(f.snrDb - (6.02 * bits + 1.76))).toBeLessThan(0.5);
      expect(Math.abs(f.sinadDb - (6.02 * bits + 1.76))).toBeLessThan(0.5);
    }
  });

  it('reads ENOB = (SINAD − 1.76) / 6.02 back as the word length of an ideal quantiser', () => {
    // IEEE Std 1241-2010 ENOB from SINAD for a full-scale sine (from memory); docs/references.md "Spectral figures": 74.00 dB → 12.00 bits.
    for (const bits of [10, 14]) {
      const f = toneFigures(quantisedSine(bits, 1021, 16384), 1021);
      expect(f.enob).toBeCloseTo((f.sinadDb - 1.76) / 6.02, 12);
      expect(Math.abs(f.enob - bits)).toBeLessThan(0.1);
    }
  });

  it('measures SFDR and THD of a tone with a third harmonic 60 dB down', () => {
    // IEEE Std 1241: SFDR is the signal over the largest spur; THD sums the harmonics.
    const n = 4096;
    const m = 101;
    const x = Float64Array.from({ length: n }, (_, j) => Math.sin((2 * Math.PI * m * j) / n) + 1e-3 * Math.sin((2 * Math.PI * 3 * m * j) / n));
    const f = toneFigures(x, m);
    expect(f.sfdrDbc).toBeCloseTo(60, 6);
    expect(f.thdDbc).toBeCloseTo(-60, 6);
    expect(f.spurBin).toBe(3 * m);
    expect(f.snrDb).toBeGreaterThan(200); // nothing but rounding noise besides the harmonic
  });

  it('puts a sine of amplitude A in its bin with power A²/2', () => {
    // Mean power of a sine is A²/2 (common practice, no source); Parseval's theorem for the scaling.
    const n = 1024;
    const x = Float64Array.from({ length: n }, (_, j) => 3 * Math.cos((2 * Math.PI * 37 * j) / n) + 0.5);
    const p = powerSpectrum(x);
    expect(p[37]).toBeCloseTo(4.5, 10);
    expect(p[0]).toBeCloseTo(0.25, 10);
  });

  it('finds the ideal output codes of a tone plan as good as an (outFrac + 1)-bit quantiser', () => {
    // Bennett 1948: the ideal codes are the exact sine rounded once, amplitude 2^outFrac.
    const f = { angleFormat: 'turn' as const, angleBits: 16, angleFrac: 0, outBits: 16, outFrac: 14 };
    const codes = planCodes({ kind: 'tone', cycles: 1021, samples: 8192 }, f);
    const sin = Float64Array.from(codes, (c) => idealOutputCodes(f, c).sin);
    expect(Math.abs(toneFigures(sin, 1021).enob - 15)).toBeLessThan(0.15);
  });

  it('refuses tones that are not coherent and lengths the FFT cannot take', () => {
    expect(() => toneFigures(new Float64Array(1024), 64)).toThrow(/share a factor/);
    expect(() => toneFigures(new Float64Array(1000), 7)).toThrow(SpectralError);
    expect(() => toneFigures(new Float64Array(1024), 600)).toThrow(/cycles/);
  });
});
