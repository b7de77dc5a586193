// Error against angle, reduced for drawing: the core's code range cut into equal bins, each with
// the lowest and highest signed error (cos and sin together, in LSB) of the answers in it. A few
// hundred bins carry the shape of a million-sample session in a few kilobytes, so the compare
// page overlays sessions without fetching their samples.
import { exactSinCosInto } from '../../shared/numeric/exact-reference';
import { angleCodeRange, angleCodeToDegrees } from '../../shared/numeric/formats';
import { parseModelConfig, type ModelConfigInput } from '../../shared/numeric/model-config';
import type { DecodedSamples } from './session-scoring';

/** Bins of an envelope: half a degree each over a binary-angle circle. */
export const ENVELOPE_BINS = 720;
const CHUNK = 65_536;

export interface ErrorEnvelope {
  /** The angle at each bin's centre, in degrees. */
  degrees: number[];
  /** Lowest and highest signed error in the bin, in LSB; null where no answer fell. */
  lo: (number | null)[];
  hi: (number | null)[];
}

/** Which bin of `bins` equal parts of the code range each code falls in. */
export function codeBinner(modelConfig: ModelConfigInput, bins = ENVELOPE_BINS) {
  const config = parseModelConfig(modelConfig);
  const { min, count } = angleCodeRange(config);
  const binOf = (code: number) => Math.min(bins - 1, Math.max(0, Math.floor(((code - min) / count) * bins)));
  const centreDegrees = (bin: number) => angleCodeToDegrees(config, Math.min(min + count - 1, Math.floor(min + ((bin + 0.5) * count) / bins)));
  const degreesOf = (code: number) => angleCodeToDegrees(config, code);
  return { config, bins, binOf, centreDegrees, degreesOf };
}

/** The error envelope of decoded samples under the core's model configuration (exact math side). */
export function errorEnvelope(modelConfig: ModelConfigInput, s: DecodedSamples, bins = ENVELOPE_BINS): ErrorEnvelope {
  const { config, binOf } = codeBinner(modelConfig, bins);
  const scale = 2 ** config.outFrac;
  const lo = new Float64Array(bins).fill(Infinity);
  const hi = new Float64Array(bins).fill(-Infinity);
  const exCos = new Float64Array(CHUNK);
  const exSin = new Float64Array(CHUNK);
  for (let start = 0; start < s.codes.length; start += CHUNK) {
    const codes = s.codes.subarray(start, start + CHUNK);
    exactSinCosInto(config, codes, exCos, exSin);
    for (let k = 0; k < codes.length; k++) {
      const b = binOf(codes[k]);
      const eCos = s.cos[start + k] - exCos[k] * scale;
      const eSin = s.sin[start + k] - exSin[k] * scale;
      const low = eCos < eSin ? eCos : eSin;
      const high = eCos < eSin ? eSin : eCos;
      if (low < lo[b]) lo[b] = low;
      if (high > hi[b]) hi[b] = high;
    }
  }
  const finite = (v: number) => (Number.isFinite(v) ? v : null);
  return envelopeFromBounds(modelConfig, { lo: Array.from(lo, finite), hi: Array.from(hi, finite) });
}

/** Lowest and highest signed error per bin, null where no answer fell: what ingest stores. */
export interface EnvelopeBounds {
  lo: (number | null)[];
  hi: (number | null)[];
}

/** The envelope the page draws from bounds, stored at ingest or computed from the samples. */
export function envelopeFromBounds(modelConfig: ModelConfigInput, bounds: EnvelopeBounds): ErrorEnvelope {
  const bins = bounds.lo.length;
  const { centreDegrees } = codeBinner(modelConfig, bins);
  const round = (v: number | null) => (v === null ? null : Math.round(v * 1000) / 1000);
  return {
    degrees: Array.from({ length: bins }, (_, b) => Math.round(centreDegrees(b) * 1000) / 1000),
    lo: bounds.lo.map(round),
    hi: bounds.hi.map(round),
  };
}
