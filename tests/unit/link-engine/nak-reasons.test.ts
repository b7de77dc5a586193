import { describe, expect, it } from 'vitest';
import { LinkEngine } from '../../../shared/link-engine/link-engine';
import { encodeFrame } from '../../../shared/link/frame';
import { Kind, NakReason } from '../../../shared/link/kinds';
import { inProcessBoard, realEngineClock } from '../../support/in-process-board';

const settle = () => new Promise((r) => setTimeout(r, 60));

/** Sends hand-made frames past the engine and watches which NAKs come back to the host. */
describe('the simulated board refuses bad requests with each NAK reason, and the host sees them', () => {
  async function setup(queueDepth = 256) {
    const board = inProcessBoard({ queueDepth, baud: 12_000_000 });
    const engine = new LinkEngine({ link: board.link, clock: realEngineClock, baud: 12_000_000 });
    await engine.hello();
    return { board, engine };
  }

  it('1: a frame whose CHECK is wrong', async () => {
    const { board, engine } = await setup();
    const frame = encodeFrame(Kind.One, 9, new Uint8Array([1, 0]));
    frame[frame.length - 1] ^= 0xff;
    await board.link.write(frame);
    await settle();
    expect(engine.figures.naks[NakReason.BadCheck]).toBe(1);
  });

  it('2: a LEN the KIND cannot have', async () => {
    const { board, engine } = await setup();
    await board.link.write(encodeFrame(Kind.Hello, 10, new Uint8Array([7])));
    await settle();
    expect(engine.figures.naks[NakReason.BadLength]).toBe(1);
  });

  it('3: a KIND the protocol does not define', async () => {
    const { board, engine } = await setup();
    await board.link.write(encodeFrame(0x55, 11, new Uint8Array(0)));
    await settle();
    expect(engine.figures.naks[NakReason.UnknownKind]).toBe(1);
  });

  it('4: a request while paused', async () => {
    const { board, engine } = await setup();
    await board.link.write(encodeFrame(Kind.Pause, 12, new Uint8Array(0)));
    await settle();
    await board.link.write(encodeFrame(Kind.One, 13, new Uint8Array([1, 0])));
    await settle();
    expect(engine.figures.naks[NakReason.Paused]).toBe(1);
  });

  it('5: a LIST larger than the free queue', async () => {
    const { board, engine } = await setup(4);
    await board.link.write(encodeFrame(Kind.List, 14, new Uint8Array(20)));
    await settle();
    expect(engine.figures.naks[NakReason.QueueFull]).toBe(1);
  });

  it('6: an angle code outside the core’s range', async () => {
    const board = inProcessBoard({ core: { angleBits: 12 }, baud: 12_000_000 });
    const engine = new LinkEngine({ link: board.link, clock: realEngineClock, baud: 12_000_000 });
    await engine.hello();
    await board.link.write(encodeFrame(Kind.One, 15, new Uint8Array([0xff, 0xff])));
    await settle();
    expect(engine.figures.naks[NakReason.AngleOutOfRange]).toBe(1);
  });
});
