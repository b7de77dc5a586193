// `--device`: a WebSocket device (the simulated board or a bench bridge), a station on the team
// server (`station:NAME`), or a serial port.
import type { ByteLink } from '../shared/link-engine/byte-link';
import { STATION_MAX_MESSAGE_BYTES, isReadyNote, stationDrivePath } from '../shared/stations/wire';
import { PortSerialLink } from './transport/port-serial-link';
import { NodeSocketLink } from './transport/ws-link';

export interface DeviceDeps {
  /** The serialport binding for serial devices; default the platform's native one. */
  serialBinding?: object;
  /** The server and API token a `station:NAME` device is driven through. */
  server?: { url: string; token: string } | null;
  /** Opens the device instead of the transports below (tests: a simulated board in this process). */
  openLink?: (device: string, baud: number) => Promise<ByteLink>;
}

export const isSocketDevice = (device: string) => /^wss?:\/\//i.test(device);

const STATION = /^station:(.+)$/;

/** The station's name when `device` is `station:NAME`, else null. */
export const stationName = (device: string) => STATION.exec(device)?.[1] ?? null;

/** The WebSocket address that drives station `name` on `server` (http → ws, https → wss). */
export const stationDriveUrl = (server: string, name: string) => new URL(stationDrivePath(name), server.replace(/^http/i, 'ws')).toString();

/** Open the device; rejects with a one-line reason. */
export function openDevice(device: string, baud: number, deps: DeviceDeps = {}): Promise<ByteLink> {
  if (deps.openLink) return deps.openLink(device, baud);
  const station = stationName(device);
  if (station !== null) {
    if (!deps.server) return Promise.reject(new Error(`--device ${device} needs --server and --token: a station is reached through the team server`));
    return NodeSocketLink.open(stationDriveUrl(deps.server.url, station), 5000, { headers: { authorization: `Bearer ${deps.server.token}` }, maxPayload: STATION_MAX_MESSAGE_BYTES, ready: isReadyNote });
  }
  if (isSocketDevice(device)) return NodeSocketLink.open(device);
  return PortSerialLink.open({ path: device, baud, binding: deps.serialBinding });
}
