// The shape every benchmark reports, how it is printed, and the JSON summary the suite leaves in
// benchmarks/results/latest.json (git-ignored) for whoever compares runs later.
import { mkdirSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

/** One measured figure, with a ratio measured beside it in the same run. */
export interface BenchResult {
  name: string;
  value: number;
  unit: string;
  /** value ÷ (or against) the side-by-side baseline named in ratioOf; null when none was measured. */
  ratio: number | null;
  ratioOf: string;
  /** The target in words, e.g. "≥ 3,000,000 results/s and ratio ≥ 0.40"; null for a figure with none. */
  target: string | null;
  /** Whether the target was met; null when there is no target. */
  met: boolean | null;
}

export const RESULTS_FILE = path.join(path.dirname(fileURLToPath(import.meta.url)), 'results', 'latest.json');

const figure = (v: number) => (Math.abs(v) >= 100 ? Math.round(v).toLocaleString('en-US') : v.toPrecision(3));

/** One line per figure: name, value, ratio and the verdict against its target. */
export function printResult(r: BenchResult, print: (line: string) => void = console.log): void {
  const ratio = r.ratio === null ? '' : `  ratio ${r.ratio.toFixed(3)} (${r.ratioOf})`;
  const verdict = r.met === null ? '' : r.met ? '  MET' : '  MISSED';
  print(`${r.name.padEnd(24)} ${figure(r.value).padStart(12)} ${r.unit}${ratio}${r.target ? `  target ${r.target}` : ''}${verdict}`);
}

/** Writes the figures of this run as a JSON array; returns the file written. */
export function writeResults(results: BenchResult[], file = RESULTS_FILE): string {
  mkdirSync(path.dirname(file), { recursive: true });
  writeFileSync(file, JSON.stringify(results, null, 2) + '\n');
  return file;
}

/** The figures as a Markdown table, the one docs/performance.md carries. */
export function markdownTable(results: BenchResult[]): string {
  const rows = results.map((r) => `| ${r.name} | ${figure(r.value)} | ${r.unit} | ${r.ratio === null ? '—' : `${r.ratio.toFixed(3)} (${r.ratioOf})`} | ${r.target ?? '—'} | ${r.met === null ? '—' : r.met ? 'yes' : 'no'} |`);
  return ['| name | value | unit | ratio | target | met |', '|---|---|---|---|---|---|', ...rows].join('\n');
}
