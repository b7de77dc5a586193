// What a hosted simulated board is, read from its WebSocket address: a core's link profile and
// model (`?core=<id or slug>`), or a model configuration of its own (`?config=<json>`), with an
// optional core fault, line faults and baud rate. Bad input is a 400 with the key named.
import { rotationConfigOf } from '../services/core-mode';
import { defaultBoardSettings, type BoardSettings } from '../../mock-device/board-session';
import { parseCoreFault } from '../../mock-device/faulty-core';
import { parseLineFaults } from '../../mock-device/line-faults';
import { parseModelConfig } from '../../shared/numeric';
import { Core } from '../db/models';
import { HttpError } from '../http-error';
import { linkProfileSchema } from '../schemas/core';

const KEYS = new Set(['core', 'config', 'fault', 'line-faults', 'baud']);

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
  if (coreRef !== null && config !== null) throw bad('Give core or config, not both');
  if (coreRef !== null) {
    const core = /^\d+$/.test(coreRef) ? await Core.findByPk(Number(coreRef)) : await Core.findOne({ where: { slug: coreRef } });
    if (!core) throw new HttpError(404, 'not_found', `Core ${coreRef} not found`);
    const link = linkProfileSchema.parse(core.linkProfile);
    s.core = rotationConfigOf(core, 'the simulated board');
    s.baud = link.baud;
    s.crc = link.crc;
    s.name = `Anglebench simulated board (${core.slug})`;
  }
  if (config !== null) {
    s.core = attempt('config', () => {
      let json: unknown;
      try {
        json = JSON.parse(config);
      } catch {
        throw new Error('must be JSON, e.g. {"outBits":18,"outFrac":16}');
      }
      return parseModelConfig(json);
    });
  }
  const fault = query.get('fault');
  if (fault !== null) s.coreFault = attempt('fault', () => parseCoreFault(fault));
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
