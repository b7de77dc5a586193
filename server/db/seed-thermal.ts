// The demo lab's thermal sweep: reference-16 rev 2 soaked in the chamber at 25, 55 and 85 °C,
// each at three core supplies. Its answers come from the simulated board's core with the flaky
// fault at the corner where a marginal path fails: 85 °C at the lowest supply. Each session is a
// five-pass soak, stored through the same path as real uploads.
import type { Transaction } from 'sequelize';
import { createSimCore } from '../../mock-device/faulty-core';
import { createFlakyCore } from '../../mock-device/flaky-core';
import { packColumns } from '../../shared/link-engine/sample-pack';
import { parseModelConfig, planCodes, ScoreAccumulator, type Plan } from '../../shared/numeric';
import { SoakAccumulator, type Conditions } from '../../shared/soak';
import { storeSession } from '../services/session-ingest';
import type { Board, Build, Core } from './models';

const PASSES = 5;
const PLAN: Plan = { kind: 'sweep', start: 0, step: 64, count: 1024 };
const TEMPERATURES = [25, 55, 85];
const SUPPLIES = [0.9, 0.95, 1.0];

/** The flaky rate the demo's marginal path shows at a corner (invented for the scenario). */
const rateAt = (c: Conditions) => (c.temperature_c === 85 && c.vccint_v === 0.9 ? 0.004 : 0);

async function storeSoak(transaction: Transaction, operatorId: number, lab: { core: Core; build: Build; board: Board }, conditions: Conditions, startedAt: Date, seed: number) {
  const config = parseModelConfig(lab.core.modelConfig);
  const codes = planCodes(PLAN, config);
  const healthy = createSimCore(config);
  const rate = rateAt(conditions);
  const core = rate > 0 ? createFlakyCore(healthy, { kind: 'flaky', rate, onsetS: 0 }, { seed, now: () => 0 }) : healthy;
  const soak = new SoakAccumulator(codes);
  const answered = new Uint8Array(codes.length).fill(1);
  let cos = new Int32Array(0);
  let sin = new Int32Array(0);
  const passMs = 400;
  for (let p = 0; p < PASSES; p++) {
    cos = new Int32Array(codes.length);
    sin = new Int32Array(codes.length);
    for (let i = 0; i < codes.length; i++) ({ cos: cos[i], sin: sin[i] } = core.evaluate(codes[i]));
    const s = new ScoreAccumulator(config).add(codes, cos, sin).summary();
    soak.addPass({ codes, cos, sin, answered, mismatches: s.mismatches.count, maxAbsErrorLsb: s.overall.maxAbsLsb, checkFailures: 0, retries: 0, atMs: p * passMs, elapsedMs: passMs - 20 });
  }
  const temp = conditions.temperature_c;
  return storeSession(
    transaction,
    operatorId,
    {
      coreId: lab.core.id,
      buildId: lab.build.id,
      boardId: lab.board.id,
      startedAt,
      endedAt: new Date(startedAt.getTime() + PASSES * passMs),
      plan: PLAN,
      transport: { kind: 'serial', baud: 3_000_000, dataBits: 8, parity: 'none', stopBits: 1, flowControl: 'none' },
      link: { checkFailures: 0, retries: 0 },
      notes: `Thermal sweep: ${PASSES}-pass soak at ${temp} °C, VCCINT ${conditions.vccint_v} V.`,
      tags: ['thermal', 'soak'],
      conditions,
      soak: soak.record({ kind: 'passes', passes: PASSES }),
    },
    Buffer.from(packColumns({ codes, cos, sin }).buffer),
    null,
    { action: 'seed' },
  );
}

/** Nine soaks, one per (temperature, supply) corner, a few days before `now`. */
export async function seedThermalSweep(transaction: Transaction, operatorId: number, lab: { core: Core; build: Build; board: Board }, now = Date.now()) {
  const stored = [];
  let k = 0;
  for (const temperature_c of TEMPERATURES) {
    for (const vccint_v of SUPPLIES) {
      const startedAt = new Date(now - 17 * 86_400_000 + k * 3_600_000);
      stored.push(await storeSoak(transaction, operatorId, lab, { temperature_c, vccint_v, clock_mhz: 200, other: { chamber: 'TC-2' } }, startedAt, 1000 + k));
      k++;
    }
  }
  return stored;
}
