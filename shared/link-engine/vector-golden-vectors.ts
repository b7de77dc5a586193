// Golden vectors of a vectoring core: expected (angle, magnitude) codes of (x, y) inputs from RTL
// simulation, checked against the bit-accurate vectoring model, as golden-vectors.ts does for
// rotation cores.
import { angleOutputRange, createVectorModel, inputRange, magnitudeRange, type VectorConfig } from '../vectoring';
import { GoldenVectorError } from './golden-vectors';
import type { VectorSamples } from './vector-sample-pack';

export interface VectorGoldenSummary {
  count: number;
  /** Distinct (x, y) pairs. */
  distinctCodes: number;
  /** Distinct pairs over the pairs the input format holds, 2^(2·inBits) (0..1). */
  coverageShare: number;
  modelMismatches: number;
  /** The first few rows that differ from the model, with their 1-based CSV line. */
  firstMismatches: Array<{ line: number; x: number; y: number; angle: number; magnitude: number; modelAngle: number; modelMagnitude: number }>;
}

/** Check the set's codes against the core's formats. @throws GoldenVectorError for the first bad row. */
export function checkVectorGoldenVectors(config: VectorConfig, v: VectorSamples): void {
  const input = inputRange(config);
  const angle = angleOutputRange(config);
  const mag = magnitudeRange(config);
  for (let i = 0; i < v.xs.length; i++) {
    const cells = [
      ['x_code', v.xs[i], input, `${config.inBits}-bit input`],
      ['y_code', v.ys[i], input, `${config.inBits}-bit input`],
      ['angle_code', v.angles[i], angle, `${config.angleBits}-bit angle`],
      ['magnitude_code', v.magnitudes[i], mag, `${config.magBits}-bit magnitude`],
    ] as const;
    for (const [name, value, range, format] of cells) {
      if (value < range.min || value > range.max) throw new GoldenVectorError(i, `${name} ${value} is outside the core's ${format} format`);
    }
  }
}

/** Count, coverage and agreement with the model of a checked set. CSV lines count the header. */
export function summariseVectorGoldenVectors(config: VectorConfig, v: VectorSamples, keep = 5): VectorGoldenSummary {
  const n = v.xs.length;
  const modelAngle = new Int32Array(n);
  const modelMag = new Int32Array(n);
  createVectorModel(config).answerInto(v.xs, v.ys, modelAngle, modelMag);
  const { min, max } = inputRange(config);
  const span = max - min + 1;
  const seen = new Set<number>();
  let modelMismatches = 0;
  const firstMismatches: VectorGoldenSummary['firstMismatches'] = [];
  for (let i = 0; i < n; i++) {
    seen.add((v.xs[i] - min) * span + (v.ys[i] - min));
    if (v.angles[i] === modelAngle[i] && v.magnitudes[i] === modelMag[i]) continue;
    modelMismatches++;
    if (firstMismatches.length < keep) {
      firstMismatches.push({ line: i + 2, x: v.xs[i], y: v.ys[i], angle: v.angles[i], magnitude: v.magnitudes[i], modelAngle: modelAngle[i], modelMagnitude: modelMag[i] });
    }
  }
  return { count: n, distinctCodes: seen.size, coverageShare: seen.size / span ** 2, modelMismatches, firstMismatches };
}
