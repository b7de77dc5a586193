// The demo lab's vectoring core: the receiver's phase detector turns the mixer's I/Q samples into
// phase (atan2) and amplitude. Its answers are the shared vectoring model's — with a deliberate
// defect in the first build — stored through the same path as real uploads, so the statistics and
// verdicts are the server's own. Demo data only: it shows the pages, it proves nothing about the model.
import type { Transaction } from 'sequelize';
import { packVectorSamples } from '../../shared/link-engine/vector-sample-pack';
import { createVectorModel, parseVectorConfig, planVectors, type VectorConfig, type VectorPlan } from '../../shared/vectoring';
import { limitsSchema, linkProfileSchema } from '../schemas/core';
import { storeSession } from '../services/session-ingest';
import { Build, Core, GoldenVectorSet, type Board } from './models';

const daysAgo = (now: number, days: number) => new Date(now - days * 86_400_000);

/** 16-bit I/Q in, gain-compensated magnitude, 16-bit binary angle: the detector as specified. */
export const PHASE_DETECTOR_CONFIG = { inBits: 16, iterations: 16, guardBits: 3, gainCompensation: 'multiply', gainBits: 16 } as const;

/** Answers of a (possibly defective) core to `plan`: the model of `config`, packed as an upload. */
function answer(config: VectorConfig, plan: VectorPlan) {
  const { xs, ys } = planVectors(plan, config);
  const angles = new Int32Array(xs.length);
  const magnitudes = new Int32Array(xs.length);
  createVectorModel(config).answerInto(xs, ys, angles, magnitudes);
  return { xs, ys, angles, magnitudes };
}

export async function seedVectoringCore(transaction: Transaction, operatorId: number, lab: { boards: Board[] }, now = Date.now()) {
  const opts = { transaction };
  const core = await Core.create(
    {
      name: 'Receiver phase detector, vectoring 16-bit',
      slug: 'phase-detector-16',
      mode: 'vectoring',
      linkProfile: linkProfileSchema.parse({ baud: 2_000_000, crc: 'CRC-8/AUTOSAR' }),
      modelConfig: null,
      vectorConfig: parseVectorConfig(PHASE_DETECTOR_CONFIG),
      // The model itself reaches 8 LSB of angle (on the axes a quarter of the range out) and 1.2 LSB of magnitude over these plans.
      limits: limitsSchema.parse({ maxAngleErrorLsb: 10, maxAngleRmsLsb: 1, maxMagnitudeErrorLsb: 2, maxMagnitudeErrorPpm: 2_000, maxModelMismatches: 0, maxLinkErrors: 0, minPlaneCoveragePct: 90 }),
      baselineSessionId: null,
    },
    opts,
  );
  const config = parseVectorConfig(core.vectorConfig);
  const [r1, r2] = await Build.bulkCreate(
    [
      { coreId: core.id, label: 'pd16-r1', createdAt: daysAgo(now, 12), sourceRevision: '3fa0c71', toolVersion: 'synth 2025.1', clockMHz: 245.76, notes: 'First netlist of the phase detector.', createdById: operatorId },
      { coreId: core.id, label: 'pd16-r2', createdAt: daysAgo(now, 8), sourceRevision: '81d4e0b', toolVersion: 'synth 2025.1', clockMHz: 245.76, notes: 'Gain-compensating multiply wired into the output stage.', createdById: operatorId },
    ],
    opts,
  );
  const [benchA, benchB] = lab.boards;
  const sessions: Array<{ build: Build; board: Board; plan: VectorPlan; defective?: boolean; days: number; notes: string; tags: string[]; baseline?: boolean }> = [
    // The defect: the compensating multiply left out, so every magnitude carries the CORDIC growth (about 1.65×).
    { build: r1, board: benchB, plan: { kind: 'grid', target: 16_384 }, defective: true, days: 11, notes: 'Angles fine, amplitudes about 65% high: the gain multiply is bypassed.', tags: ['bring-up'] },
    { build: r2, board: benchB, plan: { kind: 'grid', target: 16_384 }, days: 7, notes: 'Multiply restored; every answer equals the model.', tags: ['bring-up'], baseline: true },
    { build: r2, board: benchA, plan: { kind: 'random', seed: 20_260_301, count: 20_000 }, days: 6, notes: 'Seeded random vectors on bench A.', tags: [] },
  ];
  const stored = [];
  for (const s of sessions) {
    const answers = answer(s.defective ? parseVectorConfig({ ...PHASE_DETECTOR_CONFIG, gainCompensation: 'none' }) : config, s.plan);
    const startedAt = daysAgo(now, s.days);
    const row = await storeSession(
      transaction,
      operatorId,
      {
        coreId: core.id,
        buildId: s.build.id,
        boardId: s.board.id,
        startedAt,
        endedAt: new Date(startedAt.getTime() + 4_000 + answers.xs.length / 20),
        plan: s.plan,
        transport: { kind: 'serial', baud: 2_000_000, dataBits: 8, parity: 'none', stopBits: 1, flowControl: 'none' },
        link: { checkFailures: 0, retries: 0 },
        notes: s.notes,
        tags: s.tags,
      },
      Buffer.from(packVectorSamples(answers).buffer),
      null,
      { action: 'seed' },
    );
    if (s.baseline) {
      await Core.update({ baselineSessionId: row.row.id }, { where: { id: core.id }, transaction });
      core.baselineSessionId = row.row.id;
    }
    stored.push(row);
  }
  // Golden vectors as the detector's RTL simulation would give them: the edge set, answered by the model.
  const golden = answer(config, { kind: 'edges' });
  await GoldenVectorSet.create({ coreId: core.id, name: 'RTL simulation: edge vectors', count: golden.xs.length, codes: Buffer.from(packVectorSamples(golden).buffer) }, opts);
  return { core, builds: [r1, r2], sessions: stored };
}
