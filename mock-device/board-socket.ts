// One simulated board behind one WebSocket: binary messages carry raw line bytes both ways. Used
// by `npm run mock` (ws-server.ts) and by the app server's hosted boards (server/sockets/).
import type { WebSocket } from 'ws';
import { ChunkCoalescer } from '../shared/link-engine/chunk-coalescer';
import { openBoardSession, type BoardSettings } from './board-session';
import { realClock } from './line-pacer';

/** Host messages above this are refused (a UART host never sends megabytes at once). */
export const BOARD_MAX_MESSAGE_BYTES = 64 * 1024;

export interface BoardSocketStats {
  bytesIn: number;
  bytesOut: number;
  bitsFlipped: number;
  bytesDropped: number;
  closeCode: number;
  seconds: number;
}

export interface BoardSocket {
  /** performance.now() of the last byte either way (for idle timeouts: a long sweep is not idle). */
  readonly lastActivityAt: number;
  /** Resolves once the socket closed and the board stopped. */
  readonly ended: Promise<BoardSocketStats>;
}

export function attachBoard(ws: WebSocket, settings: BoardSettings): BoardSocket {
  const started = realClock.now();
  let bytesIn = 0;
  let bytesOut = 0;
  const state = { lastActivityAt: started };
  // The pacer's 1 ms chunks, merged: a message per chunk costs a browser more than the bytes.
  const outgoing = new ChunkCoalescer({ clock: realClock, emit: (bytes) => ws.readyState === ws.OPEN && ws.send(bytes) });
  const session = openBoardSession(settings, (bytes) => {
    bytesOut += bytes.length;
    state.lastActivityAt = realClock.now();
    outgoing.push(bytes);
  });
  ws.on('message', (data, isBinary) => {
    if (!isBinary) return; // text has no place on a byte line: ignored
    const buf = Array.isArray(data) ? Buffer.concat(data) : Buffer.from(data as ArrayBuffer);
    bytesIn += buf.length;
    state.lastActivityAt = realClock.now();
    session.receive(new Uint8Array(buf.buffer, buf.byteOffset, buf.byteLength));
  });
  ws.on('error', () => undefined); // oversized or broken frames: 'close' follows
  const ended = new Promise<BoardSocketStats>((resolve) =>
    ws.on('close', (code) => {
      outgoing.close();
      session.close();
      const f = session.faults.counts;
      resolve({ bytesIn, bytesOut, bitsFlipped: f.bitsFlipped, bytesDropped: f.bytesDropped, closeCode: code, seconds: (realClock.now() - started) / 1000 });
    }),
  );
  return {
    get lastActivityAt() {
      return state.lastActivityAt;
    },
    ended,
  };
}

/** The one-line log of a finished connection. */
export const describeStats = (s: BoardSocketStats) =>
  `${s.seconds.toFixed(1)} s, ${s.bytesIn} B in, ${s.bytesOut} B out, ${s.bitsFlipped} bits flipped, ${s.bytesDropped} bytes dropped, close ${s.closeCode}`;
