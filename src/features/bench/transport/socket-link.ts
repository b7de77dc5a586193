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
      // The page's CSP lets it reach its own server and the BRIDGE_ORIGINS only; a blocked
      // address fails like an unreachable one, so say which it was.
      const onViolation = (e: SecurityPolicyViolationEvent) => {
        if (e.effectiveDirective !== 'connect-src' || !e.blockedURI.startsWith(new URL(url).origin)) return;
        settle();
        socket.close();
        reject(new Error(`This server does not let the page connect to ${new URL(url).origin}: an administrator can add it to BRIDGE_ORIGINS`));
      };
      document.addEventListener('securitypolicyviolation', onViolation);
      const settle = () => {
        clearTimeout(timer);
        document.removeEventListener('securitypolicyviolation', onViolation);
      };
      const timer = setTimeout(() => {
        settle();
        socket.close();
        reject(new Error(`No answer from ${url} within ${timeoutMs / 1000} s`));
      }, timeoutMs);
      const opened = () => {
        settle();
        socket.removeEventListener('message', onMessage);
        resolve(new SocketLink(socket));
      };
      const onMessage = (e: MessageEvent) => {
        if (typeof e.data === 'string' && ready?.(e.data)) opened();
      };
      if (ready) socket.addEventListener('message', onMessage);
      else socket.addEventListener('open', opened);
      socket.addEventListener('close', (e) => {
        settle();
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
