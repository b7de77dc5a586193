import { describe, expect, it } from 'vitest';
import { parseBridgeArgs } from '../../../cli/bridge';

// Every option of `bridge`, missing, malformed and out of range: one error naming the option.

const TOKEN = 'a-bridge-token';
const BASE = ['--device', '/dev/ttyUSB0', '--ws-port', '5180', '--token', TOKEN];
const without = (name: string) => {
  const i = BASE.indexOf(name);
  return [...BASE.slice(0, i), ...BASE.slice(i + 2)];
};

describe('bridge options', () => {
  it('reads a full command line, and fills in the defaults', () => {
    expect(parseBridgeArgs([...BASE, '--baud', '921600', '--host', '0.0.0.0', '--idle-timeout-s', '30'])).toEqual({
      device: '/dev/ttyUSB0', baud: 921_600, port: 5180, host: '0.0.0.0', token: TOKEN, idleTimeoutS: 30,
    });
    expect(parseBridgeArgs(BASE)).toEqual({ device: '/dev/ttyUSB0', baud: 3_000_000, port: 5180, host: '127.0.0.1', token: TOKEN, idleTimeoutS: 600 });
    expect(parseBridgeArgs(['--help'])).toBe('help');
  });

  it.each([
    ['--device', '--device is required (see bridge --help)'],
    ['--ws-port', '--ws-port is required (see bridge --help)'],
    ['--token', '--token is required: the bridge never runs unguarded'],
  ])('%s missing', (name, message) => {
    expect(() => parseBridgeArgs(without(name))).toThrow(message);
  });

  it.each([
    // malformed: decimal digits only
    [['--baud', 'fast'], '--baud must be an integer 9600..12000000, got "fast"'],
    [['--baud', '1e6'], '--baud must be an integer 9600..12000000, got "1e6"'],
    [['--baud', '0x2DC6C0'], '--baud must be an integer 9600..12000000, got "0x2DC6C0"'],
    [['--ws-port', ''], '--ws-port must be an integer 0..65535, got ""'],
    [['--ws-port', ' 80'], '--ws-port must be an integer 0..65535, got " 80"'],
    [['--ws-port', '80.5'], '--ws-port must be an integer 0..65535, got "80.5"'],
    [['--idle-timeout-s', 'ten'], '--idle-timeout-s must be an integer 1..604800, got "ten"'],
    [['--device', ''], '--device must not be empty'],
    [['--host', ''], '--host must not be empty'],
    [['--token', 'short'], '--token must be at least 8 characters'],
    [['--verbose'], /^Unknown option '--verbose'/],
    [['--baud'], /^Option '--baud <value>' argument missing/],
    // out of range
    [['--baud', '9599'], '--baud must be an integer 9600..12000000, got "9599"'],
    [['--baud', '12000001'], '--baud must be an integer 9600..12000000, got "12000001"'],
    [['--ws-port', '65536'], '--ws-port must be an integer 0..65535, got "65536"'],
    [['--ws-port=-1'], '--ws-port must be an integer 0..65535, got "-1"'],
    [['--idle-timeout-s', '0'], '--idle-timeout-s must be an integer 1..604800, got "0"'],
    [['--idle-timeout-s', '604801'], '--idle-timeout-s must be an integer 1..604800, got "604801"'],
  ])('%j is refused', (extra, message) => {
    expect(() => parseBridgeArgs([...BASE, ...(extra as string[])])).toThrow(message);
  });

  it('takes the ends of each range', () => {
    expect(parseBridgeArgs([...BASE, '--baud', '9600', '--ws-port', '0', '--idle-timeout-s', '1'])).toMatchObject({ baud: 9_600, port: 0, idleTimeoutS: 1 });
    expect(parseBridgeArgs([...BASE, '--baud', '12000000', '--ws-port', '65535', '--idle-timeout-s', '604800'])).toMatchObject({ baud: 12_000_000, port: 65_535, idleTimeoutS: 604_800 });
  });
});
