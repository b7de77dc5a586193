// What stations, the server's relay and the drivers (Bench page, runner) agree on: the paths, the
// close codes and the few text messages. Line bytes always travel as binary messages, unchanged;
// text messages are the relay's own notes and never reach the board.

/** The station dials this (its registration in the query string: name, device, baud). */
export const STATION_CONNECT_PATH = '/api/stations/connect';

/** Where a driver connects to one station (the name URL-encoded as one path segment). */
export const stationDrivePath = (name: string) => `/api/stations/${encodeURIComponent(name)}/drive`;

/** Largest binary message either side may send; a bigger one closes the socket with 1009. */
export const STATION_MAX_MESSAGE_BYTES = 64 * 1024;

/**
 * Close codes. 1008, 1009, 1011 and 1013 are RFC 6455's (section 7.4.1) and the IANA registry's
 * "Try Again Later"; 4000–4999 are reserved there for applications, so the relay's own live there.
 */
export const StationClose = {
  /** Refused by rule: a name already taken by another engineer, a bad registration. */
  refused: 1008,
  /** A message over STATION_MAX_MESSAGE_BYTES. */
  tooBig: 1009,
  /** The station's device (serial port, simulated board) went away. */
  deviceGone: 1011,
  /** Somebody else is driving the station. */
  busy: 1013,
  /** The driver sent and received nothing for the idle timeout: the station is free again. */
  idle: 4000,
  /** The station went offline under the driver. */
  stationGone: 4001,
  /** No station of that name is online. */
  unknown: 4004,
  /** The same station registered again (it reconnected); the older connection is let go. */
  replaced: 4005,
} as const;

/** A station's registration, as the station sends it and the server lists it. */
export interface StationRegistration {
  name: string;
  device: string;
  baud: number;
}

/**
 * Text notes from the server: to a station, for its log; to a driver, `ready` once the station is
 * its own (a driver waits for it, so a refusal arrives as a close reason, never as a dead link).
 */
export type StationNote =
  | { type: 'ready'; name: string }
  | { type: 'registered'; name: string }
  | { type: 'driven'; by: string; since: string }
  | { type: 'released'; by: string; why: string };

/** True for the text message a driver waits for before it sends a byte. */
export function isReadyNote(text: string): boolean {
  try {
    return (JSON.parse(text) as { type?: unknown }).type === 'ready';
  } catch {
    return false;
  }
}

// eslint-disable-next-line no-control-regex -- control characters are exactly what a name may not hold
const NAME = /^[^\u0000-\u001f\u007f]{1,80}$/;

/** Check a registration from a query string; throws with a one-line reason naming the field. */
export function parseRegistration(q: { name: string | null; device: string | null; baud: string | null }): StationRegistration {
  const name = (q.name ?? '').trim();
  if (!NAME.test(name)) throw new Error('name must be 1 to 80 printable characters');
  const device = (q.device ?? '').trim();
  if (!NAME.test(device)) throw new Error('device must be 1 to 80 printable characters');
  const baud = Number(q.baud);
  if (!Number.isInteger(baud) || baud < 9_600 || baud > 12_000_000) throw new Error(`baud must be an integer 9600..12000000, got "${q.baud ?? ''}"`);
  return { name, device, baud };
}
