// `explain`: which configuration deviation or catalogue defect reproduces a core's answers
// (docs/explain.md). Prints { "declared", "answered", "hypotheses" } as JSON (a vectoring core's
// with "mode": "vectoring" first); exit 0 when the best hypothesis reproduces every answer, 1 when
// none does, 2 on an error (one line on stderr).
import { readFileSync } from 'node:fs';
import { parseArgs } from 'node:util';
import { explain, explainVectors, ExplainInputError, type Explanation, type VectorExplanation } from '../shared/explain';
import { ArchiveError, readArchive as readArchiveFile } from '../shared/link';
import { vectorSamplesFromArchive } from '../shared/link-engine/vector-archive-samples';
import { samplesFromArchive } from '../shared/link-engine/archive-samples';
import { parseSampleCsv, SampleCsvError } from '../shared/link-engine/sample-csv';
import { parseVectorCsv } from '../shared/link-engine/vector-sample-csv';
import { angleCodeRange, ModelConfigError, outputCodeRange, parseModelConfig, type ModelConfig } from '../shared/numeric';
import { angleOutputRange, inputRange, magnitudeRange, parseVectorConfig, type VectorConfig } from '../shared/vectoring';
import { runCommand, UsageError } from './command';
import type { CliIo } from './io';

const HELP = `usage: npm run --silent cli -- explain [--mode M] [--config '<json>'] (--samples-file F | --archive F)

  --mode M            rotation or vectoring: the kind of core that answered (default rotation, or
                      what a runner archive's label says)
  --config JSON       the core's declared model configuration (missing keys take their defaults;
                      a vectoring configuration with --mode vectoring); with --archive, the
                      archive's label gives it unless this is given
  --samples-file F    answers as CSV: the header angle_code,cos_code,sin_code, then one row each;
                      with --mode vectoring the header x_code,y_code,angle_code,magnitude_code
  --archive F         a capture archive (run --out, or the Bench page's recording)

Prints { ["mode": "vectoring",] "declared", "answered", "hypotheses": [ { "label", "config", "fault", "exact",
"maxDiffLsb", "equivalent" }, … ] }, best first, at most 10. Exit 0 when the best reproduces every
answer, 1 when none does, 2 on an error.
`;

/** Reads bytes of a file; tests swap it. */
export interface ExplainDeps {
  readBytes?(path: string): Uint8Array;
}

interface Samples {
  angle: Float64Array;
  cos: Int32Array;
  sin: Int32Array;
  /** Where sample k came from, for messages: "line 7" of the CSV, or "sample 7" of an archive. */
  where(k: number): string;
}

function parseConfig(text: string): ModelConfig {
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch {
    throw new UsageError('config: is not valid JSON');
  }
  try {
    return parseModelConfig(json);
  } catch (e) {
    if (e instanceof ModelConfigError) throw new UsageError(`config.${e.message}`);
    throw e;
  }
}

function fileError(what: string, path: string, e: unknown): UsageError {
  return new UsageError(`${what}: cannot read ${path} (${(e as NodeJS.ErrnoException).code ?? (e as Error).message})`);
}

/** A CSV of answers read with `parse`, and each row's place for the messages (`samples-file line N`). */
function readCsvFile<T>(path: string, io: CliIo, parse: (text: string) => T): { rows: T; where: (k: number) => string } {
  let text: string;
  try {
    text = io.readFile(path);
  } catch (e) {
    throw fileError('samples-file', path, e);
  }
  let rows: T;
  try {
    rows = parse(text);
  } catch (e) {
    if (e instanceof SampleCsvError) throw new UsageError(`samples-file ${e.message}`);
    throw e;
  }
  // The parser skips blank lines: keep each row's line number for the messages.
  const lines: number[] = [];
  text.replace(/^\uFEFF/, '').split(/\r?\n/).forEach((line, i) => {
    if (i > 0 && line.trim() !== '') lines.push(i + 1);
  });
  return { rows, where: (k) => `samples-file line ${lines[k]}` };
}

function readCsv(path: string, io: CliIo): Samples {
  const { rows, where } = readCsvFile(path, io, parseSampleCsv);
  return { angle: Float64Array.from(rows.codes), cos: rows.cos, sin: rows.sin, where };
}

function readArchive(path: string, deps: ExplainDeps): Samples & { label: string } {
  let bytes: Uint8Array;
  try {
    bytes = (deps.readBytes ?? readFileSync)(path);
  } catch (e) {
    throw fileError('archive', path, e);
  }
  try {
    const found = samplesFromArchive(bytes);
    return { angle: Float64Array.from(found.codes), cos: found.cos, sin: found.sin, label: found.label, where: (k) => `archive sample ${k + 1}` };
  } catch (e) {
    if (e instanceof ArchiveError || e instanceof RangeError) throw new UsageError(`archive: ${path} is not a readable capture archive (${(e as Error).message})`);
    throw e;
  }
}

/** The model configuration a runner archive's label records (`run --out` writes it as `model`). */
function configFromLabel(label: string): ModelConfig {
  let o: unknown;
  try {
    o = JSON.parse(label);
  } catch {
    o = null;
  }
  const model = o && typeof o === 'object' && 'model' in o ? (o as { model: unknown }).model : undefined;
  if (model === undefined) throw new UsageError("archive: its label holds no model configuration; give the core's with --config");
  try {
    return parseModelConfig(model);
  } catch (e) {
    if (e instanceof ModelConfigError) throw new UsageError(`archive label model.${e.message}`);
    throw e;
  }
}

/** Every code must fit the declared formats; the message names the line (or sample) at fault. */
function checkRanges(config: ModelConfig, s: Samples): void {
  const a = angleCodeRange(config);
  const o = outputCodeRange(config);
  for (let k = 0; k < s.angle.length; k++) {
    const v = s.angle[k];
    if (v < a.min || v > a.max) throw new UsageError(`${s.where(k)}: angle code ${v} is not ${a.min}..${a.max} (${config.angleFormat}, ${config.angleBits} bits)`);
    for (const [name, c] of [['cos', s.cos[k]], ['sin', s.sin[k]]] as const) {
      if (c < o.min || c > o.max) throw new UsageError(`${s.where(k)}: ${name} code ${c} is not ${o.min}..${o.max} (${config.outBits} bits)`);
    }
  }
}

/** A vectoring core's answers as CSV (`x_code,y_code,angle_code,magnitude_code`), each code in the declared formats. */
function readVectorCsv(path: string, io: CliIo, config: VectorConfig) {
  const { rows: s, where } = readCsvFile(path, io, parseVectorCsv);
  return checkVectorRanges(config, { x: s.xs, y: s.ys, angle: s.angles, magnitude: s.magnitudes }, where);
}

/** Every vectoring code must fit the declared formats; the message names the line (or sample) at fault. */
function checkVectorRanges<S extends { x: Int32Array; y: Int32Array; angle: Int32Array; magnitude: Int32Array }>(config: VectorConfig, s: S, whereOf: (k: number) => string): S {
  const inputs = inputRange(config);
  const angle = angleOutputRange(config);
  const magnitude = magnitudeRange(config);
  for (let k = 0; k < s.x.length; k++) {
    const where = whereOf(k);
    for (const [name, v] of [['x', s.x[k]], ['y', s.y[k]]] as const) {
      if (v < inputs.min || v > inputs.max) throw new UsageError(`${where}: ${name} code ${v} is not ${inputs.min}..${inputs.max} (${config.inBits} bits)`);
    }
    if (s.angle[k] < angle.min || s.angle[k] > angle.max) throw new UsageError(`${where}: angle code ${s.angle[k]} is not ${angle.min}..${angle.max} (${config.angleFormat}, ${config.angleBits} bits)`);
    if (s.magnitude[k] < magnitude.min || s.magnitude[k] > magnitude.max) throw new UsageError(`${where}: magnitude code ${s.magnitude[k]} is not ${magnitude.min}..${magnitude.max} (${config.magBits} bits)`);
  }
  return s;
}

function parseVectorConfigText(text: string): VectorConfig {
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch {
    throw new UsageError('config: is not valid JSON');
  }
  try {
    return parseVectorConfig(json);
  } catch (e) {
    if (e instanceof ModelConfigError) throw new UsageError(`config.${e.message}`);
    throw e;
  }
}

/** The command's JSON: the keys outside scripts rely on, in this order ("mode" only for a vectoring core). */
export function explanationJson(e: Explanation | VectorExplanation): string {
  const ref = (h: { label: string; config: object; fault: unknown }) => ({ label: h.label, config: h.config, fault: h.fault });
  const hypotheses = e.hypotheses.map((h) => ({ ...ref(h), exact: h.exact, maxDiffLsb: h.maxDiffLsb, equivalent: h.equivalent.map(ref) }));
  const mode = e.mode === 'vectoring' ? { mode: e.mode } : {};
  return `${JSON.stringify({ ...mode, declared: e.declared, answered: e.answered, hypotheses }, null, 2)}\n`;
}

/** The options, or 'help'; parseArgs' own errors are bad options (exit 2). */
function parseExplainArgs(argv: string[]) {
  const { values } = parseArgs({
    args: argv,
    options: {
      mode: { type: 'string' },
      config: { type: 'string' },
      'samples-file': { type: 'string' },
      archive: { type: 'string' },
      help: { type: 'boolean', short: 'h' },
    },
    allowPositionals: false,
    strict: true,
  });
  return values.help ? ('help' as const) : values;
}
type ExplainArgsValues = Exclude<ReturnType<typeof parseExplainArgs>, 'help'>;

/** Runs `explain` with its own arguments; returns the exit status. */
export const runExplainCommand = (argv: string[], io: CliIo, deps: ExplainDeps = {}): Promise<number> =>
  runCommand(argv, io, { parse: parseExplainArgs, help: HELP, run: (values) => explainCommand(values, io, deps) });

async function explainCommand(values: ExplainArgsValues, io: CliIo, deps: ExplainDeps): Promise<number> {
  const given = (['samples-file', 'archive'] as const).filter((k) => values[k] !== undefined);
  if (given.length !== 1) throw new UsageError(`give exactly one of --samples-file, --archive (got ${given.length ? given.map((k) => `--${k}`).join(', ') : 'none'})`);
  const mode = values.mode ?? (values.archive !== undefined && archiveIsVectoring(values.archive, deps) ? 'vectoring' : 'rotation');
  if (mode !== 'rotation' && mode !== 'vectoring') throw new UsageError(`--mode must be rotation or vectoring, got "${mode}"`);
  if (mode === 'vectoring') return explainVectorCommand(values, io, deps);
  let config: ModelConfig;
  let samples: Samples;
  if (values['samples-file'] !== undefined) {
    if (values.config === undefined) throw new UsageError("give the core's declared configuration with --config (a CSV does not hold it)");
    config = parseConfig(values.config);
    samples = readCsv(values['samples-file'], io);
  } else {
    const found = readArchive(values.archive!, deps);
    if (found.angle.length === 0) throw new UsageError('archive: it holds no answered requests');
    config = values.config !== undefined ? parseConfig(values.config) : configFromLabel(found.label);
    samples = found;
  }
  checkRanges(config, samples);
  let explanation: Explanation;
  try {
    explanation = explain(config, samples);
  } catch (e) {
    if (e instanceof ExplainInputError) throw new UsageError(e.message);
    throw e;
  }
  io.stdout(explanationJson(explanation));
  return explanation.hypotheses[0].exact === explanation.answered ? 0 : 1;
}

/** The `mode` a runner archive's label records, when the file reads as an archive at all. */
function labelOf(label: string): { mode?: unknown; model?: unknown } | null {
  try {
    const o = JSON.parse(label) as unknown;
    return o && typeof o === 'object' ? (o as { mode?: unknown; model?: unknown }) : null;
  } catch {
    return null;
  }
}

/** Whether the archive's label says a vectoring run wrote it (an unreadable file: no, and the rotation path says why). */
function archiveIsVectoring(path: string, deps: ExplainDeps): boolean {
  try {
    return labelOf(readArchiveFile((deps.readBytes ?? readFileSync)(path)).header.label)?.mode === 'vectoring';
  } catch {
    return false;
  }
}

function readVectorArchive(path: string, deps: ExplainDeps) {
  let bytes: Uint8Array;
  try {
    bytes = (deps.readBytes ?? readFileSync)(path);
  } catch (e) {
    throw fileError('archive', path, e);
  }
  try {
    return vectorSamplesFromArchive(bytes);
  } catch (e) {
    if (e instanceof ArchiveError || e instanceof RangeError) throw new UsageError(`archive: ${path} is not a readable capture archive (${(e as Error).message})`);
    throw e;
  }
}

/** `explain --mode vectoring`: a vectoring core's answers (CSV or a vectoring capture) against its declared vectoring configuration. */
function explainVectorCommand(values: ExplainArgsValues, io: CliIo, deps: ExplainDeps): number {
  let config: VectorConfig;
  let samples: { x: Int32Array; y: Int32Array; angle: Int32Array; magnitude: Int32Array };
  if (values.archive !== undefined) {
    const found = readVectorArchive(values.archive, deps);
    if (found.xs.length === 0) throw new UsageError('archive: it holds no answered vectoring requests');
    if (values.config !== undefined) config = parseVectorConfigText(values.config);
    else {
      const model = labelOf(found.label)?.model;
      if (model === undefined) throw new UsageError("archive: its label holds no vectoring configuration; give the core's with --config");
      config = parseVectorConfigText(JSON.stringify(model));
    }
    // The CSV's range checks, on the archive's answers.
    samples = checkVectorRanges(config, { x: found.xs, y: found.ys, angle: found.angles, magnitude: found.magnitudes }, (k) => `archive sample ${k + 1}`);
  } else {
    if (values.config === undefined) throw new UsageError("give the core's declared vectoring configuration with --config (a CSV does not hold it)");
    config = parseVectorConfigText(values.config);
    samples = readVectorCsv(values['samples-file']!, io, config);
  }
  let explanation: VectorExplanation;
  try {
    explanation = explainVectors(config, samples);
  } catch (e) {
    if (e instanceof ExplainInputError) throw new UsageError(e.message);
    throw e;
  }
  io.stdout(explanationJson(explanation));
  return explanation.hypotheses[0].exact === explanation.answered ? 0 : 1;
}
