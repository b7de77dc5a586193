import { describe, expect, it } from 'vitest';
import { LinkEngine } from '../../../shared/link-engine/link-engine';
import type { DecodedFrame } from '../../../shared/link/decoder';
import { encodeFrame } from '../../../shared/link/frame';
import { Kind, NakReason } from '../../../shared/link/kinds';
import { inProcessBoard, realEngineClock } from '../../support/in-process-board';

/** The NAK counts that are not zero: exactly one NAK, of the reason the test provoked. */
const nonZero = (naks: Record<number, number>) => Object.fromEntries(Object.entries(naks).filter(([, n]) => n > 0));

/** Sends hand-made frames past the engine and watches which NAKs come back to the host. */
describe('the simulated board refuses bad requests with each NAK reason, and the host sees them', () => {
  async function setup(overrides: Parameters<typeof inProcessBoard>[0] = {}) {
    const board = inProcessBoard({ baud: 12_000_000, ...overrides });
    // Each test waits for the reply frame itself, never for a time.
    const waiting: Array<{ kind: number; resolve: (f: DecodedFrame) => void }> = [];
    const onFrame = (f: DecodedFrame) => {
      const i = waiting.findIndex((w) => w.kind === f.kind);
      if (i >= 0) waiting.splice(i, 1)[0].resolve(f);
    };
    const engine = new LinkEngine({ link: board.link, clock: realEngineClock, baud: 12_000_000, onFrame });
    await engine.hello();
    /** Resolves with the next frame of `kind` from the board (the engine has counted it by then). */
    const next = (kind: number) => new Promise<DecodedFrame>((resolve) => waiting.push({ kind, resolve }));
    /** Writes `frame` and waits for the board's NAK to it. */
    const nakTo = async (frame: Uint8Array) => {
      const nak = next(Kind.Nak);
      await board.link.write(frame);
      return nak;
    };
    return { board, engine, next, nakTo };
  }

  it('1: a frame whose CHECK is wrong', async () => {
    const { engine, nakTo } = await setup();
    const frame = encodeFrame(Kind.One, 9, new Uint8Array([1, 0]));
    frame[frame.length - 1] ^= 0xff;
    await nakTo(frame);
    expect(nonZero(engine.figures.naks)).toEqual({ [NakReason.BadCheck]: 1 });
  });

  it('2: a LEN the KIND cannot have', async () => {
    const { engine, nakTo } = await setup();
    expect((await nakTo(encodeFrame(Kind.Hello, 10, new Uint8Array([7])))).tag).toBe(10);
    expect(nonZero(engine.figures.naks)).toEqual({ [NakReason.BadLength]: 1 });
  });

  it('3: a KIND the protocol does not define', async () => {
    const { engine, nakTo } = await setup();
    expect((await nakTo(encodeFrame(0x55, 11, new Uint8Array(0)))).tag).toBe(11);
    expect(nonZero(engine.figures.naks)).toEqual({ [NakReason.UnknownKind]: 1 });
  });

  it('4: a request while paused', async () => {
    const { board, engine, next, nakTo } = await setup();
    const ack = next(Kind.Ack);
    await board.link.write(encodeFrame(Kind.Pause, 12, new Uint8Array(0)));
    expect((await ack).tag).toBe(12);
    expect((await nakTo(encodeFrame(Kind.One, 13, new Uint8Array([1, 0])))).tag).toBe(13);
    expect(nonZero(engine.figures.naks)).toEqual({ [NakReason.Paused]: 1 });
  });

  it('5: a LIST larger than the free queue', async () => {
    const { engine, nakTo } = await setup({ queueDepth: 4 });
    expect((await nakTo(encodeFrame(Kind.List, 14, new Uint8Array(20)))).tag).toBe(14);
    expect(nonZero(engine.figures.naks)).toEqual({ [NakReason.QueueFull]: 1 });
  });

  it('6: an angle code outside the core\u2019s range', async () => {
    const { engine, nakTo } = await setup({ core: { angleBits: 12 } });
    expect((await nakTo(encodeFrame(Kind.One, 15, new Uint8Array([0xff, 0xff])))).tag).toBe(15);
    expect(nonZero(engine.figures.naks)).toEqual({ [NakReason.AngleOutOfRange]: 1 });
  });
});
