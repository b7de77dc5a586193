// The stations online and who drives each: the relay's rules, apart from the sockets so they can
// be tested with a manual clock. It lives in this process's memory, so stations need the server
// to run as a single instance (docs/deploy.md, "Stations").
import type { EngineClock } from '../../shared/link-engine/link-engine';
import type { StationListing } from '../../shared/contract/stations';
import { StationClose, type StationNote, type StationRegistration } from '../../shared/stations/wire';

/** One end of the relay: a station's or a driver's socket. */
export interface RelayPeer {
  /** Line bytes, as one binary message. */
  send(bytes: Uint8Array): void;
  /** A note for a station's log (a text message). */
  note(note: StationNote): void;
  close(code: number, reason: string): void;
}

export interface Person {
  id: number;
  name: string;
}

export interface Refusal {
  refused: true;
  code: number;
  reason: string;
}

export interface StationHandle {
  refused: false;
  /** Bytes from the board: to the driver, or dropped when nobody drives. */
  fromDevice(bytes: Uint8Array): void;
  /** The station's socket closed; `why` is said to its driver. */
  offline(why: string): void;
}

export interface DriverHandle {
  refused: false;
  /** Bytes to the board, unchanged. */
  toDevice(bytes: Uint8Array): void;
  /** The driver's socket closed: the station is free. */
  leave(why?: string): void;
}

interface Driving {
  user: Person;
  since: Date;
  peer: RelayPeer;
  lastActive: number;
  cancelIdle: () => void;
}

interface Station {
  reg: StationRegistration;
  owner: Person;
  onlineSince: Date;
  peer: RelayPeer;
  driving: Driving | null;
}

export interface StationRegistryOptions {
  clock: EngineClock;
  /** A driver that sends and receives nothing for this long is let go. */
  idleTimeoutMs: number;
  /** Wall time, for "since" (default new Date()). */
  now?: () => Date;
}

/** A WebSocket close reason holds at most 123 bytes of UTF-8 (RFC 6455, 5.5.1): cut to fit. */
export function closeReason(text: string): string {
  const bytes = new TextEncoder().encode(text);
  if (bytes.length <= 123) return text;
  let cut = text;
  while (new TextEncoder().encode(`${cut}…`).length > 123) cut = cut.slice(0, -1);
  return `${cut}…`;
}

const refuse = (code: number, reason: string): Refusal => ({ refused: true, code, reason: closeReason(reason) });
const iso = (d: Date) => d.toISOString().replace(/\.\d{3}Z$/, 'Z');

export class StationRegistry {
  private readonly stations = new Map<string, Station>();
  private readonly now: () => Date;

  constructor(private readonly o: StationRegistryOptions) {
    this.now = o.now ?? (() => new Date());
  }

  /**
   * A station comes online. The same name from the same engineer replaces the older connection
   * (a station that reconnected before the server noticed it had gone); from anyone else it is
   * refused.
   */
  online(owner: Person, reg: StationRegistration, peer: RelayPeer): StationHandle | Refusal {
    const existing = this.stations.get(reg.name);
    if (existing && existing.owner.id !== owner.id) return refuse(StationClose.refused, `A station named "${reg.name}" is already online, registered by ${existing.owner.name}`);
    if (existing) {
      this.offline(existing, `The station "${reg.name}" reconnected: connect to it again`);
      existing.peer.close(StationClose.replaced, 'replaced by a newer connection of the same station');
    }
    const station: Station = { reg, owner, onlineSince: this.now(), peer, driving: null };
    this.stations.set(reg.name, station);
    peer.note({ type: 'registered', name: reg.name });
    return {
      refused: false,
      fromDevice: (bytes) => {
        const d = station.driving;
        if (!d) return; // nobody drives: the board's bytes fall away, as on an unplugged line
        d.lastActive = this.o.clock.now();
        d.peer.send(bytes);
      },
      offline: (why) => this.offline(station, `The station "${reg.name}" went offline: ${why}`),
    };
  }

  /** A driver asks for a station: refused when it is not online or somebody else drives it. */
  drive(name: string, user: Person, peer: RelayPeer): DriverHandle | Refusal {
    const station = this.stations.get(name);
    if (!station) return refuse(StationClose.unknown, `No station named "${name}" is online`);
    if (station.driving) {
      const d = station.driving;
      return refuse(StationClose.busy, `"${name}" is in use by ${d.user.name} since ${iso(d.since)}`);
    }
    const driving: Driving = { user, since: this.now(), peer, lastActive: this.o.clock.now(), cancelIdle: () => undefined };
    station.driving = driving;
    this.watchIdle(station, driving);
    station.peer.note({ type: 'driven', by: user.name, since: iso(driving.since) });
    peer.note({ type: 'ready', name });
    return {
      refused: false,
      toDevice: (bytes) => {
        if (station.driving !== driving) return; // let go already (idle, station replaced)
        driving.lastActive = this.o.clock.now();
        station.peer.send(bytes);
      },
      leave: (why = 'disconnected') => this.release(station, driving, why),
    };
  }

  /** The stations online, by name; every role may see them. */
  list(): StationListing[] {
    return [...this.stations.values()]
      .map((s) => ({
        ...s.reg,
        owner: s.owner.name,
        onlineSince: iso(s.onlineSince),
        inUse: s.driving ? { by: s.driving.user.name, since: iso(s.driving.since) } : null,
      }))
      .sort((a, b) => a.name.localeCompare(b.name));
  }

  /** Close every socket (the server is stopping). Stations reconnect when it is back. */
  closeAll(reason: string): void {
    for (const s of [...this.stations.values()]) {
      this.offline(s, reason);
      s.peer.close(1001, reason);
    }
  }

  private watchIdle(station: Station, driving: Driving) {
    const check = () => {
      if (station.driving !== driving) return;
      const quiet = this.o.clock.now() - driving.lastActive;
      if (quiet >= this.o.idleTimeoutMs) {
        const s = Math.round(this.o.idleTimeoutMs / 1000);
        this.release(station, driving, `idle for ${s} s`);
        driving.peer.close(StationClose.idle, `Idle for ${s} s: "${station.reg.name}" is free for others again`);
        return;
      }
      // One timer per driver, re-armed for what is left rather than on every message.
      driving.cancelIdle = this.o.clock.after(this.o.idleTimeoutMs - quiet, check);
    };
    driving.cancelIdle = this.o.clock.after(this.o.idleTimeoutMs, check);
  }

  private release(station: Station, driving: Driving, why: string) {
    if (station.driving !== driving) return;
    driving.cancelIdle();
    station.driving = null;
    station.peer.note({ type: 'released', by: driving.user.name, why });
  }

  private offline(station: Station, message: string) {
    if (this.stations.get(station.reg.name) !== station) return;
    this.stations.delete(station.reg.name);
    const d = station.driving;
    if (d) {
      d.cancelIdle();
      station.driving = null;
      d.peer.close(StationClose.stationGone, closeReason(message));
    }
  }
}
