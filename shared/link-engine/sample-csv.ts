// Samples as CSV: a header `angle_code,cos_code,sin_code`, then one row of three integer codes per
// answer. Used to import results captured elsewhere and for golden vectors from RTL simulation.
// A session's own CSV export reads back too: its `# …` lines above the header are skipped and its
// angle_code, cos_code and sin_code columns are taken by name among the others.
// The parser checks form only (integers, the header's number of columns); the core's model checks ranges.
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
 * Parse CSV text of integer columns named by `header` (lower case, comma-separated). `#` lines
 * above the header are skipped and the columns are taken by name, so other columns may sit beside
 * them (as in a session's CSV export). Blank lines are skipped; CRLF and a UTF-8 byte-order mark
 * are accepted; `fits(column, value)` says whether a value fits its column (columns numbered as in
 * `header`). @throws SampleCsvError naming the first bad line.
 */
export function parseCodeColumns(text: string, header: string, fits: (column: number, value: number) => boolean, maxRows = 1 << 24): Float64Array[] {
  const wanted = header.split(',');
  const lines = text.replace(/^\uFEFF/, '').split(/\r?\n/);
  // Comment lines above the header (the session export's conditions).
  let h = 0;
  while (h < lines.length - 1 && lines[h].startsWith('#')) h++;
  const names = (lines[h] ?? '').trim().toLowerCase().replace(/\s+/g, '').split(',');
  const at = wanted.map((w) => names.indexOf(w));
  if (at.some((i) => i < 0)) {
    throw new SampleCsvError(h + 1, `the header must be "${header}"`);
  }
  const width = names.length;
  let rows = 0;
  for (let i = h + 1; i < lines.length; i++) if (lines[i].trim() !== '') rows++;
  if (rows === 0) throw new SampleCsvError(h + 2, 'no samples after the header');
  if (rows > maxRows) throw new SampleCsvError(maxRows + h + 2, `more than ${maxRows} samples`);
  const out = wanted.map(() => new Float64Array(rows));
  let row = 0;
  for (let i = h + 1; i < lines.length; i++) {
    const line = lines[i].trim();
    if (line === '') continue;
    const cells = line.split(',').map((c) => c.trim());
    if (cells.length !== width) throw new SampleCsvError(i + 1, `expected ${width} values, found ${cells.length}`);
    for (let k = 0; k < wanted.length; k++) {
      const c = cells[at[k]];
      if (!INTEGER.test(c)) throw new SampleCsvError(i + 1, `${wanted[k]} "${c.slice(0, 20)}" is not an integer`);
      const value = Number(c);
      if (!Number.isSafeInteger(value) || !fits(k, value)) throw new SampleCsvError(i + 1, 'a value is too large for a 32-bit code');
      out[k][row] = value;
    }
    row++;
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
