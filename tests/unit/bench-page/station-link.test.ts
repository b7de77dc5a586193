import { describe, expect, it } from 'vitest';
import { stationDriveUrl } from '../../../src/features/bench/transport/station-link';
import { sinceText } from '../../../src/lib/resources/stations';
import { isReadyNote, parseRegistration } from '../../../shared/stations/wire';

describe('the Bench page and stations', () => {
  it('drives a station on the page’s own server, its name one URL-encoded path segment, wss: under HTTPS', () => {
    expect(stationDriveUrl('Bay 3 / bench A', { protocol: 'https:', host: 'lab-server:3000' })).toBe('wss://lab-server:3000/api/stations/Bay%203%20%2F%20bench%20A/drive');
    expect(stationDriveUrl('b', { protocol: 'http:', host: '127.0.0.1:3000' })).toBe('ws://127.0.0.1:3000/api/stations/b/drive');
  });

  it('opens on the relay’s ready note only', () => {
    expect(isReadyNote('{"type":"ready","name":"b"}')).toBe(true);
    expect(isReadyNote('{"type":"registered","name":"b"}')).toBe(false);
    expect(isReadyNote('not json')).toBe(false);
  });

  it('says since when in the time of day today, with the date on another day', () => {
    const now = new Date(2026, 11, 2, 15, 0, 0);
    expect(sinceText(new Date(2026, 11, 2, 9, 12, 3).toISOString(), now)).toMatch(/^since \S*9\S*12\S*03/);
    expect(sinceText(new Date(2026, 11, 1, 9, 12, 3).toISOString(), now)).toMatch(/^since \S+ \S*9\S*12\S*03/);
  });

  it('takes a registration only with a printable name and device and a baud in range', () => {
    expect(parseRegistration({ name: ' Bay 3 ', device: '/dev/ttyUSB0', baud: '3000000' })).toEqual({ name: 'Bay 3', device: '/dev/ttyUSB0', baud: 3_000_000 });
    expect(() => parseRegistration({ name: 'a\nb', device: 'd', baud: '9600' })).toThrow(/^name must be 1 to 80 printable characters$/);
    expect(() => parseRegistration({ name: 'x'.repeat(81), device: 'd', baud: '9600' })).toThrow(/^name/);
    expect(() => parseRegistration({ name: 'a', device: null, baud: '9600' })).toThrow(/^device/);
    expect(() => parseRegistration({ name: 'a', device: 'd', baud: '12000001' })).toThrow(/^baud must be an integer 9600..12000000, got "12000001"$/);
  });
});
