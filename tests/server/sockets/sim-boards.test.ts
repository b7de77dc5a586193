// Simulated boards hosted by the app server: one per connection, each bit-exact with the model
// while another runs; at most SIM_BOARDS_MAX, the next refused with how many are in use; idle
// boards freed; settings read from the address, bad ones refused before the upgrade.
import { createServer } from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import WebSocket from 'ws';
import { NodeSocketLink } from '../../../cli/transport/ws-link';
import type { User } from '../../../server/db/models';
import { Core } from '../../../server/db/models';
import { boardsBusyReason, idleReason, registerSimBoards, SIM_BOARD_PATH, TRY_AGAIN_LATER } from '../../../server/sockets/sim-boards';
import { createSocketDispatcher, type SocketDispatcher } from '../../../server/sockets/upgrade';
import { LinkEngine } from '../../../shared/link-engine/link-engine';
import { createCordicModel, parseModelConfig } from '../../../shared/numeric';
import { createVectorModel, parseVectorConfig, type VectorConfigInput } from '../../../shared/vectoring';
import type { Crc8Name } from '../../../shared/link';
import { PHASE_DETECTOR_CONFIG } from '../../../server/db/seed-vectoring';
import { linkProfileSchema } from '../../../server/schemas/core';
import { realEngineClock } from '../../support/in-process-board';
import { testApp, type TestApp } from '../../support/test-app';

const CODES = 1 << 16;

/** The hosted boards alone, behind a dispatcher that takes everybody as an engineer. */
async function hostedBoards(simBoardsMax: number, idleMs?: number) {
  const sockets: SocketDispatcher = createSocketDispatcher({ authenticate: async () => ({ user: { role: 'engineer' } as User, via: 'token' }) });
  const counts: number[] = [];
  registerSimBoards(sockets, { simBoardsMax }, { idleMs, onCount: (n) => counts.push(n) });
  const server = createServer();
  sockets.attach(server);
  await new Promise<void>((r) => server.listen(0, '127.0.0.1', r));
  const url = `ws://127.0.0.1:${(server.address() as AddressInfo).port}${SIM_BOARD_PATH}`;
  return {
    url,
    counts,
    close: async () => {
      await sockets.close();
      await new Promise<void>((r) => server.close(() => r()));
    },
  };
}

/** An exhaustive 16-bit sweep on its own connection, compared bit for bit with the model. */
async function exhaustiveSweep(url: string, modelConfig = {}) {
  const link = await NodeSocketLink.open(url);
  try {
    const engine = new LinkEngine({ link, clock: realEngineClock, baud: 3_000_000 });
    await engine.hello();
    const result = await engine.run({ kind: 'sweep', start: 0, step: 1, count: CODES }).done;
    const cos = new Int32Array(CODES);
    const sin = new Int32Array(CODES);
    createCordicModel(modelConfig).evaluateInto(result.codes, cos, sin);
    return {
      status: result.status,
      missing: result.missing.length,
      bitExact: Buffer.from(result.cos.buffer).equals(Buffer.from(cos.buffer)) && Buffer.from(result.sin.buffer).equals(Buffer.from(sin.buffer)),
    };
  } finally {
    await link.close();
  }
}

/** HELLO, MODES and a 64 × 64 grid over the whole x–y square on its own connection, compared bit for bit with the model. */
async function vectorGrid(url: string, config: VectorConfigInput, crc?: Crc8Name, baud = 3_000_000) {
  const link = await NodeSocketLink.open(url);
  try {
    const engine = new LinkEngine({ link, clock: realEngineClock, baud, crc });
    const info = await engine.hello();
    const modes = await engine.modes();
    const v = parseVectorConfig(config);
    const step = 2 ** (v.inBits - 6);
    const r = await engine.runVectors({ kind: 'grid', x0: -(2 ** (v.inBits - 1)), dx: step, nx: 64, y0: -(2 ** (v.inBits - 1)), dy: step, ny: 64 }).done;
    const angle = new Int32Array(r.xs.length);
    const magnitude = new Int32Array(r.xs.length);
    createVectorModel(v).answerInto(r.xs, r.ys, angle, magnitude);
    let offModel = 0;
    for (let i = 0; i < angle.length; i++) if (angle[i] !== r.angle[i] || magnitude[i] !== r.magnitude[i]) offModel++;
    return { info, modes, status: r.status, answered: r.xs.length - r.missing.length, missing: r.missing.length, offModel };
  } finally {
    await link.close();
  }
}

let t: TestApp;
beforeAll(async () => {
  t = await testApp(); // the database, for ?core=
});
afterAll(() => t?.close());

describe('server-hosted simulated boards', () => {
  it('gives two connections a board each, both exhaustive sweeps bit-exact at the same time', async () => {
    const boards = await hostedBoards(2);
    try {
      const [a, b] = await Promise.all([exhaustiveSweep(boards.url), exhaustiveSweep(boards.url)]);
      expect(a).toEqual({ status: 'complete', missing: 0, bitExact: true });
      expect(b).toEqual({ status: 'complete', missing: 0, bitExact: true });
      expect(Math.max(...boards.counts)).toBe(2);
    } finally {
      await boards.close();
    }
  });

  it('with SIM_BOARDS_MAX=2 refuses a third connection saying how many are in use, and takes it once one is free', async () => {
    const boards = await hostedBoards(2);
    try {
      const first = await NodeSocketLink.open(boards.url);
      const second = await NodeSocketLink.open(boards.url);
      const raw = new WebSocket(boards.url);
      const [code, reason] = await new Promise<[number, string]>((r) => raw.on('close', (c, why) => r([c, why.toString()])));
      expect(code).toBe(TRY_AGAIN_LATER);
      expect(reason).toBe(boardsBusyReason(2));
      expect(reason).toMatch(/All 2 simulated boards .* in use \(2 of 2\)/);
      await expect(NodeSocketLink.open(boards.url)).rejects.toThrow(/All 2 simulated boards/);
      expect(boards.counts.at(-1)).toBe(2);
      await first.close();
      await expect.poll(() => boards.counts.at(-1)).toBe(1);
      const third = await NodeSocketLink.open(boards.url);
      await Promise.all([second.close(), third.close()]);
    } finally {
      await boards.close();
    }
  });

  it('closes a connection that sends a message over 64 KiB with 1009 and frees its board', async () => {
    const boards = await hostedBoards(1);
    try {
      const raw = new WebSocket(boards.url);
      await new Promise((r) => raw.once('open', r));
      const closed = new Promise<number>((r) => raw.once('close', (code) => r(code)));
      raw.send(Buffer.alloc(64 * 1024 + 1));
      // RFC 6455 section 7.4.1: 1009, a message too big to process.
      expect(await closed).toBe(1009);
      await expect.poll(() => boards.counts.at(-1)).toBe(0);
    } finally {
      await boards.close();
    }
  });

  it('frees a board with no traffic for the idle time, with a reason', async () => {
    const boards = await hostedBoards(1, 200);
    try {
      const raw = new WebSocket(boards.url);
      const [code, reason] = await new Promise<[number, string]>((r) => raw.on('close', (c, why) => r([c, why.toString()])));
      expect(code).toBe(1000);
      expect(reason).toBe(idleReason(200));
      await expect.poll(() => boards.counts.at(-1)).toBe(0);
    } finally {
      await boards.close();
    }
  });

  it("takes a core's model and link profile from ?core=, and its own settings from the query", async () => {
    await Core.create({ name: 'Wide core', slug: 'wide-18', linkProfile: { baud: 921_600, crc: 'CRC-8/SMBUS' }, modelConfig: parseModelConfig({ outBits: 18, outFrac: 16 }), limits: {} });
    const boards = await hostedBoards(4);
    try {
      const link = await NodeSocketLink.open(`${boards.url}?core=wide-18`);
      const info = await new LinkEngine({ link, clock: realEngineClock, baud: 921_600 }).hello();
      expect(info).toMatchObject({ outBits: 18, outFrac: 16, name: 'Anglebench simulated board (wide-18)' });
      await link.close();

      const config = encodeURIComponent(JSON.stringify({ outBits: 18, outFrac: 16 }));
      const own = await NodeSocketLink.open(`${boards.url}?config=${config}&baud=12000000&fault=gain`);
      expect((await new LinkEngine({ link: own, clock: realEngineClock, baud: 12_000_000 }).hello()).outBits).toBe(18);
      await own.close();
    } finally {
      await boards.close();
    }
  });

  it('refuses bad settings before the upgrade with the key named, opening no board', async () => {
    const boards = await hostedBoards(4);
    try {
      await expect(NodeSocketLink.open(`${boards.url}?baud=fast`)).rejects.toThrow(/400 Bad Request: baud must be a whole rate/);
      await expect(NodeSocketLink.open(`${boards.url}?fault=melt`)).rejects.toThrow(/400 Bad Request: fault: /);
      await expect(NodeSocketLink.open(`${boards.url}?core=no-such-core`)).rejects.toThrow(/404 Not Found: Core no-such-core not found/);
      await expect(NodeSocketLink.open(`${boards.url}?colour=red`)).rejects.toThrow(/Unknown setting "colour"/);
      expect(boards.counts).toEqual([]);
    } finally {
      await boards.close();
    }
  });

  it("serves a vectoring core's board from ?core=: its formats in MODE_INFO, its CRC and baud, a grid bit-exact with the model", async () => {
    await Core.create({
      name: 'Phase detector under test',
      slug: 'pd-hosted',
      mode: 'vectoring',
      linkProfile: linkProfileSchema.parse({ baud: 2_000_000, crc: 'CRC-8/AUTOSAR' }),
      modelConfig: null,
      vectorConfig: parseVectorConfig(PHASE_DETECTOR_CONFIG),
      limits: {},
    });
    const boards = await hostedBoards(4);
    try {
      const r = await vectorGrid(`${boards.url}?core=pd-hosted`, PHASE_DETECTOR_CONFIG, 'CRC-8/AUTOSAR', 2_000_000);
      // docs/protocol.md section 8: a vectoring board says version 2 and only the vectoring bit.
      expect(r.info).toMatchObject({ version: 2, name: 'Anglebench simulated board (pd-hosted)', outBits: 18 });
      expect(r.modes.rotation).toBe(false);
      expect(r.modes.vectoring).toEqual({ inBits: 16, inFrac: 14, angleFormat: 'turn', angleBits: 16, angleFrac: 0, magBits: 18, magFrac: 14, iterations: 16 });
      expect(r).toMatchObject({ status: 'complete', answered: 4096, missing: 0, offModel: 0 });
      // The same core asked for as a rotation board is refused, naming the key.
      await expect(NodeSocketLink.open(`${boards.url}?core=pd-hosted&mode=rotation`)).rejects.toThrow(/400 Bad Request: mode: core pd-hosted is a vectoring core, not rotation/);
    } finally {
      await boards.close();
    }
  });

  it('serves ?mode=vectoring with a vectoring ?config= and reads fault= against the vectoring catalogue', async () => {
    const boards = await hostedBoards(4);
    try {
      const config = { inBits: 12, inFrac: 10, iterations: 12 };
      const own = await vectorGrid(`${boards.url}?mode=vectoring&config=${encodeURIComponent(JSON.stringify(config))}&baud=12000000`, config, undefined, 12_000_000);
      expect(own.modes.vectoring).toMatchObject({ inBits: 12, inFrac: 10, iterations: 12 });
      expect(own).toMatchObject({ status: 'complete', answered: 4096, offModel: 0 });
      // An iteration turning the wrong way: nearly every angle off the declared core's model.
      const slipped = await vectorGrid(`${boards.url}?mode=vectoring&fault=sign-slip:2&baud=12000000`, {}, undefined, 12_000_000);
      expect(slipped.modes.vectoring).toMatchObject({ inBits: 16, iterations: 16 });
      expect(slipped.offModel).toBeGreaterThan(3000);
      // An intermittent fault, seeded: the same vectors go wrong on every board with the same seed.
      const flaky = `${boards.url}?mode=vectoring&fault=flaky:0.02&seed=11&baud=12000000`;
      const [f1, f2] = [await vectorGrid(flaky, {}, undefined, 12_000_000), await vectorGrid(flaky, {}, undefined, 12_000_000)];
      expect(f1.offModel).toBeGreaterThan(0);
      expect(f1.offModel).toBeLessThan(400);
      expect(f2.offModel).toBe(f1.offModel);

      await expect(NodeSocketLink.open(`${boards.url}?mode=spiral`)).rejects.toThrow(/400 Bad Request: mode must be rotation or vectoring, got "spiral"/);
      await expect(NodeSocketLink.open(`${boards.url}?mode=vectoring&fault=fold`)).rejects.toThrow(/400 Bad Request: fault: .*not a vectoring core fault/);
      await expect(NodeSocketLink.open(`${boards.url}?mode=vectoring&fault=sign-slip:40`)).rejects.toThrow(/400 Bad Request: fault: .*not 40/);
      await expect(NodeSocketLink.open(`${boards.url}?mode=vectoring&config=${encodeURIComponent('{"outBits":18}')}`)).rejects.toThrow(/400 Bad Request: config: /);
      await expect(NodeSocketLink.open(`${boards.url}?mode=vectoring&seed=-1`)).rejects.toThrow(/400 Bad Request: seed must be a whole number/);
      expect(Math.max(...boards.counts)).toBe(1);
    } finally {
      await boards.close();
    }
  });
});
