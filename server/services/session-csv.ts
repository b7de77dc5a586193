// The CSV export of a stored session: one row per sample with the exact values and the model's
// answer beside what the core returned. A session's operating conditions come first, one
// `# condition name=value` line each (the runner's --condition grammar, named ones first), and
// only when it has some: a session without conditions gives the same file as before. Rows are built a chunk at a time into typed arrays so a
// session of a million samples never holds a million row strings at once.
import { modelConfigSchema } from '../schemas/core';
import { angleCodeToDegrees, createCordicModel, exactSinCosInto } from '../../shared/numeric';
import { conditionTexts, type Conditions } from '../../shared/soak';
import type { DecodedSamples } from './session-scoring';

/** Starts each condition line above the header. */
export const CSV_CONDITION_PREFIX = '# condition ';

export const CSV_HEADER = 'index,angle_code,angle_deg,cos_code,sin_code,exact_cos,exact_sin,model_cos,model_sin,cos_err_lsb,sin_err_lsb';

/** Rows per chunk: small enough to stream, large enough that the per-chunk work is amortised. */
const CHUNK_ROWS = 8192;

/**
 * The CSV text in chunks, header first. `cos_err_lsb` / `sin_err_lsb` are the core's codes minus
 * the exact values, in output LSBs (the error the scorer measures).
 */
export function* sessionCsvChunks(modelConfig: unknown, samples: DecodedSamples, conditions: Conditions = {}, chunkRows = CHUNK_ROWS): Generator<string> {
  const config = modelConfigSchema.parse(modelConfig);
  const model = createCordicModel(config);
  const scale = 2 ** config.outFrac;
  const rows = Math.max(1, Math.min(chunkRows, samples.codes.length));
  const exactCos = new Float64Array(rows);
  const exactSin = new Float64Array(rows);
  const modelCos = new Int32Array(rows);
  const modelSin = new Int32Array(rows);
  // Values are printable ASCII on one line (conditionsSchema), so a line holds one pair whole.
  yield conditionTexts(conditions).map((t) => `${CSV_CONDITION_PREFIX}${t}\n`).join('') + `${CSV_HEADER}\n`;
  for (let start = 0; start < samples.codes.length; start += rows) {
    const codes = samples.codes.subarray(start, start + rows);
    const n = codes.length;
    exactSinCosInto(config, codes, exactCos, exactSin);
    model.evaluateInto(codes, modelCos, modelSin);
    const lines = new Array<string>(n);
    for (let k = 0; k < n; k++) {
      const i = start + k;
      const code = codes[k];
      const c = samples.cos[i];
      const s = samples.sin[i];
      lines[k] =
        `${i},${code},${angleCodeToDegrees(config, code)},${c},${s},${exactCos[k]},${exactSin[k]},` +
        `${modelCos[k]},${modelSin[k]},${c - exactCos[k] * scale},${s - exactSin[k] * scale}`;
    }
    yield `${lines.join('\n')}\n`;
  }
}
