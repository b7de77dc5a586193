// CRC-8 variants from the parametrised model (poly, init, refin, refout, xorout), one 256-entry
// table per variant. The decoder checks every frame with these, so the inner loop is a single
// table lookup per byte.

/** Names of the catalogued CRC-8 variants a core profile may select. */
export type Crc8Name =
  | 'CRC-8/SMBUS'
  | 'CRC-8/MAXIM-DOW'
  | 'CRC-8/AUTOSAR'
  | 'CRC-8/CDMA2000'
  | 'CRC-8/DVB-S2'
  | 'CRC-8/ROHC'
  | 'CRC-8/BLUETOOTH'
  | 'CRC-8/I-432-1'
  | 'CRC-8/SAE-J1850';

/** Parameters of one CRC-8 in the usual parametrised model, with its catalogued check values. */
export interface Crc8Params {
  /** Generator polynomial, normal (MSB-first) form, without the x^8 term. */
  poly: number;
  /** Register value before the first byte (unreflected). */
  init: number;
  /** Bytes enter LSB first. */
  refin: boolean;
  /** The register is reflected before xorout. */
  refout: boolean;
  /** XORed into the register at the end. */
  xorout: number;
  /** CRC of the ASCII bytes "123456789". */
  check: number;
  /** Register after a message followed by its own CRC, before xorout. */
  residue: number;
}

/** The bench link's default CHECK. */
export const DEFAULT_CRC8: Crc8Name = 'CRC-8/SMBUS';

/** Parameters and check values of every supported variant (docs/references.md "CRC-8 catalogue"). */
export const CRC8_CATALOGUE: Readonly<Record<Crc8Name, Readonly<Crc8Params>>> = {
  'CRC-8/SMBUS': { poly: 0x07, init: 0x00, refin: false, refout: false, xorout: 0x00, check: 0xf4, residue: 0x00 },
  'CRC-8/MAXIM-DOW': { poly: 0x31, init: 0x00, refin: true, refout: true, xorout: 0x00, check: 0xa1, residue: 0x00 },
  'CRC-8/AUTOSAR': { poly: 0x2f, init: 0xff, refin: false, refout: false, xorout: 0xff, check: 0xdf, residue: 0x42 },
  'CRC-8/CDMA2000': { poly: 0x9b, init: 0xff, refin: false, refout: false, xorout: 0x00, check: 0xda, residue: 0x00 },
  'CRC-8/DVB-S2': { poly: 0xd5, init: 0x00, refin: false, refout: false, xorout: 0x00, check: 0xbc, residue: 0x00 },
  'CRC-8/ROHC': { poly: 0x07, init: 0xff, refin: true, refout: true, xorout: 0x00, check: 0xd0, residue: 0x00 },
  'CRC-8/BLUETOOTH': { poly: 0xa7, init: 0x00, refin: true, refout: true, xorout: 0x00, check: 0x26, residue: 0x00 },
  'CRC-8/I-432-1': { poly: 0x07, init: 0x00, refin: false, refout: false, xorout: 0x55, check: 0xa1, residue: 0xac },
  'CRC-8/SAE-J1850': { poly: 0x1d, init: 0xff, refin: false, refout: false, xorout: 0xff, check: 0x4b, residue: 0xc4 },
};

/** Every supported variant name, in catalogue order. */
export const CRC8_NAMES = Object.keys(CRC8_CATALOGUE) as Crc8Name[];

/** A ready-to-use CRC-8: `compute(bytes, start, end)` covers `bytes[start..end)`. */
export interface Crc8 {
  readonly name: string;
  readonly params: Readonly<Crc8Params>;
  compute(bytes: Uint8Array, start?: number, end?: number): number;
}

/** Raised for an unknown variant name or parameters out of range. */
export class Crc8ConfigError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'Crc8ConfigError';
  }
}

function reflect8(v: number): number {
  let r = 0;
  for (let i = 0; i < 8; i++) if (v & (1 << i)) r |= 0x80 >> i;
  return r;
}

function isByte(v: number): boolean {
  return Number.isInteger(v) && v >= 0 && v <= 0xff;
}

/**
 * Builds a table-driven CRC-8 from its parameters. For reflected input the register is kept
 * reflected, so both forms update with `reg = table[reg ^ byte]`.
 */
export function createCrc8(params: Readonly<Crc8Params>, name = 'custom'): Crc8 {
  for (const key of ['poly', 'init', 'xorout'] as const) {
    if (!isByte(params[key])) throw new Crc8ConfigError(`CRC-8 option "${key}" must be a byte, got ${params[key]}`);
  }
  const table = new Uint8Array(256);
  const { refin } = params;
  const rpoly = reflect8(params.poly);
  for (let i = 0; i < 256; i++) {
    let r = i;
    for (let bit = 0; bit < 8; bit++) {
      if (refin) r = r & 1 ? (r >>> 1) ^ rpoly : r >>> 1;
      else r = r & 0x80 ? ((r << 1) ^ params.poly) & 0xff : (r << 1) & 0xff;
    }
    table[i] = r;
  }
  const init = refin ? reflect8(params.init) : params.init;
  const flip = params.refin !== params.refout;
  const xorout = params.xorout;
  return {
    name,
    params,
    compute(bytes: Uint8Array, start = 0, end = bytes.length): number {
      let reg = init;
      for (let i = start; i < end; i++) reg = table[reg ^ bytes[i]];
      return (flip ? reflect8(reg) : reg) ^ xorout;
    },
  };
}

const cache = new Map<Crc8Name, Crc8>();

/** Returns the catalogued variant `name` (default CRC-8/SMBUS), building its table once. */
export function crc8(name: Crc8Name = DEFAULT_CRC8): Crc8 {
  let c = cache.get(name);
  if (!c) {
    const params = CRC8_CATALOGUE[name];
    if (!params) throw new Crc8ConfigError(`Unknown CRC-8 variant "${String(name)}"; known: ${CRC8_NAMES.join(', ')}`);
    c = createCrc8(params, name);
    cache.set(name, c);
  }
  return c;
}

/** True when `name` is one of the supported catalogue names. */
export function isCrc8Name(name: string): name is Crc8Name {
  return Object.prototype.hasOwnProperty.call(CRC8_CATALOGUE, name);
}
