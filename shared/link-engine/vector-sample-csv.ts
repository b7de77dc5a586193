// A vectoring core's samples as CSV: a header `x_code,y_code,angle_code,magnitude_code`, then one
// row of four integer codes per answered vector. The export of a vectoring session, its import,
// and golden vectors from RTL simulation all use it. Form only here; the core's formats check ranges.
import { parseCodeColumns } from './sample-csv';
import type { VectorSamples } from './vector-sample-pack';

export const VECTOR_CSV_HEADER = 'x_code,y_code,angle_code,magnitude_code';

const INT32_MIN = -(2 ** 31);
const INT32_MAX = 2 ** 31 - 1;

/** Parse vectoring CSV text. @throws SampleCsvError naming the first bad line (1-based, the header is line 1). */
export function parseVectorCsv(text: string, maxRows = 1 << 24): VectorSamples {
  const [xs, ys, angles, magnitudes] = parseCodeColumns(text, VECTOR_CSV_HEADER, (_column, v) => v >= INT32_MIN && v <= INT32_MAX, maxRows).map((c) => Int32Array.from(c));
  return { xs, ys, angles, magnitudes };
}

/** The CSV text of vectoring samples in chunks of `chunkRows` rows, header first. */
export function* vectorCsvChunks(s: VectorSamples, chunkRows = 8192): Generator<string> {
  yield `${VECTOR_CSV_HEADER}\n`;
  for (let start = 0; start < s.xs.length; start += chunkRows) {
    const end = Math.min(s.xs.length, start + chunkRows);
    const lines = new Array<string>(end - start);
    for (let i = start; i < end; i++) lines[i - start] = `${s.xs[i]},${s.ys[i]},${s.angles[i]},${s.magnitudes[i]}`;
    yield `${lines.join('\n')}\n`;
  }
}
