import { defineConfig } from 'vitest/config';

// expect.poll waits for a state to arrive; vitest's default of one second is shorter than a page
// load on a loaded two-core machine (the Sessions list failed so at a load average of 28). Like
// the test timeouts, this only bounds a hang.
const POLL = { timeout: 20_000 };

export default defineConfig({
  test: {
    projects: [
      {
        test: {
          name: 'unit',
          include: ['tests/unit/**/*.test.ts'],
          environment: 'node',
          // Exhaustive 16-bit checks take a second alone and several on a loaded machine; the
          // timeout is there to catch a hang, not to time anything.
          testTimeout: 30_000,
          expect: { poll: POLL },
        },
      },
      {
        test: {
          name: 'server',
          include: ['tests/server/**/*.test.ts'],
          environment: 'node',
          // Each file gets its own temporary database; files run in parallel processes.
          testTimeout: 20_000,
          expect: { poll: POLL },
        },
      },
      {
        test: {
          name: 'e2e',
          include: ['tests/e2e/**/*.test.ts'],
          environment: 'node',
          globalSetup: ['tests/e2e/global-setup.ts'],
          testTimeout: 60_000,
          hookTimeout: 120_000,
          expect: { poll: POLL },
          // One browser and one server at a time: the machine has two cores.
          fileParallelism: false,
        },
      },
      {
        test: {
          name: 'robustness',
          include: ['tests/robustness/**/*.test.ts'],
          environment: 'node',
          testTimeout: 120_000,
          hookTimeout: 60_000,
          expect: { poll: POLL },
          // Fuzzing and load tests each want both cores: one file at a time.
          fileParallelism: false,
        },
      },
    ],
  },
});
