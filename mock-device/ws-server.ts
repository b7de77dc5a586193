// The simulated board on a WebSocket: each binary message carries raw line bytes. One client at
// a time; a second is turned away with a close reason that says why.
import type { AddressInfo } from 'node:net';
import { WebSocketServer, type WebSocket } from 'ws';
import { openBoardSession, type BoardSettings } from './board-session';
import { ChunkCoalescer } from '../shared/link-engine/chunk-coalescer';
import { realClock } from './line-pacer';

/** Host messages above this are refused (a UART host never sends megabytes at once). */
const MAX_MESSAGE_BYTES = 64 * 1024;
/** Close code for "try again later" (RFC 6455 registry: 1013). */
const TRY_AGAIN_LATER = 1013;

export interface MockServer {
  url: string;
  port: number;
  close(): Promise<void>;
}

export function startMockServer(settings: BoardSettings, port: number, host = '127.0.0.1', log: (line: string) => void = console.log): Promise<MockServer> {
  const wss = new WebSocketServer({ port, host, maxPayload: MAX_MESSAGE_BYTES });
  let active: WebSocket | null = null;
  let connections = 0;

  wss.on('connection', (ws, req) => {
    const id = ++connections;
    const peer = `${req.socket.remoteAddress}:${req.socket.remotePort}`;
    if (active) {
      log(`[board] connection ${id} from ${peer} refused: another client is connected`);
      ws.close(TRY_AGAIN_LATER, 'busy: another client is connected to the simulated board');
      return;
    }
    active = ws;
    const started = Date.now();
    let rx = 0;
    let tx = 0;
    // The pacer's 1 ms chunks, merged: a message per chunk costs a browser more than the bytes.
    const outgoing = new ChunkCoalescer({ clock: realClock, emit: (bytes) => ws.readyState === ws.OPEN && ws.send(bytes) });
    const session = openBoardSession(settings, (bytes) => {
      tx += bytes.length;
      outgoing.push(bytes);
    });
    ws.on('message', (data, isBinary) => {
      if (!isBinary) return; // text has no place on a byte line: ignored
      const buf = Array.isArray(data) ? Buffer.concat(data) : Buffer.from(data as ArrayBuffer);
      rx += buf.length;
      session.receive(new Uint8Array(buf.buffer, buf.byteOffset, buf.byteLength));
    });
    ws.on('error', () => undefined); // oversized or broken frames: 'close' follows
    ws.on('close', (code) => {
      outgoing.close();
      session.close();
      if (active === ws) active = null;
      const f = session.faults.counts;
      log(`[board] connection ${id} from ${peer}: ${((Date.now() - started) / 1000).toFixed(1)} s, ${rx} B in, ${tx} B out, ${f.bitsFlipped} bits flipped, ${f.bytesDropped} bytes dropped, close ${code}`);
    });
  });

  return new Promise((resolve, reject) => {
    wss.once('error', reject);
    wss.once('listening', () => {
      const actual = (wss.address() as AddressInfo).port;
      resolve({
        url: `ws://${host}:${actual}/`,
        port: actual,
        close: () =>
          new Promise<void>((done) => {
            for (const c of wss.clients) c.terminate();
            wss.close(() => done());
          }),
      });
    });
  });
}
