import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { closeReason, StationRegistry, type DriverHandle, type RelayPeer, type StationHandle } from '../../../server/stations/station-registry';
import type { StationNote } from '../../../shared/stations/wire';
import { manualClock } from '../../support/manual-clock';

function peer() {
  const p = {
    sent: [] as Uint8Array[],
    notes: [] as StationNote[],
    closed: null as { code: number; reason: string } | null,
    send: (b: Uint8Array) => void p.sent.push(b),
    note: (n: StationNote) => void p.notes.push(n),
    close: (code: number, reason: string) => void (p.closed ??= { code, reason }),
  };
  return p satisfies RelayPeer;
}

const ada = { id: 1, name: 'Ada Lindholm' };
const bo = { id: 2, name: 'Bo Ferreira' };
const reg = { name: 'Bay 3 / bench A', device: '/dev/ttyUSB0', baud: 3_000_000 };
const IDLE_MS = 60_000;

function setup() {
  const time = manualClock();
  let wall = Date.UTC(2026, 11, 2, 9, 0, 0);
  const registry = new StationRegistry({ clock: time.clock, idleTimeoutMs: IDLE_MS, now: () => new Date(wall) });
  const tick = (ms: number) => {
    wall += ms;
    time.advance(ms);
  };
  return { registry, tick, time };
}

function ok<T extends { refused: false }>(h: T | { refused: true; reason: string }): T {
  if (h.refused) throw new Error(`refused: ${h.reason}`);
  return h;
}

describe('StationRegistry', () => {
  it('lists a station online with its device, baud and owner, free until somebody drives it', () => {
    const { registry } = setup();
    const sp = peer();
    ok(registry.online(ada, reg, sp));
    expect(sp.notes).toEqual([{ type: 'registered', name: reg.name }]);
    expect(registry.list()).toEqual([{ ...reg, owner: 'Ada Lindholm', onlineSince: '2026-12-02T09:00:00Z', inUse: null }]);
  });

  it('relays every byte value both ways unchanged, one driver at a time; a second is told who and since when', () => {
    const { registry, tick } = setup();
    const sp = peer();
    const station = ok(registry.online(ada, reg, sp)) as StationHandle;
    tick(5_000);
    const dp = peer();
    const driver = ok(registry.drive(reg.name, bo, dp)) as DriverHandle;
    const all = Uint8Array.from({ length: 256 }, (_, i) => i);
    driver.toDevice(all);
    station.fromDevice(all.slice().reverse());
    expect(sp.sent).toEqual([all]);
    expect(dp.sent).toEqual([all.slice().reverse()]);
    expect(sp.notes.at(-1)).toEqual({ type: 'driven', by: 'Bo Ferreira', since: '2026-12-02T09:00:05Z' });
    expect(dp.notes).toEqual([{ type: 'ready', name: reg.name }]);
    expect(registry.list()[0].inUse).toEqual({ by: 'Bo Ferreira', since: '2026-12-02T09:00:05Z' });

    const second = registry.drive(reg.name, ada, peer());
    expect(second).toEqual({ refused: true, code: 1013, reason: '"Bay 3 / bench A" is in use by Bo Ferreira since 2026-12-02T09:00:05Z' });

    driver.leave();
    expect(registry.list()[0].inUse).toBeNull();
    expect(sp.notes.at(-1)).toEqual({ type: 'released', by: 'Bo Ferreira', why: 'disconnected' });
    expect(registry.drive(reg.name, ada, peer()).refused).toBe(false);
  });

  it('drops the board\'s bytes while nobody drives, and refuses a station that is not online', () => {
    const { registry } = setup();
    const station = ok(registry.online(ada, reg, peer())) as StationHandle;
    expect(() => station.fromDevice(Uint8Array.of(0xa5))).not.toThrow();
    expect(registry.drive('Bay 9', bo, peer())).toEqual({ refused: true, code: 4004, reason: 'No station named "Bay 9" is online' });
  });

  it('lets an idle driver go after the timeout, with code 4000, and frees the station; traffic keeps it', () => {
    const { registry, tick, time } = setup();
    const sp = peer();
    const station = ok(registry.online(ada, reg, sp)) as StationHandle;
    const dp = peer();
    ok(registry.drive(reg.name, bo, dp));
    tick(IDLE_MS - 1);
    station.fromDevice(Uint8Array.of(1)); // the board still talks: not idle
    tick(IDLE_MS - 1);
    expect(dp.closed).toBeNull();
    tick(1);
    expect(dp.closed).toEqual({ code: 4000, reason: 'Idle for 60 s: "Bay 3 / bench A" is free for others again' });
    expect(registry.list()[0].inUse).toBeNull();
    expect(sp.notes.at(-1)).toMatchObject({ type: 'released', why: 'idle for 60 s' });
    expect(time.pending()).toBe(0);
  });

  it('closes the driver with the reason when the station drops mid-run, and takes the station off the list', () => {
    const { registry } = setup();
    const station = ok(registry.online(ada, reg, peer())) as StationHandle;
    const dp = peer();
    const driver = ok(registry.drive(reg.name, bo, dp)) as DriverHandle;
    station.offline('its connection closed (code 1006)');
    expect(dp.closed).toEqual({ code: 4001, reason: 'The station "Bay 3 / bench A" went offline: its connection closed (code 1006)' });
    expect(registry.list()).toEqual([]);
    driver.toDevice(Uint8Array.of(1, 2, 3)); // late bytes from the closing driver go nowhere
    driver.leave();
  });

  it('replaces a station that reconnects under the same name and owner; refuses the name to anybody else', () => {
    const { registry } = setup();
    const old = peer();
    const oldHandle = ok(registry.online(ada, reg, old)) as StationHandle;
    const dp = peer();
    ok(registry.drive(reg.name, bo, dp));
    expect(registry.online(bo, reg, peer())).toEqual({ refused: true, code: 1008, reason: 'A station named "Bay 3 / bench A" is already online, registered by Ada Lindholm' });

    const fresh = peer();
    ok(registry.online(ada, reg, fresh));
    expect(old.closed?.code).toBe(4005);
    expect(dp.closed).toEqual({ code: 4001, reason: 'The station "Bay 3 / bench A" reconnected: connect to it again' });
    oldHandle.offline('replaced'); // the old socket's close arrives later: the new station stays
    expect(registry.list()).toHaveLength(1);
    expect(registry.drive(reg.name, bo, peer()).refused).toBe(false);
  });

  it('cuts close reasons to the 123 bytes a WebSocket close frame holds', () => {
    const long = closeReason(`"${'Ä'.repeat(100)}" is in use`);
    expect(new TextEncoder().encode(long).length).toBeLessThanOrEqual(123);
    expect(long.endsWith('…')).toBe(true);
    expect(closeReason('short')).toBe('short');
  });
});

describe('StationRegistry relaying', () => {
  it('fast-check: any interleaving of chunks either way arrives unchanged, in order, at the other end', () => {
    const chunk = fc.uint8Array({ minLength: 0, maxLength: 300 });
    fc.assert(
      fc.property(fc.array(fc.tuple(fc.boolean(), chunk), { maxLength: 60 }), (steps) => {
        const { registry } = setup();
        const sp = peer();
        const dp = peer();
        const station = ok(registry.online(ada, reg, sp)) as StationHandle;
        const driver = ok(registry.drive(reg.name, bo, dp)) as DriverHandle;
        const concat = (parts: Uint8Array[]) => Uint8Array.from(parts.flatMap((p) => [...p]));
        for (const [toBoard, bytes] of steps) (toBoard ? driver.toDevice : station.fromDevice)(bytes);
        expect(concat(sp.sent)).toEqual(concat(steps.filter(([d]) => d).map(([, b]) => b)));
        expect(concat(dp.sent)).toEqual(concat(steps.filter(([d]) => !d).map(([, b]) => b)));
      }),
      { numRuns: 300 },
    );
  });
});
