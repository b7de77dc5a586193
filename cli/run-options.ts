// The `run` command line, validated at the edge: every mistake is one line naming the option.
import { parseArgs } from 'node:util';
import { z } from 'zod';
import { isCrc8Name, type Crc8Name } from '../shared/link';
import { parseModelConfig, type ModelConfigInput } from '../shared/numeric';
import { parseVectorConfig, type VectorConfig } from '../shared/vectoring';
import { parseVectorPlanSpec, type VectorPlanSpec } from './run-vector-plan';
import { parseLimits, type Limits } from './run-verdict';
import type { Conditions, SoakSpec } from '../shared/soak';
import { parseConditionOptions } from './conditions';
import { parseSoakOption } from './soak';

export const RUN_USAGE = 'usage: anglebench run --device <serial path | ws://host:port/> --plan <plan> --core <slug> [options]';

export const RUN_HELP = `${RUN_USAGE}
       (from a checkout: npm run --silent cli -- run …)

  --device D       a serial port (/dev/ttyUSB0, COM3), a WebSocket device (ws://127.0.0.1:5175/)
                   or a station on the server (station:NAME; needs --server and --token)
  --baud N         line rate, 9600..12000000 (default: the core's link profile, else 3000000)
  --crc NAME       frame check, e.g. CRC-8/AUTOSAR (default: the core's link profile, else CRC-8/SMBUS)
  --plan P         exhaustive | sweep:START,STEP,COUNT | random:COUNT,SEED | edges | tone:M,N | file:PATH
                   a vectoring core: exhaustive | grid:TARGET | circle:RADIUS,POINTS | random:COUNT,SEED
                   | edges | file:PATH (one "x,y" a line)
  --mode M         rotation | vectoring (default: what the board says it serves, rotation first)
  --core SLUG      the core under test (its model and limits come from the server when one is given)
  --build LABEL    the bitstream build on the board, for the record
  --board NAME     the bench board, for the record
  --server URL     the Anglebench server; needs --token (a personal API token)
  --token T        personal API token, sent as "Authorization: Bearer T"
  --limits JSON    acceptance limits, e.g. '{"maxAbsErrorLsb":2,"maxModelMismatches":0}'
  --config JSON    reference-model configuration (default: the server's core, else from INFO;
                   a vectoring core's keys for --mode vectoring, default from MODE_INFO)
  --out FILE       write the capture archive (both directions) to FILE
  --json           print a machine-readable summary on stdout (progress stays on stderr)
  --soak N|D       repeat the plan: N passes (50) or for a duration (90s, 30m, 2h); lists unstable codes
                   (vectors for a vectoring core, which the server does not keep yet: not with --server)
  --condition K=V  an operating condition, repeatable: temperature_c=85, vccint_v=0.95, clock_mhz=200,
                   or any name=value; saved with the session
  --junit FILE     write the verdict as JUnit XML to FILE: a test case per limit, the session's address
  --explain        after the run, name the configuration or RTL defect that reproduces the answers
                   (printed, and the summary's "explanation" key)

Ctrl-C stops the run cleanly: what was captured is scored and written to --out, nothing is
uploaded; a second Ctrl-C quits at once.
Exit status: 0 every limit passes, 1 a limit fails, 2 an error (one line on stderr),
130 interrupted by Ctrl-C.
`;

/** A bad command line: one line for the user, exit status 2. */
export class UsageError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'UsageError';
  }
}

/** The plan as typed: resolved against the core's angle format once INFO is known. */
export type PlanSpec =
  | { kind: 'exhaustive' }
  | { kind: 'edges' }
  | { kind: 'sweep'; start: number; step: number; count: number }
  | { kind: 'random'; count: number; seed: number }
  | { kind: 'tone'; cycles: number; samples: number }
  | { kind: 'file'; path: string };

export interface RunOptions {
  device: string;
  baud: number | null;
  /** --mode, or null: the board's own (rotation when it serves both). */
  mode: 'rotation' | 'vectoring' | null;
  /** The plan read for a rotating core; null when --plan only reads as a vectoring plan. */
  plan: PlanSpec | null;
  /** The plan read for a vectoring core; null when --plan only reads as a rotating one. */
  vectorPlan: VectorPlanSpec | null;
  planText: string;
  core: string;
  build: string | null;
  board: string | null;
  server: { url: string; token: string } | null;
  limits: Limits | null;
  /** --config read for a rotating core; null when not given or only a vectoring configuration. */
  config: ModelConfigInput | null;
  /** --config read for a vectoring core; null when not given or only a rotating configuration. */
  vectorConfig: VectorConfig | null;
  out: string | null;
  junit: string | null;
  json: boolean;
  explain: boolean;
  help: boolean;
  crc: Crc8Name | null;
  soak: SoakSpec | null;
  conditions: Conditions;
}

const INTEGER = /^[+-]?(0x[0-9a-f]+|\d+)$/i;

/** An integer in decimal or 0x hex, signed. */
export function parseInteger(text: string, where: string): number {
  const t = text.trim();
  if (!INTEGER.test(t)) throw new UsageError(`${where}: "${t}" is not an integer`);
  const v = Number(t.replace(/^[+-]/, ''));
  return t.startsWith('-') ? -v : v;
}

/**
 * How one plan of a `--plan NAME[:ARGS]` table reads: 'none' without arguments, 'path' as
 * NAME:PATH, or whole numbers, comma-separated, into these fields (`spelled` as messages name them).
 */
export type PlanArgs = 'none' | 'path' | { fields: readonly string[]; spelled: string };

/** Reads `--plan NAME[:ARGS]` by a table of plans; `others` names them for a NAME not in it. Ranges are checked later. */
export function parsePlanArg(text: string, plans: Readonly<Record<string, PlanArgs>>, others: string): { kind: string } & Record<string, number | string> {
  const [name, ...rest] = text.split(':');
  const arg = rest.join(':');
  const shape = Object.hasOwn(plans, name) ? plans[name] : undefined;
  if (shape === undefined) throw new UsageError(`${others}, got "${text}"`);
  if (shape === 'path') {
    if (arg === '') throw new UsageError(`--plan ${name} needs a path: ${name}:PATH`);
    return { kind: name, path: arg };
  }
  if (shape === 'none') {
    if (arg !== '') throw new UsageError(`--plan ${name} takes no arguments`);
    return { kind: name };
  }
  const parts = arg.split(',');
  if (parts.length !== shape.fields.length) throw new UsageError(`--plan ${name} needs ${shape.spelled}, got "${arg}"`);
  return { kind: name, ...Object.fromEntries(shape.fields.map((f, i) => [f, parseInteger(parts[i], `--plan ${name}`)])) };
}

/** The plans of a rotating core, as --plan spells them. */
const ROTATION_PLANS: Record<PlanSpec['kind'], PlanArgs> = {
  exhaustive: 'none',
  edges: 'none',
  sweep: { fields: ['start', 'step', 'count'], spelled: 'START,STEP,COUNT' },
  random: { fields: ['count', 'seed'], spelled: 'COUNT,SEED' },
  tone: { fields: ['cycles', 'samples'], spelled: 'M,N (M cycles in N samples)' },
  file: 'path',
};

/** Parse a --plan value; ranges are checked later, against the core's format. */
export function parsePlanSpec(text: string): PlanSpec {
  return parsePlanArg(text, ROTATION_PLANS, '--plan must be exhaustive, sweep:START,STEP,COUNT, random:COUNT,SEED, edges, tone:M,N or file:PATH') as PlanSpec;
}

function json(text: string, option: string): unknown {
  try {
    return JSON.parse(text);
  } catch {
    throw new UsageError(`--${option} must be JSON`);
  }
}

const urlSchema = z.url({ protocol: /^https?$/ });

/** `read()`, or null when it refuses the command line. */
function attempt<T>(read: () => T): T | null {
  try {
    return read();
  } catch (e) {
    if (e instanceof UsageError) return null;
    throw e;
  }
}

export function parseRunArgs(argv: string[]): RunOptions {
  let values: Record<string, string | boolean | string[] | undefined>;
  try {
    ({ values } = parseArgs({
      args: argv,
      strict: true,
      allowPositionals: false,
      options: {
        device: { type: 'string' },
        baud: { type: 'string' },
        mode: { type: 'string' },
        plan: { type: 'string' },
        core: { type: 'string' },
        build: { type: 'string' },
        board: { type: 'string' },
        server: { type: 'string' },
        token: { type: 'string' },
        limits: { type: 'string' },
        config: { type: 'string' },
        crc: { type: 'string' },
        out: { type: 'string' },
        junit: { type: 'string' },
        json: { type: 'boolean' },
        soak: { type: 'string' },
        condition: { type: 'string', multiple: true },
        explain: { type: 'boolean' },
        help: { type: 'boolean', short: 'h' },
      },
    }));
  } catch (e) {
    throw new UsageError((e as Error).message.split('\n')[0]);
  }
  const str = (k: string) => (typeof values[k] === 'string' ? (values[k] as string) : undefined);
  if (values.help) return { help: true } as RunOptions;
  for (const [k, v] of Object.entries(values)) if (v === '') throw new UsageError(`--${k} must not be empty`);
  for (const k of ['device', 'plan', 'core']) if (str(k) === undefined) throw new UsageError(`--${k} is required (see run --help)`);
  let baud: number | null = null;
  if (str('baud') !== undefined) {
    baud = parseInteger(str('baud')!, '--baud');
    if (baud < 9_600 || baud > 12_000_000) throw new UsageError(`--baud must be 9600..12000000, got ${baud}`);
  }
  const serverUrl = str('server');
  const token = str('token');
  if ((serverUrl === undefined) !== (token === undefined)) throw new UsageError('--server and --token go together');
  if (str('device')!.startsWith('station:') && serverUrl === undefined) throw new UsageError(`--device ${str('device')} needs --server and --token: a station is reached through the team server`);
  if (serverUrl !== undefined && !urlSchema.safeParse(serverUrl).success) throw new UsageError(`--server must be an http(s) URL, got "${serverUrl}"`);
  const mode = str('mode') ?? null;
  if (mode !== null && mode !== 'rotation' && mode !== 'vectoring') throw new UsageError(`--mode must be rotation or vectoring, got "${mode}"`);
  // Without --mode the board decides, so --plan and --config are read both ways; a text that is
  // neither is refused as a rotating core's (the older, commoner reading).
  const both = <R, V>(rotating: () => R, vectoring: () => V): { r: R | null; v: V | null } => {
    if (mode === 'rotation') return { r: rotating(), v: null };
    if (mode === 'vectoring') return { r: null, v: vectoring() };
    const r = attempt(rotating);
    const v = attempt(vectoring);
    if (r === null && v === null) rotating();
    return { r, v };
  };
  let config: { r: ModelConfigInput | null; v: VectorConfig | null } = { r: null, v: null };
  if (str('config') !== undefined) {
    const input = json(str('config')!, 'config');
    const read = <T>(parse: (i: unknown) => T) => () => {
      try {
        return parse(input);
      } catch (e) {
        throw new UsageError(`--config: ${(e as Error).message}`);
      }
    };
    config = both(read(parseModelConfig), read(parseVectorConfig));
  }
  const plan = both(() => parsePlanSpec(str('plan')!), () => parseVectorPlanSpec(str('plan')!));
  const crc = str('crc');
  if (crc !== undefined && !isCrc8Name(crc)) throw new UsageError(`--crc must be a catalogued CRC-8 name such as CRC-8/SMBUS, got "${crc}"`);
  const core = str('core')!;
  if (!/^[a-z0-9]+(?:-[a-z0-9]+)*$/.test(core)) throw new UsageError(`--core must be a core slug (lower-case letters, digits, single hyphens), got "${core}"`);
  return {
    device: str('device')!,
    baud,
    mode,
    plan: plan.r,
    vectorPlan: plan.v,
    planText: str('plan')!,
    core,
    build: str('build') ?? null,
    board: str('board') ?? null,
    server: serverUrl !== undefined ? { url: serverUrl.replace(/\/+$/, ''), token: token! } : null,
    limits: str('limits') !== undefined ? parseLimits(json(str('limits')!, 'limits'), '--limits') : null,
    config: config.r,
    vectorConfig: config.v,
    out: str('out') ?? null,
    junit: str('junit') ?? null,
    json: values.json === true,
    explain: values.explain === true,
    help: false,
    crc: (crc as Crc8Name | undefined) ?? null,
    soak: str('soak') !== undefined ? parseSoakOption(str('soak')!) : null,
    conditions: parseConditionOptions((values.condition as string[] | undefined) ?? []),
  };
}
