import { describe, expect, it } from 'vitest';
import { SimulatedBoard } from '../../../mock-device/simulated-board';
import { createSimCore } from '../../../mock-device/faulty-core';
import { createSimVectorCore } from '../../../mock-device/vector-core';
import { FrameDecoder } from '../../../shared/link/decoder';
import { Kind, SweepStatus } from '../../../shared/link/kinds';
import { decodePayload, encodeMessage, type Message, type WireProfile } from '../../../shared/link/payloads';

// docs/protocol.md: a SWEEP of count 0, or a VEC_GRID with nx or ny 0, is answered at once with
// SWEEP_END done 0 — no RESULTS frame, empty or not, before it.

function board(core: ConstructorParameters<typeof SimulatedBoard>[0]['core']) {
  const replies: Message[] = [];
  let profile: WireProfile | null = null;
  const sim = new SimulatedBoard({ core, queueDepth: 64, buildId: 1, clockKHz: 100_000, name: 'test board', send: (bytes) => (decoder.push(bytes), 0) });
  const decoder = new FrameDecoder({ accept: 'replies', onFrame: (f) => replies.push(decodePayload(f.kind, f.payload, profile!)) });
  return {
    replies,
    ask(m: Message, p: WireProfile) {
      profile = p;
      decoder.setProfile(p);
      sim.receive(encodeMessage(m, 7, p));
    },
  };
}

describe('empty board-expanded requests', () => {
  it('a SWEEP of count 0 gets SWEEP_END done 0 alone', () => {
    const b = board(createSimCore({}));
    const p: WireProfile = { angleFormat: 'turn', angleBits: 16, outBits: 16 };
    b.ask({ kind: Kind.Sweep, start: 0, step: 1, count: 0 }, p);
    expect(b.replies).toEqual([{ kind: Kind.SweepEnd, done: 0, status: SweepStatus.Complete }]);
    // and a sweep of one code still gets its one RESULTS before the end
    b.replies.length = 0;
    b.ask({ kind: Kind.Sweep, start: 0, step: 1, count: 1 }, p);
    expect(b.replies.map((r) => r.kind)).toEqual([Kind.Results, Kind.SweepEnd]);
  });

  it.each([
    [0, 3],
    [3, 0],
  ])('a VEC_GRID of %i × %i vectors gets SWEEP_END done 0 alone', (nx, ny) => {
    const core = createSimVectorCore({});
    const v = core.config;
    const b = board({ vector: core });
    const p: WireProfile = { angleFormat: v.angleFormat, angleBits: v.angleBits, outBits: v.magBits, vector: { inBits: v.inBits, angleFormat: v.angleFormat, angleBits: v.angleBits, magBits: v.magBits } };
    b.ask({ kind: Kind.VecGrid, x0: 1, dx: 1, nx, y0: 1, dy: 1, ny }, p);
    expect(b.replies).toEqual([{ kind: Kind.SweepEnd, done: 0, status: SweepStatus.Complete }]);
  });
});
