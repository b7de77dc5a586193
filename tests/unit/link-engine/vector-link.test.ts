import { describe, expect, it } from 'vitest';
import { LinkEngine, LinkError, type VectorRunResult } from '../../../shared/link-engine/link-engine';
import type { DecodedFrame } from '../../../shared/link/decoder';
import { encodeFrame } from '../../../shared/link/frame';
import { Kind, NakReason } from '../../../shared/link/kinds';
import { decodePayload, encodeMessage, type MessageOf } from '../../../shared/link/payloads';
import { createVectorModel, planVectors, type VectorConfigInput } from '../../../shared/vectoring';
import { parseLineFaults } from '../../../mock-device/line-faults';
import { inProcessBoard, realEngineClock } from '../../support/in-process-board';
import type { BoardSettings } from '../../../mock-device/board-session';
import { gridSegment } from '../../../shared/link-engine/run-source';
import { gridVector, type VectorGrid } from '../../../shared/link/payloads';

async function connect(vector: BoardSettings['vector'] | undefined, overrides: Partial<BoardSettings> = {}, onFrame?: (f: DecodedFrame) => void) {
  const board = inProcessBoard({ baud: 12_000_000, ...(vector ? { vector } : {}), ...overrides });
  const engine = new LinkEngine({ link: board.link, clock: realEngineClock, baud: 12_000_000, timeoutMs: 100, onFrame });
  const info = await engine.hello();
  return { board, engine, info };
}

/** Answers that differ from the model's, over the answered vectors; and how many were answered. */
function compareWithModel(config: VectorConfigInput, r: VectorRunResult) {
  const angle = new Int32Array(r.xs.length);
  const magnitude = new Int32Array(r.xs.length);
  createVectorModel(config).answerInto(r.xs, r.ys, angle, magnitude);
  let mismatches = 0;
  let answered = 0;
  for (let i = 0; i < angle.length; i++) {
    if (!r.answered[i]) continue;
    answered++;
    if (angle[i] !== r.angle[i] || magnitude[i] !== r.magnitude[i]) mismatches++;
  }
  return { mismatches, answered };
}

describe('a vectoring board over the bench link, in process', () => {
  it('announces version 2 in INFO and its formats in MODE_INFO, which size the VEC_* fields', async () => {
    const config = { inBits: 12, inFrac: 10, angleFormat: 'rad', angleBits: 20, magBits: 14, magFrac: 10, iterations: 14 } as const;
    const { engine, info, board } = await connect({ core: config });
    expect(info).toMatchObject({ version: 2, angleFormat: 'rad', angleBits: 20, outBits: 14, outFrac: 10, iterations: 14 });
    const modes = await engine.modes();
    expect(modes).toEqual({ rotation: false, vectoring: { inBits: 12, inFrac: 10, angleFormat: 'rad', angleBits: 20, angleFrac: 17, magBits: 14, magFrac: 10, iterations: 14 } });
    expect(engine.profile.vector).toEqual({ inBits: 12, angleFormat: 'rad', angleBits: 20, magBits: 14 });
    // 3-byte angles and 2-byte magnitudes: a pair the default widths could not read.
    const r = await engine.runVectors({ kind: 'vectors', xs: [-2048, 2047, 0, 1000], ys: [-2048, 2047, -1, -999] }).done;
    expect(r.status).toBe('complete');
    expect(compareWithModel(config, r)).toEqual({ mismatches: 0, answered: 4 });
    await board.link.close();
  });

  it('answers a 256 × 256 grid it expands itself, bit-exact with the model, every vector once', async () => {
    const { engine, board } = await connect({ core: {} });
    await engine.modes();
    let delivered = 0;
    // Every 256th code of each 16-bit axis: the grid crosses both axes and the negative x axis.
    const r = await engine.runVectors({ kind: 'grid', x0: -32768, dx: 256, nx: 256, y0: -32768, dy: 256, ny: 256 }, { onResults: (b) => (delivered += b.indexes.length) }).done;
    expect(r.status).toBe('complete');
    expect(r.missing).toEqual([]);
    expect(delivered).toBe(65_536);
    expect(compareWithModel({}, r)).toEqual({ mismatches: 0, answered: 65_536 });
    // y runs fastest: point 255 ends the first column, point 256 starts the second.
    expect([r.xs[0], r.ys[0]]).toEqual([-32768, -32768]);
    expect([r.xs[255], r.ys[255]]).toEqual([-32768, -32768 + 255 * 256]);
    expect([r.xs[256], r.ys[256]]).toEqual([-32768 + 256, -32768]);
    expect(r.figures.retries).toBe(0);
    await board.link.close();
  });

  it('wraps grid coordinates in the input format, as an inBits-wide adder does', async () => {
    const config = { inBits: 8 };
    const { engine, board } = await connect({ core: config });
    await engine.modes();
    // x0 = 100, dx = 20: 100, 120, −116 (140 wrapped in 8 bits), −96; y −128, then 127 (−129 wrapped).
    const r = await engine.runVectors({ kind: 'grid', x0: 100, dx: 20, nx: 4, y0: -128, dy: -1, ny: 2 }).done;
    expect(Array.from(r.xs)).toEqual([100, 100, 120, 120, -116, -116, -96, -96]);
    expect(Array.from(r.ys)).toEqual([-128, 127, -128, 127, -128, 127, -128, 127]);
    expect(compareWithModel(config, r)).toEqual({ mismatches: 0, answered: 8 });
    await board.link.close();
  });

  it('keeps VEC_LIST requests within the queue depth and answers a long list once each', async () => {
    const { engine, board } = await connect({ core: {} }, { queueDepth: 40 });
    await engine.modes();
    const { xs, ys } = planVectors({ kind: 'random', seed: 7, count: 5000 }, { inBits: 16 });
    const r = await engine.runVectors({ kind: 'vectors', xs, ys }).done;
    expect(r.status).toBe('complete');
    expect(r.figures.naks[NakReason.QueueFull]).toBe(0);
    expect(compareWithModel({}, r)).toEqual({ mismatches: 0, answered: 5000 });
    await board.link.close();
  });

  it('with bit errors and lost bytes still ends with every grid vector answered exactly once', async () => {
    const lineFaults = parseLineFaults('ber=1e-4,drop=1e-5,jitter-ms=1,seed=11');
    const { engine, board } = await connect({ core: {} }, { lineFaults });
    await engine.modes();
    let delivered = 0;
    const r = await engine.runVectors({ kind: 'grid', x0: -32768, dx: 512, nx: 128, y0: -32768, dy: 256, ny: 256 }, { onResults: (b) => (delivered += b.indexes.length) }).done;
    expect(r.status).toBe('complete');
    expect(r.missing).toEqual([]);
    expect(delivered).toBe(32_768); // never counted twice
    expect(r.figures.checkFailures).toBeGreaterThan(0);
    expect(r.figures.retries).toBeGreaterThan(0);
    // An 8-bit CHECK lets about 1 in 256 damaged frames through: with confirmation off, allow a few.
    expect(compareWithModel({}, r).mismatches).toBeLessThan(20);
    await board.link.close();
  });

  it('confirms answers off the model while the line is damaging frames, leaving none wrong', async () => {
    const lineFaults = parseLineFaults('ber=3e-4,seed=5');
    const { engine, board } = await connect({ core: {} }, { lineFaults });
    await engine.modes();
    const model = createVectorModel({});
    const confirm = (x: number, y: number, angle: number, magnitude: number) => {
      const m = model.answer(x, y);
      return m.angle !== angle || m.magnitude !== magnitude;
    };
    const r = await engine.runVectors({ kind: 'grid', x0: -32768, dx: 256, nx: 256, y0: -32768, dy: 1024, ny: 64 }, { confirm }).done;
    expect(r.status).toBe('complete');
    expect(r.figures.checkFailures).toBeGreaterThan(0);
    expect(compareWithModel({}, r)).toEqual({ mismatches: 0, answered: 16_384 });
    await board.link.close();
  });

  it('refuses to run vectors before modes() or on a board that only rotates', async () => {
    const { engine, board } = await connect(undefined);
    expect(() => engine.runVectors({ kind: 'vectors', xs: [1], ys: [1] })).toThrow(LinkError);
    expect(await engine.modes()).toEqual({ rotation: true, vectoring: null });
    expect(() => engine.runVectors({ kind: 'vectors', xs: [1], ys: [1] })).toThrow(/no vectoring core/);
    await board.link.close();
  });

  it('refuses a grid or list the input format cannot hold before sending anything', async () => {
    const { engine, board } = await connect({ core: { inBits: 10 } });
    await engine.modes();
    expect(() => engine.runVectors({ kind: 'vectors', xs: [512], ys: [0] })).toThrow(/outside the input format \(-512\.\.511\)/);
    expect(() => engine.runVectors({ kind: 'grid', x0: 0, dx: 1, nx: 0, y0: 0, dy: 1, ny: 1 })).toThrow(/nx must be an integer 1\.\.65535/);
    expect(() => engine.runVectors({ kind: 'grid', x0: 0, dx: 1, nx: 2, y0: -513, dy: 1, ny: 1 })).toThrow(/y0 must be an input code/);
    expect(board.link.written).toHaveLength(2); // HELLO and MODES only
    await board.link.close();
  });
});

describe('grid segments', () => {
  it('cover a grid in run order, each a smaller grid: whole columns, or the rest of one column', () => {
    const p = { angleFormat: 'turn', angleBits: 16, outBits: 16 } as const;
    const g: VectorGrid = { x0: 30000, dx: 3000, nx: 7, y0: -5, dy: 7, ny: 300 };
    for (const max of [100, 300, 1000, 8192]) {
      let first = 0;
      const seen: Array<{ x: number; y: number }> = [];
      while (first < g.nx * g.ny) {
        const seg = gridSegment(g, first, max, p);
        expect(seg.count).toBeGreaterThan(0);
        expect(seg.count).toBeLessThanOrEqual(max);
        const m = decodePayload(Kind.VecGrid, seg.payload, p) as MessageOf<typeof Kind.VecGrid>;
        for (let k = 0; k < seg.count; k++) seen.push(gridVector(m, k, p));
        first += seg.count;
      }
      expect(seen).toEqual(Array.from({ length: g.nx * g.ny }, (_, k) => gridVector(g, k, p)));
    }
  });
});

describe('a board that only rotates, asked the version-2 questions', () => {
  it('answers MODES, VEC_ONE, VEC_LIST and VEC_GRID with NAK 3 and keeps serving rotation', async () => {
    const naks: Array<MessageOf<typeof Kind.Nak>> = [];
    let fourth = () => {};
    const asked = new Promise<void>((resolve) => (fourth = resolve));
    const { engine, board, info } = await connect(undefined, {}, (f) => {
      if (f.kind !== Kind.Nak) return;
      naks.push(decodePayload(f.kind, f.payload, engine.profile) as MessageOf<typeof Kind.Nak>);
      if (naks.length === 4) fourth();
    });
    expect(info.version).toBe(1);
    const vp = { angleFormat: 'turn', angleBits: 16, outBits: 16 } as const;
    await board.link.write(encodeFrame(Kind.Modes, 1));
    await board.link.write(encodeMessage({ kind: Kind.VecOne, x: 1, y: 2 }, 2, vp));
    await board.link.write(encodeMessage({ kind: Kind.VecList, xs: [1, 2], ys: [3, 4] }, 3, vp));
    await board.link.write(encodeMessage({ kind: Kind.VecGrid, x0: 0, dx: 1, nx: 2, y0: 0, dy: 1, ny: 2 }, 4, vp));
    await asked;
    expect(naks).toEqual([
      { kind: Kind.Nak, refused: Kind.Modes, reason: NakReason.UnknownKind },
      { kind: Kind.Nak, refused: Kind.VecOne, reason: NakReason.UnknownKind },
      { kind: Kind.Nak, refused: Kind.VecList, reason: NakReason.UnknownKind },
      { kind: Kind.Nak, refused: Kind.VecGrid, reason: NakReason.UnknownKind },
    ]);
    const r = await engine.run({ kind: 'sweep', start: 0, step: 1, count: 4096 }).done;
    expect(r.status).toBe('complete');
    expect(r.missing).toEqual([]);
    await board.link.close();
  });

  it('is found to rotate only even when its INFO claims version 2 and it refuses MODES', async () => {
    // A board that answers HELLO with version 2 but knows no MODES: the engine takes NAK 3 as "rotation only".
    const { engine, board } = await connect(undefined, {}, undefined);
    engine.info = { ...engine.info!, version: 2 };
    expect(await engine.modes()).toEqual({ rotation: true, vectoring: null });
    await board.link.close();
  });
});

describe('a vectoring board refuses bad requests with the matching NAK', () => {
  async function setup(overrides: Partial<BoardSettings> = {}) {
    const waiting: Array<(f: DecodedFrame) => void> = [];
    const { board, engine } = await connect({ core: { inBits: 10 } }, overrides, (f) => {
      if (f.kind === Kind.Nak || f.kind === Kind.SweepEnd) waiting.shift()?.(f);
    });
    await engine.modes();
    const replyTo = async (frame: Uint8Array) => {
      const reply = new Promise<DecodedFrame>((resolve) => waiting.push(resolve));
      await board.link.write(frame);
      const f = await reply;
      return { tag: f.tag, ...decodePayload(f.kind, f.payload, engine.profile) };
    };
    return { board, engine, replyTo };
  }

  it('7: x or y outside the input format, in VEC_ONE, VEC_LIST or a grid start', async () => {
    const { board, engine, replyTo } = await setup();
    const p = engine.profile; // 10-bit inputs travel in 2-byte fields, so 512 fits the field but not the format
    expect(await replyTo(encodeMessage({ kind: Kind.VecOne, x: 512, y: 0 }, 20, p))).toEqual({ tag: 20, kind: Kind.Nak, refused: Kind.VecOne, reason: NakReason.VectorOutOfRange });
    expect(await replyTo(encodeMessage({ kind: Kind.VecList, xs: [0, 1], ys: [0, -513] }, 21, p))).toEqual({ tag: 21, kind: Kind.Nak, refused: Kind.VecList, reason: NakReason.VectorOutOfRange });
    expect(await replyTo(encodeMessage({ kind: Kind.VecGrid, x0: -600, dx: 1, nx: 2, y0: 0, dy: 1, ny: 2 }, 22, p))).toEqual({ tag: 22, kind: Kind.Nak, refused: Kind.VecGrid, reason: NakReason.VectorOutOfRange });
    await board.link.close();
  });

  it('2: a VEC_ONE, VEC_LIST or VEC_GRID whose LEN the KIND cannot have', async () => {
    const { board, replyTo } = await setup();
    expect(await replyTo(encodeFrame(Kind.VecOne, 30, new Uint8Array(3)))).toEqual({ tag: 30, kind: Kind.Nak, refused: Kind.VecOne, reason: NakReason.BadLength });
    expect(await replyTo(encodeFrame(Kind.VecList, 31, new Uint8Array(6)))).toEqual({ tag: 31, kind: Kind.Nak, refused: Kind.VecList, reason: NakReason.BadLength });
    expect(await replyTo(encodeFrame(Kind.VecGrid, 32, new Uint8Array(12)))).toEqual({ tag: 32, kind: Kind.Nak, refused: Kind.VecGrid, reason: NakReason.BadLength });
    await board.link.close();
  });

  it('1 and 3: a damaged VEC_GRID, and rotation requests it does not serve', async () => {
    const { board, engine, replyTo } = await setup();
    const grid = encodeMessage({ kind: Kind.VecGrid, x0: 0, dx: 1, nx: 2, y0: 0, dy: 1, ny: 2 }, 40, engine.profile);
    grid[grid.length - 1] ^= 0x5a;
    expect(await replyTo(grid)).toEqual({ tag: 40, kind: Kind.Nak, refused: Kind.VecGrid, reason: NakReason.BadCheck });
    expect(await replyTo(encodeFrame(Kind.One, 41, Uint8Array.of(0x55, 0x15)))).toEqual({ tag: 41, kind: Kind.Nak, refused: Kind.One, reason: NakReason.UnknownKind });
    expect(await replyTo(encodeFrame(Kind.Sweep, 42, new Uint8Array(12)))).toEqual({ tag: 42, kind: Kind.Nak, refused: Kind.Sweep, reason: NakReason.UnknownKind });
    await board.link.close();
  });

  it('4: a request while paused; an empty grid ends at once with SWEEP_END', async () => {
    const { board, engine, replyTo } = await setup();
    const p = engine.profile;
    expect(await replyTo(encodeMessage({ kind: Kind.VecGrid, x0: 0, dx: 1, nx: 0, y0: 0, dy: 1, ny: 5 }, 50, p))).toEqual({ tag: 50, kind: Kind.SweepEnd, done: 0, status: 0 });
    await board.link.write(encodeFrame(Kind.Pause, 51));
    expect(await replyTo(encodeMessage({ kind: Kind.VecOne, x: 1, y: 1 }, 52, p))).toEqual({ tag: 52, kind: Kind.Nak, refused: Kind.VecOne, reason: NakReason.Paused });
    expect(await replyTo(encodeMessage({ kind: Kind.VecGrid, x0: 0, dx: 1, nx: 2, y0: 0, dy: 1, ny: 2 }, 53, p))).toEqual({ tag: 53, kind: Kind.Nak, refused: Kind.VecGrid, reason: NakReason.Paused });
    await board.link.close();
  });

  it('5: a VEC_LIST larger than the free queue', async () => {
    const { board, engine, replyTo } = await setup({ queueDepth: 4 });
    const five = [1, 2, 3, 4, 5];
    expect(await replyTo(encodeMessage({ kind: Kind.VecList, xs: five, ys: five }, 60, engine.profile))).toEqual({ tag: 60, kind: Kind.Nak, refused: Kind.VecList, reason: NakReason.QueueFull });
    await board.link.close();
  });
});
