import { describe, expect, it, vi } from 'vitest';
import { samplesFromArchive } from '../../../shared/link-engine/archive-samples';
import { BenchController } from '../../../src/features/bench/live/bench-controller';
import type { UnsavedRunStore } from '../../../src/features/bench/live/unsaved-run-store';
import { inProcessBoard } from '../../support/in-process-board';

// Scoring runs in a Web Worker, which Node lacks; this test is about the capture, not the scores.
vi.mock('../../../src/features/bench/live/score-client', () => ({
  ScoreClient: class {
    queue() {}
    finish() {}
    terminate() {}
  },
}));

/** A store that keeps what the controller puts away, in place of IndexedDB. */
function memoryStore() {
  const puts: Parameters<UnsavedRunStore['put']>[0][] = [];
  const store: UnsavedRunStore = { put: async (r) => void puts.push(r), get: async () => puts.at(-1), clear: async () => undefined };
  return { puts, store };
}

async function finished(c: BenchController) {
  await vi.waitFor(() => expect(c.getSnapshot().run?.state).toBe('finished'), { timeout: 10_000, interval: 20 });
}

describe('the run a Bench controller puts away and saves', () => {
  it('carries the preamble and that run’s own traffic, not the earlier run’s', async () => {
    const board = inProcessBoard({ baud: 12_000_000 });
    const { puts, store } = memoryStore();
    const c = new BenchController(store);
    await c.connect(async () => board.link, 'in-process board', 12_000_000);
    expect(c.getSnapshot().status).toBe('connected');

    c.startRun({ kind: 'sweep', start: 0, step: 1, count: 300 }, {});
    await finished(c);
    await vi.waitFor(() => expect(puts).toHaveLength(1));
    expect(Array.from(samplesFromArchive(puts[0].archive!).codes)).toEqual(Array.from({ length: 300 }, (_, i) => i));

    c.startRun({ kind: 'list', codes: [7, 9000, 41] }, {});
    await finished(c);
    await vi.waitFor(() => expect(puts).toHaveLength(2));
    const kept = samplesFromArchive(puts[1].archive!);
    expect(kept.info).toEqual(c.getSnapshot().info);
    expect(Array.from(kept.codes)).toEqual([7, 9000, 41]);
    // The record the Save panel posts holds the same archive as the store.
    expect(c.record?.archive).toEqual(puts[1].archive);
    c.dispose();
  });
});
