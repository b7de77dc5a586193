// The simulated board on a WebSocket, as `npm run mock` serves it, with a tap on its line: the
// requests the host sent (in order, each with how many results the board had sent before it) and
// the result pairs the board sent. Browser tests check the page against what reached the board.
import type { AddressInfo } from 'node:net';
import { WebSocketServer } from 'ws';
import { defaultBoardSettings, openBoardSession, type BoardSettings } from '../../mock-device/board-session';
import { realClock } from '../../mock-device/line-pacer';
import { ChunkCoalescer } from '../../shared/link-engine/chunk-coalescer';
import { decodePayload, DEFAULT_PROFILE, FrameDecoder, Kind, type Message, type WireProfile } from '../../shared/link';

export interface TappedRequest {
  kind: number;
  /** The request as decoded (its codes, for ONE, LIST and SWEEP). */
  message: Message;
  /** Result pairs the board had sent when this request reached it. */
  resultsBefore: number;
}

export interface TappedBoard {
  url: string;
  /** Requests from the host, in the order they arrived (every connection). */
  readonly requests: TappedRequest[];
  /** Result pairs sent to the host so far (every connection). */
  readonly resultsSent: number;
  /** The first request of `kind`, once one has arrived. */
  first(kind: number): TappedRequest | undefined;
  close(): Promise<void>;
}

/** One client at a time, like the board itself; the core is the 16-bit default unless overridden. */
export function startTappedBoard(overrides: Partial<BoardSettings> = {}): Promise<TappedBoard> {
  const settings = { ...defaultBoardSettings(), ...overrides };
  const profile: WireProfile = { ...DEFAULT_PROFILE, ...(settings.core as Partial<WireProfile>) };
  const requests: TappedRequest[] = [];
  let resultsSent = 0;
  const wss = new WebSocketServer({ port: 0, host: '127.0.0.1' });
  wss.on('connection', (ws) => {
    const fromHost = new FrameDecoder({ accept: 'requests', profile, onFrame: (f) => void requests.push({ kind: f.kind, message: decodePayload(f.kind, f.payload, profile), resultsBefore: resultsSent }) });
    const toHost = new FrameDecoder({
      accept: 'replies',
      profile,
      onFrame: (f) => {
        if (f.kind === Kind.Results) resultsSent += (decodePayload(f.kind, f.payload, profile) as { cos: Int32Array }).cos.length;
      },
    });
    const out = new ChunkCoalescer({ clock: realClock, emit: (bytes) => ws.readyState === ws.OPEN && ws.send(bytes) });
    const session = openBoardSession(settings, (bytes) => {
      toHost.push(bytes);
      out.push(bytes);
    });
    ws.on('message', (data: Buffer) => {
      const bytes = new Uint8Array(data.buffer, data.byteOffset, data.byteLength);
      fromHost.push(bytes);
      session.receive(bytes);
    });
    ws.on('close', () => {
      out.close();
      session.close();
    });
  });
  return new Promise((resolve, reject) => {
    wss.once('error', reject);
    wss.once('listening', () =>
      resolve({
        url: `ws://127.0.0.1:${(wss.address() as AddressInfo).port}/`,
        requests,
        get resultsSent() {
          return resultsSent;
        },
        first: (kind) => requests.find((r) => r.kind === kind),
        close: () =>
          new Promise<void>((done) => {
            for (const c of wss.clients) c.terminate();
            wss.close(() => done());
          }),
      }),
    );
  });
}
