import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runRunCommand } from '../../../cli/run';
import { explanationText } from '../../../cli/run-explain';
import { parseModelConfig } from '../../../shared/numeric';
import { defaultBoardSettings } from '../../../mock-device/board-session';
import { parseCoreFault } from '../../../mock-device/faulty-core';
import { startMockServer, type MockServer } from '../../../mock-device/ws-server';
import { captureIo } from './run-support';

// `run --explain` against the simulated board: iteration 5 of the faulty core turns the wrong way
// (the board's own fault), and the explanation must name exactly that; a healthy core matches
// its model; without --explain the summary has no explanation.
const FAST = ['--baud', '12000000'];
const PLAN = ['--plan', 'sweep:0,16,4096', '--core', 'reference-16'];

let healthy: MockServer;
let faulty: MockServer;

beforeAll(async () => {
  const settings = { ...defaultBoardSettings(), baud: 12_000_000 };
  healthy = await startMockServer(settings, 0, '127.0.0.1', () => {});
  faulty = await startMockServer({ ...settings, coreFault: parseCoreFault('sign:5') }, 0, '127.0.0.1', () => {});
});
afterAll(async () => {
  await healthy.close();
  await faulty.close();
});

type Ref = { fault: unknown };

describe('run --explain', { timeout: 60_000 }, () => {
  it('puts the explanation of a faulty core in the JSON summary, naming the injected fault', async () => {
    const io = captureIo();
    expect(await runRunCommand(['--device', faulty.url, ...FAST, ...PLAN, '--explain', '--json'], io)).toBe(0);
    const out = JSON.parse(io.out);
    expect(out.stats.mismatches.count).toBeGreaterThan(0);
    const e = out.explanation;
    expect(e.answered).toBe(4096);
    expect(e.outcome).toBe('explained');
    const best = e.hypotheses[0];
    expect(best.exact).toBe(4096);
    expect([best, ...best.equivalent].map((h: Ref) => h.fault)).toContainEqual({ kind: 'sign-slip', iteration: 5 });
  });

  it('prints the best hypotheses with their counts after the report', async () => {
    const io = captureIo();
    await runRunCommand(['--device', faulty.url, ...FAST, ...PLAN, '--explain'], io);
    const lines = io.out.split('\n');
    const at = lines.findIndex((l) => l.startsWith('explanation: '));
    expect(at).toBeGreaterThan(lines.findIndex((l) => l.startsWith('verdict: ')));
    expect(lines[at + 1]).toMatch(/^ {2}1\. .+: reproduces 4,096 of 4,096 answers exactly$/);
  });

  it('says a healthy core matches its model, and leaves the key out without --explain', async () => {
    const io = captureIo();
    expect(await runRunCommand(['--device', healthy.url, ...FAST, ...PLAN, '--explain', '--json'], io)).toBe(0);
    expect(JSON.parse(io.out).explanation.outcome).toBe('matches-model');
    const plain = captureIo();
    await runRunCommand(['--device', healthy.url, ...FAST, ...PLAN, '--json'], plain);
    expect(JSON.parse(plain.out)).not.toHaveProperty('explanation');
  });
});

describe('explanationText', () => {
  it('gives the largest difference left when the best does not reproduce every answer, and its equivalents', () => {
    const config = parseModelConfig({});
    const text = explanationText({
      declared: config,
      answered: 2000,
      outcome: 'partly-explained',
      rest: 'scattered',
      summary: 'Nearly explained.',
      hypotheses: [
        { label: 'iteration 3 turns the wrong way', config, fault: { kind: 'sign-slip', iteration: 3 }, exact: 1990, maxDiffLsb: 4, equivalent: [{ label: 'twin', config, fault: null }] },
        { label: 'the declared model', config, fault: null, exact: 12, maxDiffLsb: 900, equivalent: [] },
      ],
    });
    expect(text).toBe(
      [
        'explanation: Nearly explained.',
        '  1. iteration 3 turns the wrong way: reproduces 1,990 of 2,000 answers exactly, largest difference left 4 LSB',
        '     same answers as: twin',
        '  2. the declared model: reproduces 12 of 2,000 answers exactly, largest difference left 900 LSB',
        '',
      ].join('\n'),
    );
  });
});
