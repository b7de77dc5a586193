import { describe, expect, it } from 'vitest';
import { WebSerialLink } from '../../../src/features/bench/transport/web-serial-link';
import { defaultSerialSettings, recommendedBufferSize } from '../../../src/features/bench/transport/serial-options';

/**
 * A fake Web Serial port built on real web streams: the test pushes bytes (or errors) into the
 * readable side and collects what the link wrote, as the browser's port would.
 */
class FakePort extends EventTarget {
  readable: ReadableStream<Uint8Array> | null = null;
  writable: WritableStream<Uint8Array> | null = null;
  written: Uint8Array[] = [];
  openedWith: SerialOptions | null = null;
  signals: SerialOutputSignals = {};
  closedCount = 0;
  private controller!: ReadableStreamDefaultController<Uint8Array>;

  async open(options: SerialOptions) {
    this.openedWith = options;
    this.newReadable();
    this.writable = new WritableStream({ write: (chunk) => void this.written.push(chunk.slice()) });
  }
  async setSignals(s: SerialOutputSignals) {
    this.signals = { ...this.signals, ...s };
  }
  async close() {
    this.closedCount++;
    this.readable = null;
    this.writable = null;
  }
  /** Bytes arriving from the device. */
  deliver(bytes: number[]) {
    this.controller.enqueue(new Uint8Array(bytes));
  }
  /** A line error: the current stream errors and a fresh one takes its place, as the spec says. */
  lineError(name: string) {
    const old = this.controller;
    this.newReadable();
    const err = new DOMException('line error', name);
    old.error(err);
  }
  /** The device is unplugged mid-run. */
  unplug(serial: EventTarget) {
    const old = this.controller;
    this.readable = null;
    this.writable = null;
    old.error(new DOMException('The device has been lost.', 'NetworkError'));
    const ev = new Event('disconnect');
    Object.defineProperty(ev, 'target', { value: this });
    serial.dispatchEvent(ev);
  }
  private newReadable() {
    this.readable = new ReadableStream<Uint8Array>({ start: (c) => void (this.controller = c) });
  }
}

class FakeSerial extends EventTarget {}

async function openLink() {
  const port = new FakePort();
  const serial = new FakeSerial();
  const link = await WebSerialLink.open(port as unknown as SerialPort, defaultSerialSettings(), serial as unknown as Serial);
  const received: number[] = [];
  const warnings: string[] = [];
  // Tests wait for what the link delivers, never for a time.
  const waiters = new Set<() => void>();
  const notify = () => [...waiters].forEach((w) => w());
  link.onBytes((b) => {
    received.push(...b);
    notify();
  });
  link.onWarning((w) => {
    warnings.push(w);
    notify();
  });
  /** Settles once `condition` holds, checked whenever bytes or a warning arrive. */
  const until = (condition: () => boolean) =>
    new Promise<void>((resolve) => {
      const check = () => {
        if (!condition()) return;
        waiters.delete(check);
        resolve();
      };
      waiters.add(check);
      check();
    });
  const closed = new Promise<{ requested: boolean; message: string }>((resolve) => link.onClose(resolve));
  return { port, serial, link, received, warnings, closed, until };
}

describe('the Web Serial link', () => {
  it('opens the port with the chosen settings and sets DTR and RTS', async () => {
    const { port, link } = await openLink();
    expect(port.openedWith).toMatchObject({ baudRate: 3_000_000, dataBits: 8, stopBits: 1, parity: 'none', flowControl: 'none' });
    expect(port.openedWith!.bufferSize).toBe(recommendedBufferSize(3_000_000));
    expect(port.signals).toEqual({ dataTerminalReady: true, requestToSend: false });
    await link.close();
  });

  it('passes received chunks on in order, whatever their size', async () => {
    const { port, link, received, until } = await openLink();
    port.deliver([0xa5]);
    port.deliver([0x81, 0x00, 0x02, 1, 2]);
    port.deliver([3]);
    await until(() => received.length >= 7);
    expect(received).toEqual([0xa5, 0x81, 0x00, 0x02, 1, 2, 3]);
    await link.close();
  });

  it('delivers writes in call order', async () => {
    const { port, link } = await openLink();
    await Promise.all([link.write(new Uint8Array([1, 2])), link.write(new Uint8Array([3])), link.write(new Uint8Array([4, 5]))]);
    expect(port.written.map((w) => [...w])).toEqual([[1, 2], [3], [4, 5]]);
    await link.close();
  });

  it('keeps reading after an overrun or framing error and reports it as a warning', async () => {
    const { port, link, received, warnings, until } = await openLink();
    port.deliver([1, 2]);
    await until(() => received.length >= 2);
    port.lineError('BufferOverrunError');
    await until(() => warnings.length >= 1);
    port.deliver([3]);
    await until(() => received.length >= 3);
    expect(received).toEqual([1, 2, 3]);
    expect(warnings).toHaveLength(1);
    expect(warnings[0]).toContain('BufferOverrunError');
    expect(link.closed).toBe(false);
    await link.close();
  });

  it('stops with a clear message when the device disconnects mid-run, keeping what arrived', async () => {
    const { port, serial, link, received, closed, until } = await openLink();
    port.deliver([0xa5, 0x90]);
    await until(() => received.length >= 2);
    port.unplug(serial);
    const reason = await closed;
    expect(reason.requested).toBe(false);
    expect(reason.message).toMatch(/disconnected|failed|stopped/);
    expect(received).toEqual([0xa5, 0x90]);
    expect(link.closed).toBe(true);
    await expect(link.write(new Uint8Array([1]))).rejects.toThrow(/closed/);
  });

  it('closes the port exactly once when the host closes it', async () => {
    const { port, link, closed } = await openLink();
    await link.close();
    await link.close();
    expect((await closed).requested).toBe(true);
    expect(port.closedCount).toBe(1);
  });
});

describe('recommendedBufferSize', () => {
  // 8N1: baud/10 bytes per second (common practice, no source); 20 ms of traffic at least.
  it('holds at least 20 ms of traffic at the line rate', () => {
    for (const baud of [9_600, 115_200, 921_600, 3_000_000, 12_000_000]) {
      const size = recommendedBufferSize(baud);
      expect(size).toBeGreaterThanOrEqual((baud / 10) * 0.02);
      expect(Math.log2(size) % 1).toBe(0);
    }
    expect(recommendedBufferSize(3_000_000)).toBe(8192);
  });
});
