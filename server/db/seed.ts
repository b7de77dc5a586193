// Demo data for a fresh install: an invented signal-processing lab bringing up two rotator cores
// and a vectoring phase detector on three bench boards, with a month of bench sessions
// (server/db/seed-sessions.ts, seed-vectoring.ts).
import type { Sequelize } from 'sequelize';
import { DEFAULT_BCRYPT_COST, hashPassword } from '../auth/passwords';
import { limitsSchema, linkProfileSchema, modelConfigSchema } from '../schemas/core';
import { recordAudit } from '../services/audit';
import { Board, Build, Core, CoreWatcher, initModels, Review, User, type Role } from './models';
import { seedDemoSessions, seedGoldenVectors } from './seed-sessions';
import { seedThermalSweep } from './seed-thermal';
import { seedVectoringCore } from './seed-vectoring';

// Builds are dated before the sessions that ran on them (server/db/seed-sessions.ts).
const daysAgo = (days: number) => new Date(Date.now() - days * 86_400_000);

export const DEMO_ACCOUNTS: ReadonlyArray<{ email: string; name: string; role: Role }> = [
  { email: 'admin@anglebench.test', name: 'Ines Okafor', role: 'admin' },
  { email: 'engineer@anglebench.test', name: 'Tomas Brandvold', role: 'engineer' },
  { email: 'reviewer@anglebench.test', name: 'Mei Lindqvist', role: 'reviewer' },
];

/** Seed the demo when the database has no users yet; resolves to whether it did. */
export async function seedIfEmpty(db: Sequelize, password: string, bcryptCost = DEFAULT_BCRYPT_COST): Promise<boolean> {
  initModels(db);
  if ((await User.count()) > 0) return false;
  const passwordHash = await hashPassword(password, bcryptCost);
  await db.transaction(async (transaction) => {
    const opts = { transaction };
    // One after another: a transaction is one connection, and PostgreSQL's takes one query at a time.
    const accounts: User[] = [];
    for (const a of DEMO_ACCOUNTS) accounts.push(await User.create({ ...a, passwordHash }, opts));
    const [admin, engineer, reviewer] = accounts;

    const reference = await Core.create(
      {
        name: 'Reference rotator, 16-bit',
        slug: 'reference-16',
        linkProfile: linkProfileSchema.parse({}),
        // Exactly the default configuration, which the simulated board also runs by default.
        modelConfig: modelConfigSchema.parse({}),
        // The default model itself reaches 3.3 LSB max and 0.68 LSB RMS over every 16-bit code, so
        // a healthy board passes with margin and a core fault does not.
        limits: limitsSchema.parse({ maxAbsErrorLsb: 4, maxRmsErrorLsb: 0.8, maxAbsBiasLsb: 0.25, minSfdrDb: 84, maxModelMismatches: 0, maxLinkErrors: 0 }),
        baselineSessionId: null,
      },
      opts,
    );
    const mixer = await Core.create(
      {
        name: 'Receiver mixer NCO, 18-bit',
        slug: 'mixer-nco-18',
        linkProfile: linkProfileSchema.parse({ baud: 2_000_000, crc: 'CRC-8/AUTOSAR' }),
        modelConfig: modelConfigSchema.parse({ angleBits: 20, outBits: 18, outFrac: 16, iterations: 18, guardBits: 3, shiftRounding: 'nearest' }),
        limits: limitsSchema.parse({ maxAbsErrorLsb: 3, maxRmsErrorLsb: 1, minSfdrDb: 96, maxLinkErrors: 0 }),
        baselineSessionId: null,
      },
      opts,
    );

    const boards = await Board.bulkCreate(
      [
        { name: 'Bay 3 / bench A', serial: 'AB-0173', fpgaPart: 'mid-range FPGA, 85k LUT', adapter: 'USB-UART bridge, 3.3 V', location: 'Signal lab, bay 3' },
        { name: 'Bay 3 / bench B', serial: 'AB-0174', fpgaPart: 'mid-range FPGA, 85k LUT', adapter: 'USB-UART bridge, 1.8 V', location: 'Signal lab, bay 3' },
        { name: 'Thermal chamber rig', serial: 'AB-0219', fpgaPart: 'low-power FPGA, 25k LUT', adapter: 'isolated UART pod, 3.3 V', location: 'Environmental room' },
      ],
      opts,
    );

    const builds = await Build.bulkCreate(
      [
        { coreId: reference.id, label: 'ref16-r1', createdAt: daysAgo(31), sourceRevision: 'a41c9e0', toolVersion: 'synth 2024.2', clockMHz: 150, notes: 'First silicon-ready netlist.', createdById: engineer.id },
        { coreId: reference.id, label: 'ref16-r2', createdAt: daysAgo(22), sourceRevision: 'c07d5b2', toolVersion: 'synth 2024.2', clockMHz: 200, notes: 'Pipelined the last four stages for timing.', createdById: engineer.id },
        { coreId: reference.id, label: 'ref16-r3', createdAt: daysAgo(3), sourceRevision: 'e9f3310', toolVersion: 'synth 2025.1', clockMHz: 200, notes: 'Tool upgrade; no RTL change.', createdById: engineer.id },
        { coreId: mixer.id, label: 'nco18-r1', createdAt: daysAgo(27), sourceRevision: '5b8a2fd', toolVersion: 'synth 2025.1', clockMHz: 245.76, notes: 'Rounded shifts, three guard bits.', createdById: engineer.id },
      ],
      opts,
    );
    const sessions = await seedDemoSessions(transaction, engineer.id, { reference, mixer, builds, boards });
    sessions.push(...(await seedThermalSweep(transaction, engineer.id, { core: reference, build: builds[1], board: boards[2] })));
    await Review.create({ buildId: builds[1].id, reviewerId: reviewer.id, decision: 'approve', note: 'Sweep and edge set within limits on both benches.' }, opts);
    await seedGoldenVectors(reference, transaction);
    const vectoring = await seedVectoringCore(transaction, engineer.id, { boards });
    sessions.push(...vectoring.sessions);
    // The reviewer hears of reference-16's regressions.
    await CoreWatcher.create({ coreId: reference.id, userId: reviewer.id }, opts);
    await recordAudit(transaction, admin.id, 'seed', 'demo', null, { cores: 3, boards: 3, builds: builds.length + vectoring.builds.length, sessions: sessions.length });
  });
  return true;
}

/** The demo accounts that exist (and are enabled) in this database, for the start-up banner. */
export async function demoAccountsPresent(db: Sequelize): Promise<string[]> {
  initModels(db);
  const rows = await User.findAll({ where: { email: DEMO_ACCOUNTS.map((a) => a.email), disabled: false } });
  return DEMO_ACCOUNTS.filter((a) => rows.some((r) => r.email === a.email)).map((a) => `${a.email} (${a.role})`);
}
