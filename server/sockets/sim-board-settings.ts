// What a hosted simulated board is, read from its WebSocket address: a core's link profile and
// model (`?core=<id or slug>`; a vectoring core gets a vectoring board), or a model configuration
// of its own (`?config=<json>`, read as `mode` says: rotation unless `mode=vectoring`), with an
// optional core fault (against the catalogue of the board's mode), seed, line faults and baud
// rate. Bad input is a 400 with the key named.
import { modeOf, rotationConfigOf, vectorConfigOf } from '../services/core-mode';
import { defaultBoardSettings, type BoardSettings } from '../../mock-device/board-session';
import { applyCoreFaultText } from '../../mock-device/core-fault-text';
import { parseLineFaults } from '../../mock-device/line-faults';
import { parseModelConfig } from '../../shared/numeric';
import { parseVectorConfig } from '../../shared/vectoring';
import { Core } from '../db/models';
import { HttpError } from '../http-error';
import { linkProfileSchema } from '../schemas/core';

const KEYS = new Set(['core', 'config', 'mode', 'fault', 'seed', 'line-faults', 'baud']);
const MODES = ['rotation', 'vectoring'] as const;

const bad = (message: string) => new HttpError(400, 'invalid', message);

function attempt<T>(key: string, parse: () => T): T {
  try {
    return parse();
  } catch (err) {
    throw bad(`${key}: ${(err as Error).message}`);
  }
}

export async function simBoardSettings(query: URLSearchParams): Promise<BoardSettings> {
  for (const key of query.keys()) if (!KEYS.has(key)) throw bad(`Unknown setting "${key}": use ${[...KEYS].join(', ')}`);
  const s = defaultBoardSettings();
  const coreRef = query.get('core');
  const config = query.get('config');
  const modeText = query.get('mode');
  if (coreRef !== null && config !== null) throw bad('Give core or config, not both');
  if (modeText !== null && !(MODES as readonly string[]).includes(modeText)) throw bad(`mode must be rotation or vectoring, got "${modeText}"`);
  let mode = (modeText ?? 'rotation') as (typeof MODES)[number];
  if (coreRef !== null) {
    const core = /^\d+$/.test(coreRef) ? await Core.findByPk(Number(coreRef)) : await Core.findOne({ where: { slug: coreRef } });
    if (!core) throw new HttpError(404, 'not_found', `Core ${coreRef} not found`);
    // The core decides the board's mode; a `mode` that says otherwise is a mistake worth naming.
    if (modeText !== null && modeText !== modeOf(core)) throw bad(`mode: core ${core.slug} is a ${modeOf(core)} core, not ${modeText}`);
    mode = modeOf(core);
    const link = linkProfileSchema.parse(core.linkProfile);
    if (mode === 'vectoring') s.vector = { core: vectorConfigOf(core, 'the simulated board') };
    else s.core = rotationConfigOf(core, 'the simulated board');
    s.baud = link.baud;
    s.crc = link.crc;
    s.name = `Anglebench simulated board (${core.slug})`;
  } else if (mode === 'vectoring') s.vector = { core: {} };
  if (config !== null) {
    const json = attempt('config', () => {
      try {
        return JSON.parse(config) as unknown;
      } catch {
        throw new Error(`must be JSON, e.g. ${mode === 'vectoring' ? '{"inBits":12,"iterations":12}' : '{"outBits":18,"outFrac":16}'}`);
      }
    });
    if (mode === 'vectoring') s.vector = { core: attempt('config', () => parseVectorConfig(json)) };
    else s.core = attempt('config', () => parseModelConfig(json));
  }
  const seed = query.get('seed');
  if (seed !== null) {
    const n = Number(seed);
    if (!/^\d+$/.test(seed) || n > 0xffff_ffff) throw bad(`seed must be a whole number from 0 to 4294967295, got "${seed}"`);
    s.seed = n;
  }
  const fault = query.get('fault');
  if (fault !== null) attempt('fault', () => applyCoreFaultText(s, fault));
  const lineFaults = query.get('line-faults');
  if (lineFaults !== null) s.lineFaults = attempt('line-faults', () => parseLineFaults(lineFaults));
  const baud = query.get('baud');
  if (baud !== null) {
    const n = Number(baud);
    if (!Number.isInteger(n) || n < 9_600 || n > 12_000_000) throw bad(`baud must be a whole rate from 9,600 to 12,000,000, got "${baud}"`);
    s.baud = n;
  }
  return s;
}
