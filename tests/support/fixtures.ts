import { BenchSession, Board, Build, Core, type User } from '../../server/db/models';
import { modelConfigSchema } from '../../server/schemas/core';

/** One core, build (by `author`), board and bench session, for tests that need things to exist. */
export async function benchFixtures(author: User) {
  const core = await Core.create({
    name: 'Test core',
    slug: 'test-core',
    linkProfile: { baud: 3_000_000, crc: 'CRC-8/SMBUS' },
    modelConfig: modelConfigSchema.parse({}),
    limits: { maxAbsErrorLsb: 2 },
    baselineSessionId: null,
  });
  const build = await Build.create({ coreId: core.id, label: 'b1', sourceRevision: 'abc123', toolVersion: 't1', clockMHz: 100, createdById: author.id });
  const board = await Board.create({ name: 'Bench 1', serial: 'S-1', fpgaPart: 'part-1', adapter: 'usb-uart', location: 'rack A' });
  const session = await BenchSession.create({
    coreId: core.id,
    buildId: build.id,
    boardId: board.id,
    operatorId: author.id,
    startedAt: new Date(),
    endedAt: null,
    plan: { kind: 'sweep' },
    transport: { baud: 3_000_000 },
    deviceInfo: null,
    stats: {},
    verdict: {},
    passed: true,
    sampleCount: 0,
    samples: Buffer.alloc(0),
    archive: null,
  });
  return { core, build, board, session };
}
