import { isReadyNote, stationDrivePath } from '../../../../shared/stations/wire';
import { sameOriginSocketUrl } from './browser-links';
import { SocketLink } from './socket-link';

/** Where this page drives station `name`: the server it came from, wss: under HTTPS. */
export const stationDriveUrl = (name: string, at: Pick<Location, 'protocol' | 'host'> = window.location) => sameOriginSocketUrl(at, stationDrivePath(name));

/**
 * A station through the server's relay, with the sign-in cookie: open once the relay says the
 * station is ours; refused (in use, gone) with the relay's reason.
 */
export const openStationLink = (name: string) => SocketLink.open(stationDriveUrl(name), 5000, isReadyNote);
