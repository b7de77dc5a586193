import { describe, expect, it } from 'vitest';
import { parseRunArgs, parsePlanSpec, UsageError } from '../../../cli/run-options';
import { resolvePlan } from '../../../cli/run-plan';

// Every option of `run`, missing, malformed and out of range: each mistake is one UsageError
// naming the option (exit status 2 at the command line, before any device is touched).

const BASE = ['--device', 'ws://127.0.0.1:5175/', '--plan', 'edges', '--core', 'reference-16'];
const without = (name: string) => {
  const i = BASE.indexOf(name);
  return [...BASE.slice(0, i), ...BASE.slice(i + 2)];
};
const refused = (args: string[]) => {
  try {
    parseRunArgs(args);
  } catch (e) {
    expect(e).toBeInstanceOf(UsageError);
    return (e as Error).message;
  }
  throw new Error(`accepted: ${args.join(' ')}`);
};

describe('run options', () => {
  it('reads a full, valid command line', () => {
    const o = parseRunArgs([
      ...BASE, '--baud', '921600', '--crc', 'CRC-8/AUTOSAR', '--build', 'r7', '--board', 'Bay 3', '--server', 'https://lab.example/', '--token', 'tok',
      '--limits', '{"maxAbsErrorLsb":2}', '--config', '{"iterations":14}', '--out', 'c.abrc', '--junit', 'r.xml', '--json',
    ]);
    expect(o).toMatchObject({
      device: 'ws://127.0.0.1:5175/', baud: 921_600, crc: 'CRC-8/AUTOSAR', build: 'r7', board: 'Bay 3', server: { url: 'https://lab.example', token: 'tok' },
      limits: { maxAbsErrorLsb: 2 }, out: 'c.abrc', junit: 'r.xml', json: true, plan: { kind: 'edges' },
    });
    expect(o.config).toMatchObject({ iterations: 14 });
  });

  it.each(['--device', '--plan', '--core'])('%s missing', (name) => {
    expect(refused(without(name))).toBe(`${name} is required (see run --help)`);
  });

  it.each([
    // malformed
    [['--baud', 'fast'], '--baud: "fast" is not an integer'],
    [['--baud', '1e6'], '--baud: "1e6" is not an integer'],
    [['--baud', '3000000.5'], '--baud: "3000000.5" is not an integer'],
    [['--crc', 'CRC-8/NOPE'], '--crc must be a catalogued CRC-8 name such as CRC-8/SMBUS, got "CRC-8/NOPE"'],
    [['--core', 'Reference_16'], '--core must be a core slug (lower-case letters, digits, single hyphens), got "Reference_16"'],
    [['--core', 'a--b'], '--core must be a core slug (lower-case letters, digits, single hyphens), got "a--b"'],
    [['--server', 'ftp://lab.example', '--token', 't'], '--server must be an http(s) URL, got "ftp://lab.example"'],
    [['--server', 'lab.example', '--token', 't'], '--server must be an http(s) URL, got "lab.example"'],
    [['--server', 'https://lab.example'], '--server and --token go together'],
    [['--token', 't'], '--server and --token go together'],
    [['--limits', '{maxAbsErrorLsb:2}'], '--limits must be JSON'],
    [['--limits', '{"maxFoo":1}'], '--limits: "maxFoo" is not a limit (known: maxAbsErrorLsb, maxRmsErrorLsb, maxAbsBiasLsb, minSfdrDb, maxModelMismatches, maxLinkErrors, minCoveragePct, maxUnstableCodes, maxAngleErrorLsb, maxAngleRmsLsb, maxMagnitudeErrorLsb, maxMagnitudeErrorPpm, minPlaneCoveragePct)'],
    [['--limits', '{"maxModelMismatches":"none"}'], /^--limits: maxModelMismatches /],
    [['--config', 'iterations=14'], '--config must be JSON'],
    [['--config', '{"rounding":"up"}'], /^--config: /],
    [['--json', 'yes'], /Unexpected argument 'yes'/],
    [['--devcie', 'x'], /^Unknown option '--devcie'/],
    [['--baud'], /^Option '--baud <value>' argument missing/],
    // empty values
    [['--out', ''], '--out must not be empty'],
    [['--junit', ''], '--junit must not be empty'],
    [['--build', ''], '--build must not be empty'],
    [['--device', ''], '--device must not be empty'],
    // out of range
    [['--baud', '9599'], '--baud must be 9600..12000000, got 9599'],
    [['--baud', '12000001'], '--baud must be 9600..12000000, got 12000001'],
    [['--baud=-3000000'], '--baud must be 9600..12000000, got -3000000'],
    [['--limits', '{"maxAbsErrorLsb":-1}'], /^--limits: maxAbsErrorLsb /],
    [['--limits', '{"minCoveragePct":101}'], /^--limits: minCoveragePct /],
    [['--limits', '{"minSfdrDb":301}'], /^--limits: minSfdrDb /],
    [['--config', '{"iterations":99}'], /^--config: .*iterations/],
  ])('%j is refused', (extra, message) => {
    const args = [...BASE, ...(extra as string[])];
    // A later --device replaces the one in BASE, as parseArgs does.
    if (typeof message === 'string') expect(refused(args)).toBe(message);
    else expect(refused(args)).toMatch(message);
  });

  it('takes the baud rate in hex too, and the ends of its range', () => {
    expect(parseRunArgs([...BASE, '--baud', '0x2DC6C0']).baud).toBe(3_000_000);
    expect(parseRunArgs([...BASE, '--baud', '9600']).baud).toBe(9_600);
    expect(parseRunArgs([...BASE, '--baud', '12000000']).baud).toBe(12_000_000);
  });
});

describe('run --plan', () => {
  const turn16 = { angleFormat: 'turn' as const, angleBits: 16, angleFrac: 0 };

  it.each([
    ['walk', /^--plan must be exhaustive, sweep:START,STEP,COUNT/],
    ['exhaustive:1', '--plan exhaustive takes no arguments'],
    ['sweep:1,2', '--plan sweep needs START,STEP,COUNT, got "1,2"'],
    ['sweep:1,2,3,4', '--plan sweep needs START,STEP,COUNT, got "1,2,3,4"'],
    ['random:100', '--plan random needs COUNT,SEED, got "100"'],
    ['tone:a,b', '--plan tone: "a" is not an integer'],
    ['sweep:0,1,1.5', '--plan sweep: "1.5" is not an integer'],
    ['file:', '--plan file needs a path: file:PATH'],
  ])('malformed: %s', (text, message) => {
    if (typeof message === 'string') expect(() => parsePlanSpec(text)).toThrow(new UsageError(message));
    else expect(() => parsePlanSpec(text)).toThrow(message);
  });

  it.each([
    ['sweep:0,1,0', /^--plan: /],
    ['sweep:70000,1,10', /^--plan: /],
    ['random:0,1', /^--plan: /],
    ['tone:3,1000', /^--plan: /],
    ['tone:4,1024', /^--plan: /],
  ])('out of range for a 16-bit binary-angle core: %s', (text, message) => {
    expect(() => resolvePlan(parsePlanSpec(text), turn16, () => '')).toThrow(message);
  });

  it('refuses a code file that cannot be read, holds no codes, or holds a code out of range', () => {
    const files: Record<string, string> = { 'empty.txt': '# nothing\n', 'wide.txt': '1\n2, 65536\n', 'words.txt': '1\nten\n' };
    const read = (p: string) => {
      if (!(p in files)) throw Object.assign(new Error('no such file'), { code: 'ENOENT' });
      return files[p];
    };
    expect(() => resolvePlan(parsePlanSpec('file:missing.txt'), turn16, read)).toThrow('--plan file: cannot read missing.txt (ENOENT)');
    expect(() => resolvePlan(parsePlanSpec('file:empty.txt'), turn16, read)).toThrow('--plan file: empty.txt holds no angle codes');
    expect(() => resolvePlan(parsePlanSpec('file:wide.txt'), turn16, read)).toThrow(/^wide\.txt line 2: /);
    expect(() => resolvePlan(parsePlanSpec('file:words.txt'), turn16, read)).toThrow('words.txt line 2: "ten" is not an integer');
  });
});
