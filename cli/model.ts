// `model`: evaluates the reference model for angle codes and prints
// { "config": {…every key}, "results": [{ "code", "cos", "sin" }, …] } as JSON.
// Codes come from --codes (comma-separated), --codes-file (one a line) or --plan.
import { parseArgs } from 'node:util';
import { assertAngleCode, createCordicModel, ModelConfigError, planCodes, PlanError, type CordicModel } from '../shared/numeric';
import { runCommand, UsageError } from './command';
import type { CliIo } from './io';

const HELP = `usage: npm run --silent cli -- model [--config '<json>'] (--codes 0,1,2 | --codes-file F | --plan P)

  --config JSON     model configuration; missing keys take their defaults
  --codes LIST      angle codes, comma-separated (decimal, or 0x hex)
  --codes-file F    angle codes, one a line (blank lines skipped)
  --plan P          exhaustive, edges, or a plan as JSON, e.g. '{"kind":"sweep","start":0,"step":64,"count":16}'

Prints JSON and exits 0; a bad configuration or code prints one line naming it and exits 2.
`;

const INTEGER = /^[+-]?(0x[0-9a-f]+|\d+)$/i;

function parseCode(text: string, where: string): number {
  const t = text.trim();
  if (!INTEGER.test(t)) throw new UsageError(`${where}: "${t}" is not an integer angle code`);
  const negative = t.startsWith('-');
  const digits = t.replace(/^[+-]/, '');
  const v = Number(digits); // Number() reads both decimal and 0x hex
  return negative ? -v : v;
}

function readCodes(model: CordicModel, values: { codes?: string; 'codes-file'?: string; plan?: string }, io: CliIo): ArrayLike<number> {
  const given = (['codes', 'codes-file', 'plan'] as const).filter((k) => values[k] !== undefined);
  if (given.length !== 1) throw new UsageError(`give exactly one of --codes, --codes-file, --plan (got ${given.length ? given.map((k) => `--${k}`).join(', ') : 'none'})`);
  const check = (code: number, where: string) => {
    try {
      assertAngleCode(model.config, code);
    } catch (e) {
      throw new UsageError(`${where}: ${(e as Error).message}`);
    }
    return code;
  };
  if (values.codes !== undefined) {
    return values.codes.split(',').map((s, i) => check(parseCode(s, `codes[${i}]`), `codes[${i}]`));
  }
  if (values['codes-file'] !== undefined) {
    const path = values['codes-file'];
    let text: string;
    try {
      text = io.readFile(path);
    } catch (e) {
      throw new UsageError(`codes-file: cannot read ${path} (${(e as NodeJS.ErrnoException).code ?? (e as Error).message})`);
    }
    const codes: number[] = [];
    text.split(/\r?\n/).forEach((line, i) => {
      if (line.trim() === '') return;
      const where = `codes-file line ${i + 1}`;
      codes.push(check(parseCode(line, where), where));
    });
    return codes;
  }
  const p = values.plan!.trim();
  let plan: unknown;
  if (p.startsWith('{')) {
    try {
      plan = JSON.parse(p);
    } catch {
      throw new UsageError('plan: is neither a plan name nor valid JSON');
    }
  } else {
    plan = { kind: p };
  }
  try {
    return planCodes(plan, model.config);
  } catch (e) {
    if (e instanceof PlanError) throw new UsageError(`plan.${e.message}`);
    throw e;
  }
}

function parseConfig(text: string | undefined): unknown {
  if (text === undefined) return {};
  try {
    return JSON.parse(text);
  } catch {
    throw new UsageError('config: is not valid JSON');
  }
}

/** The options, or 'help'; parseArgs' own errors are bad options (exit 2). */
function parseModelArgs(argv: string[]) {
  const { values } = parseArgs({
    args: argv,
    options: {
      config: { type: 'string' },
      codes: { type: 'string' },
      'codes-file': { type: 'string' },
      plan: { type: 'string' },
      help: { type: 'boolean', short: 'h' },
    },
    allowPositionals: false,
    strict: true,
  });
  return values.help ? ('help' as const) : values;
}
type ModelArgsValues = Exclude<ReturnType<typeof parseModelArgs>, 'help'>;

/** Runs `model` with its own arguments; returns the exit status. */
export const runModelCommand = (argv: string[], io: CliIo): Promise<number> =>
  runCommand(argv, io, { parse: parseModelArgs, help: HELP, run: (values) => modelCommand(values, io) });

async function modelCommand(values: ModelArgsValues, io: CliIo): Promise<number> {
  let model: CordicModel;
  try {
    model = createCordicModel(parseConfig(values.config) as object);
  } catch (e) {
    if (e instanceof ModelConfigError) throw new UsageError(`config.${e.message}`);
    throw e;
  }
  const codes = readCodes(model, values, io);
  const cos = new Int32Array(codes.length);
  const sin = new Int32Array(codes.length);
  model.evaluateInto(codes, cos, sin);
  // One result a line keeps large answers readable and diffable; the whole is still one JSON value.
  const rows = new Array<string>(codes.length);
  for (let i = 0; i < codes.length; i++) rows[i] = `{"code":${codes[i]},"cos":${cos[i]},"sin":${sin[i]}}`;
  io.stdout(`{"config":${JSON.stringify(model.config)},"results":[${rows.length ? '\n' + rows.join(',\n') + '\n' : ''}]}\n`);
  return 0;
}
