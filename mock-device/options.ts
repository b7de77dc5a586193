import { parseArgs } from 'node:util';
import { parseModelConfig } from '../shared/numeric';
import { defaultBoardSettings, type BoardSettings } from './board-session';
import { applyCoreFaultText } from './core-fault-text';
import { parseLineFaults } from './line-faults';
import { boardConditionArgs } from './flaky-options';
import { parseVectorConfig } from '../shared/vectoring';
import { VECTOR_FAULT_SPELLINGS } from './vector-core';

export const USAGE = `npm run mock -- [--ws-port 5175] [--baud 3000000] [--mode rotation|vectoring] [--core '<json model config>']
  [--queue-depth 256] [--build-id N] [--name S]
  [--line-faults 'ber=1e-5,drop=1e-6,jitter-ms=2,seed=7'] [--core-fault F] [--seed N] [--condition name=value]…
  F: a catalogue defect (sign-slip:K, atan-entry:K:±D, stuck-bit:cos:B:1, … see docs/explain.md),
     a configuration deviation key=value (iterations=15, fold=false), gain, fold, sign:K, stuck:B,
     or an intermittent one, flaky:RATE[@SECONDS]
  --mode vectoring: a vectoring core; --core takes its keys (docs/model.md "Vectoring cores") and
     F is ${VECTOR_FAULT_SPELLINGS.join(', ')}, key=value (iterations=15, gainCompensation=none) or flaky:RATE[@SECONDS]`;

function int(name: string, text: string, min: number, max: number): number {
  const n = Number(text);
  if (!Number.isInteger(n) || n < min || n > max) throw new Error(`--${name} must be an integer ${min}..${max}, got "${text}"`);
  return n;
}

/** Parse the simulated board's command line; errors name the option. */
export function parseBoardArgs(args: string[]): { port: number; settings: BoardSettings } {
  const { values } = parseArgs({
    args,
    strict: true,
    options: {
      'ws-port': { type: 'string' },
      baud: { type: 'string' },
      mode: { type: 'string' },
      core: { type: 'string' },
      'queue-depth': { type: 'string' },
      'build-id': { type: 'string' },
      name: { type: 'string' },
      'line-faults': { type: 'string' },
      'core-fault': { type: 'string' },
      seed: { type: 'string' },
      condition: { type: 'string', multiple: true },
    },
  });
  const s = defaultBoardSettings();
  const mode = values.mode ?? 'rotation';
  if (mode !== 'rotation' && mode !== 'vectoring') throw new Error(`--mode must be rotation or vectoring, got "${mode}"`);
  let json: unknown;
  if (values.core !== undefined) {
    try {
      json = JSON.parse(values.core);
    } catch {
      throw new Error(`--core must be JSON, e.g. '${mode === 'vectoring' ? '{"inBits":12,"iterations":12}' : '{"outBits":18,"outFrac":16}'}'`);
    }
  }
  if (mode === 'vectoring') s.vector = { core: parseVectorConfig(json ?? {}) };
  else if (json !== undefined) s.core = parseModelConfig(json);
  if (values.baud !== undefined) s.baud = int('baud', values.baud, 9_600, 12_000_000);
  if (values['queue-depth'] !== undefined) s.queueDepth = int('queue-depth', values['queue-depth'], 1, 65_535);
  if (values['build-id'] !== undefined) s.buildId = int('build-id', values['build-id'], 0, 0xffff_ffff);
  if (values.name !== undefined) {
    if (!/^[\x20-\x7e]{0,200}$/.test(values.name)) throw new Error('--name must be printable ASCII, at most 200 characters');
    s.name = values.name;
  }
  if (values['line-faults'] !== undefined) s.lineFaults = parseLineFaults(values['line-faults']);
  if (values['core-fault'] !== undefined) applyCoreFaultText(s, values['core-fault']);
  if (values.seed !== undefined) s.seed = int('seed', values.seed, 0, 0xffff_ffff);
  Object.assign(s, boardConditionArgs(values.condition ?? [], s.name));
  const port = values['ws-port'] !== undefined ? int('ws-port', values['ws-port'], 0, 65_535) : 5175;
  return { port, settings: s };
}
