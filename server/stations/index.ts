// Stations on the app: the list route and the relay's sockets over one in-memory registry.
import type { Express } from 'express';
import type { EngineClock } from '../../shared/link-engine/link-engine';
import type { SocketDispatcher } from '../sockets/upgrade';
import { StationRegistry, type StationRegistryOptions } from './station-registry';
import { registerStationSockets } from './station-sockets';
import { stationsRouter } from './stations-router';

/** Ten minutes without a byte either way frees a station for others (the listening bridge's default). */
export const STATION_IDLE_MS = 10 * 60 * 1000;

/** Real time, with timers that never keep the process alive on their own. */
const serverClock: EngineClock = {
  now: () => performance.now(),
  after: (ms, fn) => {
    const t = setTimeout(fn, ms);
    t.unref();
    return () => clearTimeout(t);
  },
};

/** The relay's settings; tests shorten them. */
export interface StationOptions extends Partial<StationRegistryOptions> {
  /** How often stations and drivers are pinged (two unanswered: gone). */
  pingMs?: number;
}

/** Mount GET /api/stations and register the station and driver sockets; returns the registry. */
export function installStations(app: Express, sockets: SocketDispatcher, { pingMs, ...options }: StationOptions = {}) {
  const registry = new StationRegistry({ clock: serverClock, idleTimeoutMs: STATION_IDLE_MS, ...options });
  registerStationSockets(sockets, registry, pingMs);
  app.use('/api/stations', stationsRouter(registry));
  return registry;
}
