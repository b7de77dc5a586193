import { isReadyNote, stationDrivePath } from '../../../../shared/stations/wire';
import { SocketLink } from './socket-link';

/** Where this page drives station `name`: the server's own origin, wss:// under https. */
export function stationDriveUrl(name: string, at: Pick<Location, 'protocol' | 'host'> = window.location): string {
  return `${at.protocol === 'https:' ? 'wss:' : 'ws:'}//${at.host}${stationDrivePath(name)}`;
}

/**
 * A station through the server's relay, with the sign-in cookie: open once the relay says the
 * station is ours; refused (in use, gone) with the relay's reason.
 */
export const openStationLink = (name: string) => SocketLink.open(stationDriveUrl(name), 5000, isReadyNote);
