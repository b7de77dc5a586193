// Golden vectors: expected codes from RTL simulation of the core, checked against the bit-accurate
// model. Agreement says the model and the RTL describe the same arithmetic, so a bench session
// that matches the model also matches the RTL.
import { angleCodeRange, createCordicModel, isAngleCode, outputCodeRange, type ModelConfig } from '../numeric';
import type { UnpackedSamples } from './sample-pack';

export interface GoldenSummary {
  count: number;
  distinctCodes: number;
  /** Distinct codes over the size of the core's angle-code range (0..1). */
  coverageShare: number;
  modelMismatches: number;
  /** The first few rows that differ from the model, with their 1-based CSV line. */
  firstMismatches: Array<{ line: number; code: number; cos: number; sin: number; modelCos: number; modelSin: number }>;
}

/** Thrown for a row the core's formats cannot hold; `row` is 0-based. */
export class GoldenVectorError extends Error {
  constructor(
    readonly row: number,
    message: string,
  ) {
    super(message);
    this.name = 'GoldenVectorError';
  }
}

/** Check the set's codes against the core's formats. @throws GoldenVectorError for the first bad row. */
export function checkGoldenVectors(config: ModelConfig, v: UnpackedSamples): void {
  const out = outputCodeRange(config);
  for (let i = 0; i < v.codes.length; i++) {
    if (!isAngleCode(config, v.codes[i])) throw new GoldenVectorError(i, `angle_code ${v.codes[i]} is outside the core's ${config.angleBits}-bit angle format`);
    for (const [name, value] of [['cos_code', v.cos[i]], ['sin_code', v.sin[i]]] as const) {
      if (value < out.min || value > out.max) throw new GoldenVectorError(i, `${name} ${value} is outside the core's ${config.outBits}-bit output format`);
    }
  }
}

/** Count, coverage and agreement with the model of a checked set. CSV lines count the header. */
export function summariseGoldenVectors(config: ModelConfig, v: UnpackedSamples, keep = 5): GoldenSummary {
  const n = v.codes.length;
  const modelCos = new Int32Array(n);
  const modelSin = new Int32Array(n);
  createCordicModel(config).evaluateInto(v.codes, modelCos, modelSin);
  const { min, max } = angleCodeRange(config);
  const seen = new Set<number>();
  let modelMismatches = 0;
  const firstMismatches: GoldenSummary['firstMismatches'] = [];
  for (let i = 0; i < n; i++) {
    seen.add(v.codes[i]);
    if (v.cos[i] === modelCos[i] && v.sin[i] === modelSin[i]) continue;
    modelMismatches++;
    if (firstMismatches.length < keep) firstMismatches.push({ line: i + 2, code: v.codes[i], cos: v.cos[i], sin: v.sin[i], modelCos: modelCos[i], modelSin: modelSin[i] });
  }
  return { count: n, distinctCodes: seen.size, coverageShare: seen.size / (max - min + 1), modelMismatches, firstMismatches };
}
