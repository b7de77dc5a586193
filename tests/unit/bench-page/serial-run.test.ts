import { describe, expect, it } from 'vitest';
import { LinkEngine } from '../../../shared/link-engine/link-engine';
import { createCordicModel } from '../../../shared/numeric';
import { defaultBoardSettings, openBoardSession } from '../../../mock-device/board-session';
import { WebSerialLink } from '../../../src/features/bench/transport/web-serial-link';
import { defaultSerialSettings } from '../../../src/features/bench/transport/serial-options';
import { realEngineClock } from '../../support/in-process-board';

/**
 * A fake Web Serial port on real web streams with the simulated board behind it: what the host
 * writes reaches the board, and the board's paced output arrives on the readable side.
 */
class BoardPort extends EventTarget {
  readable: ReadableStream<Uint8Array> | null = null;
  writable: WritableStream<Uint8Array> | null = null;
  private controller!: ReadableStreamDefaultController<Uint8Array>;
  private board = openBoardSession({ ...defaultBoardSettings(), baud: 3_000_000 }, (bytes) => this.readable && this.controller.enqueue(bytes));

  async open() {
    this.readable = new ReadableStream<Uint8Array>({ start: (c) => void (this.controller = c) });
    this.writable = new WritableStream({ write: (chunk) => void setTimeout(() => this.board.receive(chunk.slice()), 0) });
  }
  async setSignals() {}
  async close() {
    this.board.close();
  }
  /** The adapter is pulled out: the stream errors and the browser fires 'disconnect'. */
  unplug(serial: EventTarget) {
    this.board.close();
    const c = this.controller;
    this.readable = null;
    this.writable = null;
    c.error(new DOMException('The device has been lost.', 'NetworkError'));
    const ev = new Event('disconnect');
    Object.defineProperty(ev, 'target', { value: this });
    serial.dispatchEvent(ev);
  }
}

describe('a run over Web Serial when the device is unplugged mid-run', () => {
  it('stops with a plain reason and keeps every result that arrived, each equal to the model', async () => {
    const port = new BoardPort();
    const serial = new EventTarget();
    const link = await WebSerialLink.open(port as unknown as SerialPort, defaultSerialSettings(), serial as unknown as Serial);
    const engine = new LinkEngine({ link, clock: realEngineClock, baud: 3_000_000 });
    await engine.hello();
    let delivered = 0;
    let unplugged = false;
    const run = engine.run(
      { kind: 'sweep', start: 0, step: 1, count: 65_536 },
      {
        onResults: (b) => {
          delivered += b.indexes.length;
          if (!unplugged && delivered >= 5000) {
            unplugged = true;
            port.unplug(serial);
          }
        },
      },
    );
    const result = await run.done;
    expect(result.status).toBe('failed');
    expect(result.message).toMatch(/^The link closed during the run: The serial device was disconnected/);
    const answered = result.answered.reduce((n, a) => n + a, 0);
    expect(answered).toBe(delivered);
    expect(answered).toBeGreaterThanOrEqual(5000);
    expect(answered).toBeLessThan(65_536);
    expect(result.missing.length).toBe(65_536 - answered);
    const model = createCordicModel({});
    const cos = new Int32Array(65_536);
    const sin = new Int32Array(65_536);
    model.evaluateInto(result.codes, cos, sin);
    for (let i = 0; i < 65_536; i++) if (result.answered[i]) expect([result.cos[i], result.sin[i]]).toEqual([cos[i], sin[i]]);
    expect(link.closed).toBe(true);
  });
});
