import { ByteLinkBase, LinkClosedError } from '../../../../shared/link-engine/byte-link';

/**
 * The simulated board or a bench bridge over WebSocket: each binary message carries raw line
 * bytes in either direction, with no alignment to frames.
 */
export class SocketLink extends ByteLinkBase {

  private constructor(private readonly socket: WebSocket) {
    super();
    socket.binaryType = 'arraybuffer';
    socket.addEventListener('message', (e: MessageEvent) => {
      if (e.data instanceof ArrayBuffer) this.events.emitBytes(new Uint8Array(e.data));
    });
    socket.addEventListener('close', (e: CloseEvent) =>
      this.events.emitClose({
        requested: this.requested,
        message: this.requested ? 'Closed by the host' : `The connection closed${e.reason ? `: ${e.reason}` : ` (code ${e.code})`}`,
      }),
    );
  }

  private requested = false;

  /**
   * Connect to `url` (a bridge token goes in its query string); reject with a plain reason. With
   * `ready`, the link opens only once a text message passes it (a station's relay says when the
   * station is this browser's), so a refusal arrives as its close reason.
   */
  static open(url: string, timeoutMs = 5000, ready?: (text: string) => boolean): Promise<SocketLink> {
    return new Promise((resolve, reject) => {
      let socket: WebSocket;
      try {
        socket = new WebSocket(url);
      } catch (err) {
        reject(new Error(`Not a WebSocket address: ${url} (${(err as Error).message})`));
        return;
      }
      const timer = setTimeout(() => {
        socket.close();
        reject(new Error(`No answer from ${url} within ${timeoutMs / 1000} s`));
      }, timeoutMs);
      const opened = () => {
        clearTimeout(timer);
        socket.removeEventListener('message', onMessage);
        resolve(new SocketLink(socket));
      };
      const onMessage = (e: MessageEvent) => {
        if (typeof e.data === 'string' && ready?.(e.data)) opened();
      };
      if (ready) socket.addEventListener('message', onMessage);
      else socket.addEventListener('open', opened);
      socket.addEventListener('close', (e) => {
        clearTimeout(timer);
        reject(new Error(`Could not connect to ${url}${e.reason ? `: ${e.reason}` : ''}`));
      });
    });
  }


  async write(bytes: Uint8Array): Promise<void> {
    if (this.closed || this.socket.readyState !== WebSocket.OPEN) throw new LinkClosedError();
    this.socket.send(bytes);
  }

  close(): Promise<void> {
    if (this.closed) return Promise.resolve();
    this.requested = true;
    return new Promise((resolve) => {
      this.onClose(() => resolve());
      this.socket.close(1000, 'host closed');
    });
  }
}
