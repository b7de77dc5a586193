// Simulated boards hosted by the app server: `/api/sim-board` gives every connection a board of
// its own, in-process, paced to its baud rate as `npm run mock` paces. At most SIM_BOARDS_MAX at
// once; boards with no traffic either way for a while are freed for others.
import type { IncomingMessage } from 'node:http';
import type { WebSocket } from 'ws';
import type { BoardSettings } from '../../mock-device/board-session';
import { attachBoard, BOARD_MAX_MESSAGE_BYTES, type BoardSocket } from '../../mock-device/board-socket';
import type { Config } from '../config';
import { simBoardSettings } from './sim-board-settings';
import type { SocketDispatcher } from './upgrade';

export const SIM_BOARD_PATH = '/api/sim-board';

/** RFC 6455 close codes (IANA registry): 1013 try again later; 1000 normal closure. */
export const TRY_AGAIN_LATER = 1013;
const NORMAL = 1000;

/** Ten minutes without a byte either way frees the board (common practice, no source). */
const DEFAULT_IDLE_MS = 10 * 60 * 1000;

export interface SimBoardOptions {
  /** Free a board after this long without traffic. */
  idleMs?: number;
  /** Called with the number of boards open whenever it changes (tests, logs). */
  onCount?: (open: number) => void;
}

/** The refusal when every board is taken; the Bench page shows it as the link's message. */
export const boardsBusyReason = (max: number) => `All ${max} simulated boards on this server are in use (${max} of ${max}); try again when one is free`;

/** Why an idle board was closed. */
export const idleReason = (idleMs: number) =>
  `No traffic for ${idleMs >= 60_000 ? `${Math.round(idleMs / 60_000)} min` : `${Math.round(idleMs / 1000)} s`}: the simulated board was freed for others`;

export function registerSimBoards(sockets: SocketDispatcher, config: Pick<Config, 'simBoardsMax'>, options: SimBoardOptions = {}) {
  const idleMs = options.idleMs ?? DEFAULT_IDLE_MS;
  const open = new Set<BoardSocket & { ws: WebSocket }>();
  const prepared = new WeakMap<IncomingMessage, BoardSettings>();
  let sweeper: NodeJS.Timeout | null = null;

  const sweep = () => {
    const now = performance.now();
    for (const b of open) if (now - b.lastActivityAt >= idleMs) b.ws.close(NORMAL, idleReason(idleMs));
  };
  const counted = () => {
    options.onCount?.(open.size);
    if (open.size > 0 && !sweeper) {
      sweeper = setInterval(sweep, Math.max(10, Math.min(idleMs / 4, 30_000)));
      sweeper.unref();
    } else if (open.size === 0 && sweeper) {
      clearInterval(sweeper);
      sweeper = null;
    }
  };

  sockets.register(SIM_BOARD_PATH, {
    role: 'engineer',
    maxPayload: BOARD_MAX_MESSAGE_BYTES,
    // Settings are checked before the upgrade, so a bad address gets a 400 saying which key.
    async admit(req) {
      prepared.set(req, await simBoardSettings(new URL(req.url ?? '/', 'http://upgrade.invalid').searchParams));
    },
    handle(ws, req) {
      const settings = prepared.get(req)!;
      if (open.size >= config.simBoardsMax) {
        // Accepted, then closed with a reason: a browser sees a close reason, never a refused
        // upgrade's status or body.
        ws.close(TRY_AGAIN_LATER, config.simBoardsMax === 0 ? 'Simulated boards are turned off on this server (SIM_BOARDS_MAX=0)' : boardsBusyReason(config.simBoardsMax));
        return;
      }
      const board = Object.assign(attachBoard(ws, settings), { ws });
      open.add(board);
      counted();
      void board.ended.then(() => {
        open.delete(board);
        counted();
      });
    },
    close() {
      if (sweeper) clearInterval(sweeper);
      sweeper = null;
    },
  });
}
