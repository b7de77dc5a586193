// The demo lab's bench history: a dozen sessions answered by the simulated board's core (the
// shared model, or one of its deliberate faults), stored through the same path as real uploads
// so their statistics and verdicts are the server's own. The story: reference-16 rev 1 first ran
// with the wrong iteration count, rev 2 passed and became the baseline (and was approved), rev 3
// (a tool upgrade) came back with an output bit stuck — the regression. The mixer NCO was brought
// up without quadrant folding, then fixed.
import type { Transaction } from 'sequelize';
import { createSimCore, parseCoreFault } from '../../mock-device/faulty-core';
import { packColumns } from '../../shared/link-engine/sample-pack';
import { Kind, encodeMessage, maxListCodes, maxResultPairs, RecordedDecoder, Recorder, type DeviceInfo, type WireProfile } from '../../shared/link';
import { parseModelConfig, planCodes, planSchema, type Plan } from '../../shared/numeric';
import { storeSession } from '../services/session-ingest';
import { Core, GoldenVectorSet, type Board, type Build } from './models';

interface DemoSession {
  core: Core;
  build: Build;
  board: Board;
  plan: Plan;
  fault?: string;
  daysAgo: number;
  notes: string;
  tags: string[];
  baseline?: boolean;
  /** Keep a synthetic capture of the traffic (small plans only). */
  capture?: boolean;
}

const BAUD = 3_000_000;

/** The device's INFO as the simulated board would send it for this core. */
function infoOf(core: Core, build: Build): DeviceInfo {
  const m = parseModelConfig(core.modelConfig);
  return {
    version: 1,
    angleFormat: m.angleFormat,
    angleBits: m.angleBits,
    angleFrac: m.angleFrac,
    outBits: m.outBits,
    outFrac: m.outFrac,
    iterations: m.iterations,
    queueDepth: 256,
    buildId: build.id,
    clockKHz: Math.round(build.clockMHz * 1000),
    name: `Anglebench demo board, ${build.label}`,
  };
}

/**
 * A capture of HELLO, INFO and LIST requests with their RESULTS, timed as a 3 Mbaud line would
 * carry them, in the recorder's archive format.
 */
function syntheticCapture(info: DeviceInfo, codes: Float64Array, cos: Int32Array, sin: Int32Array, label: string): Buffer {
  const profile: WireProfile = { angleFormat: info.angleFormat, angleBits: info.angleBits, outBits: info.outBits };
  let t = 0;
  const recorder = new Recorder({ label, accept: { 'to-host': 'replies', 'to-device': 'requests' } });
  const side = (direction: 'to-host' | 'to-device') => new RecordedDecoder({ recorder, direction, nowMs: () => t, onFrame: () => {} });
  const host = side('to-host');
  const device = side('to-device');
  const send = (d: RecordedDecoder, bytes: Uint8Array) => {
    d.push(bytes);
    t += (bytes.length * 10 * 1000) / BAUD + 0.05;
  };
  send(device, encodeMessage({ kind: Kind.Hello }, 0, profile));
  send(host, encodeMessage({ kind: Kind.Info, info }, 0, profile));
  host.setProfile(profile);
  device.setProfile(profile);
  const PER_FRAME = Math.min(maxListCodes(profile), maxResultPairs(profile));
  for (let at = 0, tag = 1; at < codes.length; at += PER_FRAME, tag = (tag % 255) + 1) {
    const end = Math.min(codes.length, at + PER_FRAME);
    send(device, encodeMessage({ kind: Kind.List, angleCodes: Array.from(codes.subarray(at, end)) }, tag, profile));
    send(host, encodeMessage({ kind: Kind.Results, firstIndex: 0, cos: cos.slice(at, end), sin: sin.slice(at, end) }, tag, profile));
  }
  host.finish();
  device.finish();
  return Buffer.from(recorder.toArchive());
}

async function storeDemo(transaction: Transaction, operatorId: number, s: DemoSession, now: number) {
  const config = parseModelConfig(s.core.modelConfig);
  const plan = planSchema.parse(s.plan);
  const codes = planCodes(plan, config);
  const sim = createSimCore(config, s.fault ? parseCoreFault(s.fault) : undefined);
  const cos = new Int32Array(codes.length);
  const sin = new Int32Array(codes.length);
  for (let i = 0; i < codes.length; i++) ({ cos: cos[i], sin: sin[i] } = sim.evaluate(codes[i]));
  const info = infoOf(s.core, s.build);
  // Line time of the replies at 3 Mbaud (about 4.1 bytes a result), plus set-up.
  const seconds = 2 + (codes.length * 4.2 * 10) / BAUD;
  const startedAt = new Date(now - s.daysAgo * 86_400_000);
  const archive = s.capture ? syntheticCapture(info, codes, cos, sin, `${s.board.name}, ${s.build.label}`) : null;
  const stored = await storeSession(
    transaction,
    operatorId,
    {
      coreId: s.core.id,
      buildId: s.build.id,
      boardId: s.board.id,
      startedAt,
      endedAt: new Date(startedAt.getTime() + seconds * 1000),
      plan,
      transport: { kind: 'serial', baud: BAUD, dataBits: 8, parity: 'none', stopBits: 1, flowControl: 'none' },
      deviceInfo: info as unknown as Record<string, unknown>,
      link: { checkFailures: 0, retries: 0 },
      notes: s.notes,
      tags: s.tags,
    },
    Buffer.from(packColumns({ codes, cos, sin }).buffer),
    archive,
    { action: 'seed' },
  );
  if (s.baseline) await Core.update({ baselineSessionId: stored.row.id }, { where: { id: s.core.id }, transaction });
  s.core.baselineSessionId = s.baseline ? stored.row.id : s.core.baselineSessionId;
  return stored;
}

/** Store the demo sessions, oldest first, so each is judged against the baseline of its day. */
export async function seedDemoSessions(
  transaction: Transaction,
  operatorId: number,
  lab: { reference: Core; mixer: Core; builds: Build[]; boards: Board[] },
  now = Date.now(),
) {
  const [r1, r2, r3, n1] = lab.builds;
  const [benchA, benchB, chamber] = lab.boards;
  const ref = lab.reference;
  const mix = lab.mixer;
  const sessions: DemoSession[] = [
    { core: ref, build: r1, board: benchA, plan: { kind: 'exhaustive' }, fault: 'gain', daysAgo: 30, notes: 'First light. Amplitude about 4% high everywhere: the start value was computed for two iterations.', tags: ['bring-up'] },
    { core: ref, build: r1, board: benchA, plan: { kind: 'exhaustive' }, daysAgo: 29, notes: 'Start value regenerated for 16 iterations. Clean.', tags: ['bring-up'] },
    { core: ref, build: r1, board: benchB, plan: { kind: 'edges' }, daysAgo: 29, notes: 'Edge set on the 1.8 V adapter.', tags: ['edges'], capture: true },
    { core: mix, build: n1, board: benchB, plan: { kind: 'sweep', start: 0, step: 16, count: 65_536 }, fault: 'fold', daysAgo: 26, notes: 'Quadrant folding left out of the netlist: fine in the first quadrant only.', tags: ['bring-up'] },
    { core: ref, build: r2, board: benchA, plan: { kind: 'exhaustive' }, daysAgo: 21, notes: 'Last four stages pipelined; every code still equals the model.', tags: ['release-candidate'], baseline: true },
    { core: ref, build: r2, board: benchB, plan: { kind: 'random', seed: 20_260_214, count: 20_000 }, daysAgo: 20, notes: 'Seeded random cross-check on bench B.', tags: ['release-candidate'] },
    { core: ref, build: r2, board: chamber, plan: { kind: 'sweep', start: 0, step: 7, count: 9_363 }, daysAgo: 19, notes: 'Chamber at 85 °C, 30 min soak.', tags: ['thermal'] },
    { core: ref, build: r2, board: benchA, plan: { kind: 'tone', cycles: 1_021, samples: 16_384 }, daysAgo: 18, notes: 'Coherent tone for the spectral figures.', tags: ['spectral'] },
    { core: mix, build: n1, board: benchB, plan: { kind: 'sweep', start: 0, step: 16, count: 65_536 }, daysAgo: 16, notes: 'Folding restored.', tags: [], baseline: true },
    { core: mix, build: n1, board: benchA, plan: { kind: 'random', seed: 7, count: 30_000 }, daysAgo: 15, notes: 'Random codes over the whole 20-bit circle.', tags: [] },
    { core: mix, build: n1, board: chamber, plan: { kind: 'edges' }, daysAgo: 14, notes: 'Chamber at −20 °C.', tags: ['thermal', 'edges'], capture: true },
    { core: ref, build: r3, board: benchA, plan: { kind: 'exhaustive' }, fault: 'stuck:0', daysAgo: 2, notes: 'Tool upgrade only, yet half the codes are one LSB off.', tags: ['release-candidate'] },
  ];
  const stored = [];
  for (const s of sessions) stored.push(await storeDemo(transaction, operatorId, s, now));
  return stored;
}

/**
 * reference-16's golden vectors as its RTL simulation would give them: the edge set and every
 * 64th code, answered by the bit-accurate model (the demo RTL agrees with it).
 */
export async function seedGoldenVectors(core: Core, transaction: Transaction) {
  const config = parseModelConfig(core.modelConfig);
  const edges = planCodes({ kind: 'edges' }, config);
  const sweep = planCodes({ kind: 'sweep', start: 0, step: 64, count: 1024 }, config);
  const codes = Float64Array.from([...edges, ...sweep]);
  const sim = createSimCore(config);
  const cos = new Int32Array(codes.length);
  const sin = new Int32Array(codes.length);
  for (let i = 0; i < codes.length; i++) ({ cos: cos[i], sin: sin[i] } = sim.evaluate(codes[i]));
  await GoldenVectorSet.create({ coreId: core.id, name: 'RTL simulation: edges and every 64th code', count: codes.length, codes: Buffer.from(packColumns({ codes, cos, sin }).buffer) }, { transaction });
}
