// The station relay over real sockets: the app listening on a free port, stations and drivers as
// WebSocket clients (raw ones where the test plays the station, the CLI's own where it runs one).
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import WebSocket from 'ws';
import { startStation, type Station } from '../../cli/station';
import { openDevice } from '../../cli/device';
import { createApp } from '../../server/app';
import { sha256Hex } from '../../server/auth/tokens';
import { ApiToken, type Role } from '../../server/db/models';
import { startMockServer, type MockServer } from '../../mock-device/ws-server';
import { defaultBoardSettings } from '../../mock-device/board-session';
import { createCordicModel } from '../../shared/numeric';
import { LinkEngine } from '../../shared/link-engine/link-engine';
import { Backoff } from '../../shared/stations/backoff';
import { stationListReply } from '../../shared/contract/stations';
import { STATION_CONNECT_PATH, STATION_MAX_MESSAGE_BYTES, stationDrivePath } from '../../shared/stations/wire';
import { manualClock } from '../support/manual-clock';
import { realEngineClock } from '../support/in-process-board';
import { testApp, TEST_PASSWORD, type TestApp } from '../support/test-app';
import { listen, signInCookie, type ListeningApp } from '../support/listening-app';
import { captureIo, mockSerialBoard } from '../unit/cli/run-support';
import { runRunCommand } from '../../cli/run';
import { createInterrupt } from '../../cli/interrupt';
import { Core } from '../../server/db/models';
import { modelConfigSchema } from '../../server/schemas/core';
import { makeLabCertificate } from '../../scripts/lab-certificate';

/** A WebSocket client that keeps what it hears: the upgrade's outcome, binary and text messages, the close. */
function client(url: string, headers: Record<string, string> = {}, autoPong = true) {
  const ws = new WebSocket(url, { headers, autoPong });
  const binary: Buffer[] = [];
  const texts: string[] = [];
  const closed = new Promise<{ code: number; reason: string }>((r) => ws.on('close', (code, reason) => r({ code, reason: reason.toString() })));
  const upgrade = new Promise<'open' | number>((resolve) => {
    ws.on('open', () => resolve('open'));
    ws.on('unexpected-response', (_req, res) => {
      resolve(res.statusCode ?? 0);
      ws.terminate();
    });
  });
  ws.on('error', () => undefined);
  ws.on('message', (d: Buffer, isBinary) => (isBinary ? binary.push(d) : texts.push(d.toString())));
  const note = (type: string) => until(() => texts.some((t) => (JSON.parse(t) as { type: string }).type === type));
  return { ws, binary, texts, closed, upgrade, note, bytes: () => new Uint8Array(Buffer.concat(binary)) };
}

/** Wait on a condition the sockets will make true (no fixed sleep). */
async function until(check: () => boolean, ms = 5000) {
  const end = Date.now() + ms;
  while (!check()) {
    if (Date.now() > end) throw new Error('timed out waiting');
    await new Promise((r) => setImmediate(r));
  }
}

const REG = { name: 'Bay 3 / bench A', device: '/dev/ttyUSB0', baud: '3000000' };
const connectUrl = (base: string, reg = REG) => `${base}${STATION_CONNECT_PATH}?${new URLSearchParams(reg)}`;

let t: TestApp;
let srv: ListeningApp;
const tokens = {} as Record<Role, string>;
const clock = manualClock();

async function makeToken(role: Role) {
  const secret = `ab_test_${role}_${'x'.repeat(20)}`;
  await ApiToken.create({ userId: t.users[role].id, name: 'stations test', tokenHash: sha256Hex(secret), prefix: secret.slice(0, 8) });
  return secret;
}

const cookieOf = (role: Role) => signInCookie(srv.url, t.users[role].email, TEST_PASSWORD);

const bearer = (role: Role) => ({ authorization: `Bearer ${tokens[role]}` });
const list = async (headers: Record<string, string>) => {
  const res = await fetch(`${srv.url}/api/stations`, { headers });
  return { status: res.status, body: (await res.json()) as { stations: Array<Record<string, unknown>> } };
};

/** The test plays a station: registered with the engineer's token. */
async function rawStation(reg = REG) {
  const s = client(connectUrl(srv.wsUrl, reg), bearer('engineer'));
  await s.note('registered');
  return s;
}

async function driver(headers: Record<string, string>, name = REG.name) {
  const d = client(`${srv.wsUrl}${stationDrivePath(name)}`, headers);
  return d;
}

beforeEach(async () => {
  t = await testApp({ stations: { clock: clock.clock, idleTimeoutMs: 60_000 } });
  srv = await listen(t.app);
  for (const role of ['reviewer', 'engineer', 'admin'] as const) tokens[role] = await makeToken(role);
});

afterEach(async () => {
  await srv.close();
  await t.close();
});

describe('stations on the server', { timeout: 30_000 }, () => {
  it('lists a station online to every role: name, device, baud, who registered it, free', async () => {
    const station = await rawStation();
    for (const role of ['reviewer', 'engineer'] as const) {
      const { status, body } = await list(bearer(role));
      expect(status).toBe(200);
      expect(body.stations).toEqual([{ name: REG.name, device: REG.device, baud: 3_000_000, owner: 'Test engineer', onlineSince: expect.stringMatching(/Z$/), inUse: null }]);
    }
    expect((await list({})).status).toBe(401);
    station.ws.close();
    await station.closed;
  });

  it('relays every byte value both ways unchanged between a station and a driver, and shows who drives it', async () => {
    const station = await rawStation();
    const d = await driver({ cookie: await cookieOf('engineer') });
    await d.note('ready');
    const all = Uint8Array.from({ length: 1024 }, (_, i) => (i * 7) & 0xff); // every value, SYNC bytes too
    d.ws.send(all.subarray(0, 300));
    d.ws.send(all.subarray(300));
    await until(() => station.bytes().length >= all.length);
    expect(station.bytes()).toEqual(all);
    const back = all.slice().reverse();
    station.ws.send(back);
    await until(() => d.bytes().length >= back.length);
    expect(d.bytes()).toEqual(back);
    const { body } = await list(bearer('reviewer'));
    expect(body.stations[0].inUse).toEqual({ by: 'Test engineer', since: expect.stringMatching(/Z$/) });
    // A station in use, read with the contract's schema (the one the pages fetch it with).
    expect(stationListReply.safeParse(body).error?.issues).toBeUndefined();
    await station.note('driven');
  });

  it('refuses a second driver with who is using the station and since when', async () => {
    await rawStation();
    const first = await driver(bearer('engineer'));
    await first.note('ready');
    const second = await driver({ cookie: await cookieOf('admin') });
    const closed = await second.closed;
    expect(closed.code).toBe(1013);
    expect(closed.reason).toMatch(/^"Bay 3 \/ bench A" is in use by Test engineer since \d{4}-\d\d-\d\dT\d\d:\d\d:\d\dZ$/);
    expect(second.binary).toEqual([]);
  });

  it('refuses at the upgrade, with nothing relayed: signed out or a wrong token 401, a reviewer 403', async () => {
    const station = await rawStation();
    expect(await (await driver({})).upgrade).toBe(401);
    expect(await (await driver({ authorization: 'Bearer ab_not_a_token' })).upgrade).toBe(401);
    expect(await (await driver(bearer('reviewer'))).upgrade).toBe(403);
    expect(await (await driver({ cookie: await cookieOf('reviewer') })).upgrade).toBe(403);
    // A station needs an engineer's token too.
    expect(await client(connectUrl(srv.wsUrl, { ...REG, name: 'Bay 4' }), bearer('reviewer')).upgrade).toBe(403);
    expect(await client(connectUrl(srv.wsUrl, { ...REG, name: 'Bay 4' }), {}).upgrade).toBe(401);
    expect(await client(connectUrl(srv.wsUrl, { ...REG, baud: '12' }), bearer('engineer')).upgrade).toBe(400);
    // The station heard nothing: no driver, no byte.
    expect(station.binary).toEqual([]);
    expect(station.texts.map((x) => JSON.parse(x).type)).toEqual(['registered']);
    expect((await list(bearer('reviewer'))).body.stations.map((s) => s.name)).toEqual([REG.name]);
  });

  it('closes a driver that sends a message over the size limit with 1009, and frees the station', async () => {
    const station = await rawStation();
    const d = await driver(bearer('engineer'));
    await d.note('ready');
    d.ws.send(new Uint8Array(STATION_MAX_MESSAGE_BYTES + 1));
    expect((await d.closed).code).toBe(1009);
    expect(station.binary).toEqual([]);
    await until(() => station.texts.some((x) => JSON.parse(x).type === 'released'));
    expect((await list(bearer('reviewer'))).body.stations[0].inUse).toBeNull();
  });

  it('lets an idle driver go and frees the station for the next', async () => {
    await rawStation();
    const d = await driver(bearer('engineer'));
    await d.note('ready');
    clock.advance(60_000);
    expect(await d.closed).toEqual({ code: 4000, reason: 'Idle for 60 s: "Bay 3 / bench A" is free for others again' });
    const next = await driver(bearer('admin'));
    await next.note('ready');
  });

  it('closes the driver with a clear reason when the station drops mid-run', async () => {
    const station = await rawStation();
    const d = await driver(bearer('engineer'));
    await d.note('ready');
    station.ws.terminate(); // the lab PC's cable pulled: no close frame
    expect(await d.closed).toEqual({ code: 4001, reason: 'The station "Bay 3 / bench A" went offline: its connection was lost' });
    expect((await list(bearer('reviewer'))).body.stations).toEqual([]);
  });
});

describe('a station whose connection went half-open', () => {
  it('is dropped after two unanswered pings, and its driver closed with the reason', async () => {
    // A relay pinging every 50 ms, on the same database (the default is 15 s).
    await srv.close();
    srv = await listen(createApp({ config: t.config, db: t.db, mailer: t.mailer, uploadDir: t.uploadDir, bcryptCost: 4, stations: { pingMs: 50 } }));
    const silent = client(connectUrl(srv.wsUrl), bearer('engineer'), false); // answers no ping, like a dead peer
    await silent.note('registered');
    const d = await driver(bearer('admin'));
    await d.note('ready');
    expect(await d.closed).toEqual({ code: 4001, reason: 'The station "Bay 3 / bench A" went offline: its connection was lost' });
    expect((await list(bearer('reviewer'))).body.stations).toEqual([]);
  });
});

describe('the CLI station through the relay', { timeout: 60_000 }, () => {
  let board: MockServer | null = null;
  let station: Station | null = null;
  afterEach(async () => {
    await station?.close();
    await board?.close();
    station = null;
    board = null;
  });

  it('carries an exhaustive run bit-exactly from a runner to a simulated board behind a station', async () => {
    const settings = { ...defaultBoardSettings(), baud: 12_000_000 };
    board = await startMockServer(settings, 0, '127.0.0.1', () => undefined);
    const lines: string[] = [];
    station = await startStation({ server: srv.url, token: tokens.engineer, device: board.url, name: 'Sim bay', baud: 12_000_000, ca: null, insecure: false }, { log: (l) => lines.push(l) });
    await until(() => station!.online);
    const link = await openDevice('station:Sim bay', 12_000_000, { server: { url: srv.url, token: tokens.admin } });
    const engine = new LinkEngine({ link, clock: realEngineClock, baud: 12_000_000 });
    const info = await engine.hello();
    const count = 2 ** info.angleBits;
    const result = await engine.run({ kind: 'sweep', start: 0, step: 1, count }).done;
    expect(result.status).toBe('complete');
    expect(result.missing).toEqual([]);
    // Bit-exact: every answer equals the reference model's for its code.
    const cos = new Int32Array(count);
    const sin = new Int32Array(count);
    createCordicModel(settings.core).evaluateInto(result.codes, cos, sin);
    expect(result.cos).toEqual(cos);
    expect(result.sin).toEqual(sin);
    await link.close();
    expect(lines.some((l) => l.includes('driven by Test admin'))).toBe(true);
  });

  it('is driven by `run --device station:NAME`: the runner\'s verdict passes and the session is uploaded', async () => {
    await Core.create({ name: 'Station core', slug: 'station-core', linkProfile: { baud: 12_000_000 }, modelConfig: modelConfigSchema.parse({}), limits: { maxModelMismatches: 0 }, baselineSessionId: null });
    board = await startMockServer({ ...defaultBoardSettings(), baud: 12_000_000 }, 0, '127.0.0.1', () => undefined);
    station = await startStation({ server: srv.url, token: tokens.engineer, device: board.url, name: 'Run bay', baud: 12_000_000, ca: null, insecure: false }, { log: () => undefined });
    await until(() => station!.online);
    const io = captureIo();
    const status = await runRunCommand(['--device', 'station:Run bay', '--server', srv.url, '--token', tokens.engineer, '--plan', 'sweep:0,7,4096', '--core', 'station-core', '--json'], io, { interrupt: createInterrupt() });
    expect(io.err).not.toMatch(/^error:/m);
    expect(status).toBe(0);
    const summary = JSON.parse(io.out) as { verdict: { passed: boolean }; sessionId: number | null };
    expect(summary).toMatchObject({ verdict: { passed: true } });
    const sessions = await fetch(`${srv.url}/api/sessions`, { headers: bearer('reviewer') }).then((r) => r.json() as Promise<{ items: { sampleCount: number }[] }>);
    expect(sessions.items.map((x) => x.sampleCount)).toEqual([4096]);
  });

  it('carries a run from a serial port (serialport\'s mock binding) unchanged', async () => {
    const serial = mockSerialBoard({ baud: 12_000_000 });
    station = await startStation({ server: srv.url, token: tokens.engineer, device: serial.path, name: 'Serial bay', baud: 12_000_000, ca: null, insecure: false }, { serialBinding: serial.binding, log: () => undefined });
    await until(() => station!.online);
    const link = await openDevice('station:Serial bay', 12_000_000, { server: { url: srv.url, token: tokens.engineer } });
    const engine = new LinkEngine({ link, clock: realEngineClock, baud: 12_000_000 });
    await engine.hello();
    const result = await engine.run({ kind: 'sweep', start: 0, step: 3, count: 4096 }).done;
    expect(result.status).toBe('complete');
    const cos = new Int32Array(4096);
    const sin = new Int32Array(4096);
    createCordicModel(defaultBoardSettings().core).evaluateInto(result.codes, cos, sin);
    expect(result.cos).toEqual(cos);
    expect(result.sin).toEqual(sin);
    await link.close();
  });

  it('comes back online by itself within a few seconds when the server restarts', async () => {
    board = await startMockServer(defaultBoardSettings(), 0, '127.0.0.1', () => undefined);
    const lines: string[] = [];
    station = await startStation(
      { server: srv.url, token: tokens.engineer, device: board.url, name: 'Bay 5', baud: 3_000_000, ca: null, insecure: false },
      { log: (l) => lines.push(l), backoff: new Backoff({ baseMs: 250, capMs: 4_000 }) },
    );
    await until(() => station!.online);
    const port = srv.port;
    await srv.close();
    await until(() => !station!.online);
    // The same database, a new app and listener on the same port: a restarted server.
    const app = createApp({ config: t.config, db: t.db, mailer: t.mailer, uploadDir: t.uploadDir, bcryptCost: 4 });
    srv = await listen(app, undefined, port);
    await until(() => station!.online, 30_000);
    // "Within a few seconds" is the back-off's promise, read from the station's own schedule
    // rather than from the clock of a busy machine: it never waited longer than its cap (4 s).
    const waits = lines.flatMap((l) => /dialling again in ([\d.]+) s/.exec(l)?.[1] ?? []).map(Number);
    expect(waits.length).toBeGreaterThan(0);
    expect(Math.max(...waits)).toBeLessThanOrEqual(4);
    expect((await list(bearer('reviewer'))).body.stations.map((s) => s.name)).toEqual(['Bay 5']);
    expect(lines.some((l) => /offline: .*dialling again in \d/.test(l))).toBe(true);
  });

  it('stops with the reason when the server refuses its token', async () => {
    board = await startMockServer(defaultBoardSettings(), 0, '127.0.0.1', () => undefined);
    station = await startStation({ server: srv.url, token: 'ab_wrong', device: board.url, name: 'Bay 6', baud: 3_000_000, ca: null, insecure: false }, { log: () => undefined });
    expect(await station.ended).toBe('the server refused the station: 401 Unauthorized: Unknown or revoked API token');
  });
});

describe('a station of a server with a self-signed certificate', { timeout: 60_000 }, () => {
  let dir = '';
  let board: MockServer | null = null;
  const stations: Station[] = [];
  afterEach(async () => {
    for (const s of stations.splice(0)) await s.close();
    await board?.close();
    board = null;
    rmSync(dir, { recursive: true, force: true });
  });

  it('trusts it with --ca, is refused it without, and skips the check with --insecure', async () => {
    dir = mkdtempSync(path.join(tmpdir(), 'station-tls-'));
    const made = makeLabCertificate({ hosts: ['127.0.0.1', 'localhost'], outDir: dir });
    // The plain listener of beforeEach makes way for an HTTPS one on the same app's database.
    await srv.close();
    const app = createApp({ config: t.config, db: t.db, mailer: t.mailer, uploadDir: t.uploadDir, bcryptCost: 4 });
    srv = await listen(app, { cert: readFileSync(made.certFile), key: readFileSync(made.keyFile) });
    board = await startMockServer(defaultBoardSettings(), 0, '127.0.0.1', () => undefined);
    const base = { server: srv.url, token: tokens.engineer, device: board.url, baud: 3_000_000, insecure: false };

    const unchecked: string[] = [];
    stations.push(await startStation({ ...base, name: 'No CA', ca: null }, { log: (l) => unchecked.push(l) }));
    await until(() => unchecked.some((l) => /self-signed certificate/.test(l)));
    expect(stations[0].online).toBe(false);
    await stations[0].close(); // frees the simulated board's one connection
    stations.length = 0;

    const trusted = await startStation({ ...base, name: 'With CA', ca: made.certFile }, { log: () => undefined });
    stations.push(trusted);
    await until(() => trusted.online);
    await trusted.close();
    stations.length = 0;

    const insecure = await startStation({ ...base, name: 'Insecure', ca: null, insecure: true }, { log: () => undefined });
    stations.push(insecure);
    await until(() => insecure.online); // online means the server said "registered" over wss
  });
});
