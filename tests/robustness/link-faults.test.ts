// Every plan kind run by the link engine against the simulated board over a faulty line (bit
// errors, dropped bytes, latency jitter): each requested code ends answered once or listed
// missing, never both, and the engine makes no answer up. Line damage can still make a frame
// that passes the 8-bit CHECK by chance; the tap tells those frames apart, so the test checks
// that every wrong answer came from such a frame and every frame the board sent was filed right.
import { describe, expect, it } from 'vitest';
import { planToRequest } from '../../cli/run-plan';
import { parseLineFaults } from '../../mock-device/line-faults';
import { confirmOffModel } from '../../shared/link-engine/confirm-off-model';
import { LinkEngine, type RunHandlers, type RunResult } from '../../shared/link-engine/link-engine';
import { createCordicModel, parseModelConfig, planCodes, planSchema, type Plan } from '../../shared/numeric';
import { realEngineClock } from '../support/in-process-board';
import { tappedBoard } from './support/tapped-board';

const config = parseModelConfig({});
const model = createCordicModel(config);
const BAUD = 12_000_000;

/** One plan of each kind of planSchema but `one`, sized so the faults have bytes to hit. */
const plans: Plan[] = [
  { kind: 'list', codes: Array.from({ length: 4000 }, (_, i) => (i * 40_503) % 65_536) },
  { kind: 'sweep', start: 1000, step: 7, count: 20_000 },
  { kind: 'exhaustive' },
  { kind: 'random', seed: 7, count: 20_000 },
  { kind: 'edges' },
  { kind: 'tone', cycles: 127, samples: 8192 },
].map((p) => planSchema.parse(p));

/** Indexes of the run: answered and missing must split them with no overlap. */
function accounting(result: RunResult) {
  const n = result.codes.length;
  const answered = new Set<number>();
  for (let i = 0; i < n; i++) if (result.answered[i] === 1) answered.add(i);
  const missing = result.missing.map((m) => m.index);
  const missingSet = new Set(missing);
  const both = missing.filter((i) => answered.has(i));
  const neither = Array.from({ length: n }, (_, i) => i).filter((i) => !answered.has(i) && !missingSet.has(i));
  return { answered, missing, missingUnique: missingSet.size === missing.length, both, neither };
}

/** Answered indexes whose cos or sin differ from the reference model for that code. */
function wrongAnswers(result: RunResult, answered: Set<number>): number[] {
  const cos = new Int32Array(result.codes.length);
  const sin = new Int32Array(result.codes.length);
  model.evaluateInto(result.codes, cos, sin);
  return [...answered].filter((i) => cos[i] !== result.cos[i] || sin[i] !== result.sin[i]);
}

/**
 * Runs `plan` over a tapped faulty line. Each delivered index is marked with whether the frame
 * that carried it was one the board sent: the engine's onFrame runs just before the run files
 * that frame's results, in the same decoder callback.
 */
async function faultyRun(plan: Plan, faults: string, options: { maxRetries?: number; confirm?: boolean } = {}) {
  const board = tappedBoard(parseLineFaults(faults));
  let genuine = true;
  let chanceFrames = 0;
  const engine = new LinkEngine({
    link: board.link,
    clock: realEngineClock,
    baud: BAUD,
    timeoutMs: 100,
    ...(options.maxRetries === undefined ? {} : { maxRetries: options.maxRetries }),
    onFrame: (f) => {
      genuine = board.wasSent(f);
      if (!genuine) chanceFrames++;
    },
  });
  try {
    // On the worst line a HELLO and its INFO (four tries) can all be struck, and chunk timing
    // makes the draws differ run to run; what these runs test is the accounting after it, so
    // say HELLO again as a person at the bench would.
    for (let attempt = 1; ; attempt++) {
      try {
        await engine.hello();
        break;
      } catch (err) {
        if (attempt >= 5) throw err;
      }
    }
    const deliveries = new Map<number, number>();
    const fromChanceFrame = new Set<number>();
    const handlers: RunHandlers = {
      // As the runner and the Bench page do: an answer off the model is confirmed on a damaged line.
      confirm: options.confirm ? confirmOffModel(config) : undefined,
      onResults: (b) =>
        b.indexes.forEach((i) => {
          deliveries.set(i, (deliveries.get(i) ?? 0) + 1);
          if (!genuine) fromChanceFrame.add(i);
        }),
    };
    const result = await engine.run(planToRequest(plan, config), handlers).done;
    const a = accounting(result);
    const wrong = wrongAnswers(result, a.answered);
    return { result, a, deliveries, wrong, fromChanceFrame, chanceFrames, counts: board.faults.counts };
  } finally {
    await board.link.close();
  }
}

const totals = { bitsFlipped: 0, bytesDropped: 0, checkFailures: 0, retries: 0, missing: 0, chanceFrames: 0, confirmations: 0, wrong: 0, runs: 0 };

describe('runs over a faulty line, for every plan kind', () => {
  for (const seed of [3, 17, 4099]) {
    for (const plan of plans) {
      it(`${plan.kind}, ber=1e-4, drop=5e-5, jitter 2 ms, seed ${seed}: every code answered once or listed missing, and no wrong answer taken`, async () => {
        const r = await faultyRun(plan, `ber=1e-4,drop=5e-5,jitter-ms=2,seed=${seed}`, { confirm: true });
        expect(r.result.status).toBe('complete');
        // The run asked for the plan's own codes, in the plan's order.
        expect(Array.from(r.result.codes)).toEqual(Array.from(planCodes(plan, config)));
        expect(r.a.both).toEqual([]);
        expect(r.a.neither).toEqual([]);
        expect(r.a.missingUnique).toBe(true);
        expect(r.a.answered.size + r.a.missing.length).toBe(r.result.codes.length);
        expect([...r.deliveries.values()].every((n) => n === 1)).toBe(true);
        expect([...r.deliveries.keys()].sort((x, y) => x - y)).toEqual([...r.a.answered].sort((x, y) => x - y));
        // Whatever the board sent is filed under the right index, and what a chance frame carried
        // differed from the model, so it was asked for again instead of being taken.
        expect(r.wrong).toEqual([]);
        expect(r.result.figures.unconfirmed).toBe(0);
        totals.bitsFlipped += r.counts.bitsFlipped;
        totals.bytesDropped += r.counts.bytesDropped;
        totals.checkFailures += r.result.figures.checkFailures;
        totals.retries += r.result.figures.retries;
        totals.missing += r.a.missing.length;
        totals.chanceFrames += r.chanceFrames;
        totals.confirmations += r.result.figures.confirmations;
        totals.wrong += r.wrong.length;
        totals.runs++;
      });
    }
  }

  for (const plan of [plans[0], plans[1]]) {
    // Without confirming, so every wrong answer can be traced to the chance frame that carried it.
    it(`${plan.kind} on a much worse line (ber=2e-3, drop=1e-3) with one retry: codes go missing, and the accounting still holds`, async () => {
      const r = await faultyRun(plan, 'ber=2e-3,drop=1e-3,jitter-ms=2,seed=5', { maxRetries: 1 });
      expect(r.result.status).toBe('complete');
      expect(r.a.missing.length).toBeGreaterThan(0);
      expect(r.result.missing.every((m) => m.reason === 'no answer' && m.code === r.result.codes[m.index])).toBe(true);
      expect(r.a.both).toEqual([]);
      expect(r.a.neither).toEqual([]);
      expect(r.a.missingUnique).toBe(true);
      expect(r.wrong.filter((i) => !r.fromChanceFrame.has(i))).toEqual([]);
    });
  }

  it('the faults really struck, chance frames stayed near the 1-in-256 share of damaged frames an 8-bit CHECK lets by, and confirming caught what they carried', () => {
    expect(totals.runs).toBe(18);
    expect(totals.bitsFlipped).toBeGreaterThan(100);
    expect(totals.bytesDropped).toBeGreaterThan(10);
    expect(totals.checkFailures).toBeGreaterThan(50);
    expect(totals.retries).toBeGreaterThan(50);
    // Each damaged frame that reaches the CHECK passes with probability about 2^-8 (common
    // practice, no source); allow a wide margin, the count is small.
    expect(totals.chanceFrames).toBeLessThan(totals.checkFailures / 256 * 3 + 10);
    console.info(
      `[link faults] ${totals.runs} runs: ${totals.bitsFlipped} bits flipped, ${totals.bytesDropped} bytes dropped, ${totals.checkFailures} CHECK failures, ` +
        `${totals.retries} codes asked again, ${totals.missing} listed missing, ${totals.chanceFrames} damaged frames passed the CHECK, ${totals.confirmations} answers confirmed by asking again, ${totals.wrong} wrong answers taken`,
    );
  });
});
