// The simulated board on a WebSocket: each binary message carries raw line bytes. One client at
// a time; a second is turned away with a close reason that says why.
import type { AddressInfo } from 'node:net';
import { WebSocketServer, type WebSocket } from 'ws';
import type { BoardSettings } from './board-session';
import { attachBoard, BOARD_MAX_MESSAGE_BYTES, describeStats } from './board-socket';
/** Close code for "try again later" (RFC 6455 registry: 1013). */
const TRY_AGAIN_LATER = 1013;

export interface MockServer {
  url: string;
  port: number;
  close(): Promise<void>;
}

export function startMockServer(settings: BoardSettings, port: number, host = '127.0.0.1', log: (line: string) => void = console.log): Promise<MockServer> {
  const wss = new WebSocketServer({ port, host, maxPayload: BOARD_MAX_MESSAGE_BYTES });
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
    void attachBoard(ws, settings).ended.then((stats) => {
      if (active === ws) active = null;
      log(`[board] connection ${id} from ${peer}: ${describeStats(stats)}`);
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
