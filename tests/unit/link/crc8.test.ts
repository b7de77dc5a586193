import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { crc8 as crcSmbus, crc81wire, crc8dvbs2 } from 'crc';
import { CRC8_CATALOGUE, CRC8_NAMES, Crc8ConfigError, createCrc8, crc8, isCrc8Name, type Crc8Name } from '../../../shared/link/crc8';

const ascii = (s: string) => new TextEncoder().encode(s);
// The crc package types its input as a Node Buffer; tests may use one (shared/ may not).
const buf = (b: Uint8Array) => Buffer.from(b.buffer, b.byteOffset, b.byteLength);
const hex = (s: string) => Uint8Array.from(s.match(/../g) ?? [], (h) => parseInt(h, 16));

// Check values for ASCII "123456789": Greg Cook, "Catalogue of parametrised CRC algorithms"
// (CRC RevEng), as tabulated in docs/references.md "CRC-8 catalogue".
const catalogueCheck: Record<Crc8Name, number> = {
  'CRC-8/SMBUS': 0xf4,
  'CRC-8/MAXIM-DOW': 0xa1,
  'CRC-8/AUTOSAR': 0xdf,
  'CRC-8/CDMA2000': 0xda,
  'CRC-8/DVB-S2': 0xbc,
  'CRC-8/ROHC': 0xd0,
  'CRC-8/BLUETOOTH': 0x26,
  'CRC-8/I-432-1': 0xa1,
  'CRC-8/SAE-J1850': 0x4b,
};

// Residues (register after message + its own CRC, before xorout): same catalogue.
const catalogueResidue: Record<Crc8Name, number> = {
  'CRC-8/SMBUS': 0x00,
  'CRC-8/MAXIM-DOW': 0x00,
  'CRC-8/AUTOSAR': 0x42,
  'CRC-8/CDMA2000': 0x00,
  'CRC-8/DVB-S2': 0x00,
  'CRC-8/ROHC': 0x00,
  'CRC-8/BLUETOOTH': 0x00,
  'CRC-8/I-432-1': 0xac,
  'CRC-8/SAE-J1850': 0xc4,
};

// AUTOSAR "Specification of CRC Routines", test vectors for the 8-bit CRCs (docs/references.md "AUTOSAR test vectors").
const autosarInputs = ['00000000', 'F20183', '0FAA0055', '00FF5511', '332255AABBCCDDEEFF', '926B55', 'FFFFFFFF'];
const autosarExpected: Partial<Record<Crc8Name, number[]>> = {
  'CRC-8/AUTOSAR': [0x12, 0xc2, 0xc6, 0x77, 0x11, 0x33, 0x6c],
  'CRC-8/SAE-J1850': [0x59, 0x37, 0x79, 0xb8, 0xcb, 0x8c, 0x74],
};

describe('CRC-8 variants', () => {
  it('supports exactly the nine catalogued variants', () => {
    expect(CRC8_NAMES).toEqual(Object.keys(catalogueCheck));
  });

  for (const name of CRC8_NAMES) {
    it(`${name} gives the catalogue check value for "123456789"`, () => {
      // Source: CRC RevEng catalogue (Greg Cook), check column.
      expect(crc8(name).compute(ascii('123456789'))).toBe(catalogueCheck[name]);
      expect(CRC8_CATALOGUE[name].check).toBe(catalogueCheck[name]);
    });

    it(`${name} leaves the catalogue residue after a message and its own CRC`, () => {
      // Source: CRC RevEng catalogue (Greg Cook), residue column.
      const c = crc8(name);
      const msg = ascii('123456789');
      const withCrc = new Uint8Array([...msg, c.compute(msg)]);
      expect(c.compute(withCrc) ^ CRC8_CATALOGUE[name].xorout).toBe(catalogueResidue[name]);
    });
  }

  for (const [name, expected] of Object.entries(autosarExpected) as [Crc8Name, number[]][]) {
    it(`${name} matches the AUTOSAR "Specification of CRC Routines" test vectors`, () => {
      // Source: AUTOSAR, Specification of CRC Routines, 8-bit CRC test vectors.
      expect(autosarInputs.map((h) => crc8(name).compute(hex(h)))).toEqual(expected);
    });
  }

  it('tells MAXIM-DOW from I-432-1, which share a check value, on a second message', () => {
    const m = ascii('bench');
    expect(crc8('CRC-8/MAXIM-DOW').compute(m)).not.toBe(crc8('CRC-8/I-432-1').compute(m));
  });

  it('agrees with the crc package on random messages for SMBUS, MAXIM-DOW and DVB-S2', () => {
    // Outside reference: the `crc` npm package (crc8 = SMBUS, crc81wire = MAXIM-DOW, crc8dvbs2 = DVB-S2).
    fc.assert(
      fc.property(fc.uint8Array({ minLength: 0, maxLength: 300 }), (bytes) => {
        expect(crc8('CRC-8/SMBUS').compute(bytes)).toBe(crcSmbus(buf(bytes)));
        expect(crc8('CRC-8/MAXIM-DOW').compute(bytes)).toBe(crc81wire(buf(bytes)));
        expect(crc8('CRC-8/DVB-S2').compute(bytes)).toBe(crc8dvbs2(buf(bytes)));
      }),
    );
  });

  it('computes over a sub-range the same CRC as over a copy of that range', () => {
    fc.assert(
      fc.property(fc.uint8Array({ minLength: 1, maxLength: 100 }), fc.nat(), fc.nat(), (bytes, a, b) => {
        const s = a % bytes.length;
        const e = s + (b % (bytes.length - s + 1));
        for (const name of CRC8_NAMES) expect(crc8(name).compute(bytes, s, e)).toBe(crc8(name).compute(bytes.slice(s, e)));
      }),
    );
  });

  // Its speed (≥ 3 MB/s) is the `crc-rate` figure of `npm run bench -- hot-paths`.

  it('rejects unknown variant names and out-of-range parameters with a named error', () => {
    expect(() => crc8('CRC-8/NONE' as Crc8Name)).toThrow(Crc8ConfigError);
    expect(() => createCrc8({ ...CRC8_CATALOGUE['CRC-8/SMBUS'], poly: 0x107 })).toThrow(/poly/);
    expect(isCrc8Name('CRC-8/ROHC')).toBe(true);
    expect(isCrc8Name('toString')).toBe(false);
  });
});
