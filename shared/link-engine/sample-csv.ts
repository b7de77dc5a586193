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
 * Parse CSV text of integer columns under exactly `header` (lower case, comma-separated). Blank
 * lines are skipped; CRLF and a UTF-8 byte-order mark are accepted; `fits(column, value)` says
 * whether a value fits its column. @throws SampleCsvError naming the first bad line.
 */
export function parseCodeColumns(text: string, header: string, fits: (column: number, value: number) => boolean, maxRows = 1 << 24): Float64Array[] {
  const names = header.split(',');
  const lines = text.replace(/^\uFEFF/, '').split(/\r?\n/);
  const first = (lines[0] ?? '').trim().toLowerCase().replace(/\s+/g, '');
  if (first !== header) throw new SampleCsvError(1, `the header must be "${header}"`);
  let rows = 0;
  for (let i = 1; i < lines.length; i++) if (lines[i].trim() !== '') rows++;
  if (rows === 0) throw new SampleCsvError(2, 'no samples after the header');
  if (rows > maxRows) throw new SampleCsvError(maxRows + 2, `more than ${maxRows} samples`);
  const out = names.map(() => new Float64Array(rows));
  let at = 0;
  for (let i = 1; i < lines.length; i++) {
    const line = lines[i].trim();
    if (line === '') continue;
    const cells = line.split(',').map((c) => c.trim());
    if (cells.length !== names.length) throw new SampleCsvError(i + 1, `expected ${names.length} values, found ${cells.length}`);
    for (let k = 0; k < cells.length; k++) {
      if (!INTEGER.test(cells[k])) throw new SampleCsvError(i + 1, `${names[k]} "${cells[k].slice(0, 20)}" is not an integer`);
      const value = Number(cells[k]);
      if (!Number.isSafeInteger(value) || !fits(k, value)) throw new SampleCsvError(i + 1, 'a value is too large for a 32-bit code');
      out[k][at] = value;
    }
    at++;
  }
  return out;
}

/**
 * Parse sample CSV text. Blank lines are skipped; CRLF and a UTF-8 byte-order mark are accepted.
 * @throws SampleCsvError naming the first bad line.
 */
export function parseSampleCsv(text: string, maxRows = 1 << 24): UnpackedSamples {
  // The angle code only has to be an integer (the core's format checks its range); cos and sin are 32-bit.
  const [codes, cos, sin] = parseCodeColumns(text, SAMPLE_CSV_HEADER, (column, v) => column === 0 || Math.abs(v) <= 2 ** 31, maxRows);
  return { codes, cos: Int32Array.from(cos), sin: Int32Array.from(sin) };
}
