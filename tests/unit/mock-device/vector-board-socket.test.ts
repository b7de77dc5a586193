import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { NodeSocketLink } from '../../../cli/transport/ws-link';
import { LinkEngine } from '../../../shared/link-engine/link-engine';
import { createVectorModel } from '../../../shared/vectoring';
import { defaultBoardSettings } from '../../../mock-device/board-session';
import { parseLineFaults } from '../../../mock-device/line-faults';
import { startMockServer, type MockServer } from '../../../mock-device/ws-server';
import { realEngineClock } from '../../support/in-process-board';

let clean: MockServer;
let noisy: MockServer;

beforeAll(async () => {
  const settings = { ...defaultBoardSettings(), baud: 3_000_000, vector: { core: {} } };
  clean = await startMockServer(settings, 0, '127.0.0.1', () => undefined);
  noisy = await startMockServer({ ...settings, lineFaults: parseLineFaults('ber=1e-4,drop=1e-5,jitter-ms=1,seed=3') }, 0, '127.0.0.1', () => undefined);
});
afterAll(async () => {
  await clean.close();
  await noisy.close();
});

const model = createVectorModel({});
const offModel = (x: number, y: number, angle: number, magnitude: number) => {
  const m = model.answer(x, y);
  return m.angle !== angle || m.magnitude !== magnitude;
};

async function grid(url: string) {
  const link = await NodeSocketLink.open(url);
  try {
    const engine = new LinkEngine({ link, clock: realEngineClock, baud: 3_000_000 });
    await engine.hello();
    await engine.modes();
    let delivered = 0;
    const t0 = performance.now();
    const r = await engine.runVectors({ kind: 'grid', x0: -32768, dx: 512, nx: 128, y0: -32768, dy: 512, ny: 128 }, { confirm: offModel, onResults: (b) => (delivered += b.indexes.length) }).done;
    const elapsedS = (performance.now() - t0) / 1000;
    const angle = new Int32Array(r.xs.length);
    const magnitude = new Int32Array(r.xs.length);
    model.answerInto(r.xs, r.ys, angle, magnitude);
    let wrong = 0;
    for (let i = 0; i < angle.length; i++) if (angle[i] !== r.angle[i] || magnitude[i] !== r.magnitude[i]) wrong++;
    return { r, delivered, elapsedS, wrong };
  } finally {
    await link.close();
  }
}

describe('the vectoring board over a real WebSocket at 3,000,000 baud', { timeout: 30_000 }, () => {
  it('answers a 128 × 128 grid bit-exact with the model, every vector once, never faster than the line', async () => {
    const { r, delivered, elapsedS, wrong } = await grid(clean.url);
    expect(r.status).toBe('complete');
    expect(r.missing).toEqual([]);
    expect(delivered).toBe(16_384);
    expect(wrong).toBe(0);
    // docs/protocol.md section 8: 5.18 bytes a vector at 300,000 bytes/s, 0.283 s for 16,384.
    expect(elapsedS).toBeGreaterThan(0.28);
    expect(r.figures.lineShare).toBeLessThanOrEqual(1);
  });

  it('with bit errors, lost bytes and jitter on the line still answers every vector once, none wrong', async () => {
    const { r, delivered, wrong } = await grid(noisy.url);
    expect(r.status).toBe('complete');
    expect(r.missing).toEqual([]);
    expect(delivered).toBe(16_384);
    expect(wrong).toBe(0);
    expect(r.figures.checkFailures + r.figures.skippedBytes).toBeGreaterThan(0);
  });
});
