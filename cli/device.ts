// `--device`: a WebSocket device (the simulated board or a bench bridge) or a serial port.
import type { ByteLink } from '../shared/link-engine/byte-link';
import { PortSerialLink } from './transport/port-serial-link';
import { NodeSocketLink } from './transport/ws-link';

export interface DeviceDeps {
  /** The serialport binding for serial devices; default the platform's native one. */
  serialBinding?: object;
  /** Opens the device instead of the transports below (tests: a simulated board in this process). */
  openLink?: (device: string, baud: number) => Promise<ByteLink>;
}

export const isSocketDevice = (device: string) => /^wss?:\/\//i.test(device);

/** Open the device; rejects with a one-line reason. */
export function openDevice(device: string, baud: number, deps: DeviceDeps = {}): Promise<ByteLink> {
  if (deps.openLink) return deps.openLink(device, baud);
  if (isSocketDevice(device)) return NodeSocketLink.open(device);
  return PortSerialLink.open({ path: device, baud, binding: deps.serialBinding });
}
