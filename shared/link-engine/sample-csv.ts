// Samples as CSV: a header `angle_code,cos_code,sin_code`, then one row of three integer codes per
// answer. Used to import results captured elsewhere and for golden vectors from RTL simulation.
// The parser checks form only (integers, three columns); the core's model checks ranges.
import type { UnpackedSamples } from './sample-pack';

export const SAMPLE_CSV_HEADER = 'angle_code,cos_code,sin_code';

/** A CSV that cannot be read; `line` is 1-based, counting the header. */
export class SampleCsvError extends Error {
  constructor(
    readonly line: number,
    message: string,
  ) {
    super(`line ${line}: ${message}`);
    this.name = 'SampleCsvError';
  }
}

const INTEGER = /^[+-]?\d+$/;

/**
 * Parse sample CSV text. Blank lines are skipped; CRLF and a UTF-8 byte-order mark are accepted.
 * @throws SampleCsvError naming the first bad line.
 */
export function parseSampleCsv(text: string, maxRows = 1 << 24): UnpackedSamples {
  const lines = text.replace(/^\uFEFF/, '').split(/\r?\n/);
  const header = (lines[0] ?? '').trim().toLowerCase().replace(/\s+/g, '');
  if (header !== SAMPLE_CSV_HEADER) throw new SampleCsvError(1, `the header must be "${SAMPLE_CSV_HEADER}"`);
  let rows = 0;
  for (let i = 1; i < lines.length; i++) if (lines[i].trim() !== '') rows++;
  if (rows === 0) throw new SampleCsvError(2, 'no samples after the header');
  if (rows > maxRows) throw new SampleCsvError(maxRows + 2, `more than ${maxRows} samples`);
  const out: UnpackedSamples = { codes: new Float64Array(rows), cos: new Int32Array(rows), sin: new Int32Array(rows) };
  let at = 0;
  for (let i = 1; i < lines.length; i++) {
    const line = lines[i].trim();
    if (line === '') continue;
    const cells = line.split(',').map((c) => c.trim());
    if (cells.length !== 3) throw new SampleCsvError(i + 1, `expected 3 values, found ${cells.length}`);
    const values = cells.map((c, k) => {
      if (!INTEGER.test(c)) throw new SampleCsvError(i + 1, `${SAMPLE_CSV_HEADER.split(',')[k]} "${c.slice(0, 20)}" is not an integer`);
      return Number(c);
    });
    if (!Number.isSafeInteger(values[0]) || Math.abs(values[1]) > 2 ** 31 || Math.abs(values[2]) > 2 ** 31) {
      throw new SampleCsvError(i + 1, 'a value is too large for a 32-bit code');
    }
    out.codes[at] = values[0];
    out.cos[at] = values[1];
    out.sin[at] = values[2];
    at++;
  }
  return out;
}
