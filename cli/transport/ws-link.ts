import type { IncomingMessage } from 'node:http';
import WebSocket, { type ClientOptions } from 'ws';
import { ByteLinkBase, LinkClosedError } from '../../shared/link-engine/byte-link';

/** How to reach a WebSocket device: headers and TLS settings for wss, and what to wait for. */
export interface SocketOpenOptions extends Pick<ClientOptions, 'headers' | 'ca' | 'rejectUnauthorized' | 'maxPayload'> {
  /** Open only once a text message passes this test (a station's relay says when it is ready). */
  ready?: (text: string) => boolean;
}

/**
 * A refused upgrade (401, 403, 404…) in one line: its status, and the reason its JSON body gives,
 * e.g. "401 Unauthorized: Unknown or revoked API token".
 */
export function upgradeRefusal(res: IncomingMessage): Promise<string> {
  const status = `${res.statusCode} ${res.statusMessage ?? ''}`.trim();
  return new Promise((resolve) => {
    let body = '';
    res.setEncoding('utf8');
    res.on('data', (d: string) => (body = (body + d).slice(0, 2000)));
    res.on('error', () => resolve(status));
    res.on('end', () => {
      let message = '';
      try {
        message = (JSON.parse(body) as { error?: { message?: string } }).error?.message ?? '';
      } catch {
        // not the server's JSON: the status alone
      }
      resolve(`${status}${message ? `: ${message}` : ''}`);
    });
  });
}

/** A WebSocket device (the simulated board or a bench bridge) from Node, as a ByteLink. */
export class NodeSocketLink extends ByteLinkBase {
  private requested = false;

  private constructor(private readonly ws: WebSocket) {
    super();
    ws.on('message', (data: Buffer, isBinary: boolean) => {
      if (isBinary) this.events.emitBytes(new Uint8Array(data.buffer, data.byteOffset, data.byteLength));
    });
    ws.on('close', (code, reason) =>
      this.events.emitClose({
        requested: this.requested,
        message: this.requested ? 'Closed by the host' : `The device closed the connection${reason.length ? `: ${reason.toString()}` : ` (code ${code})`}`,
      }),
    );
    ws.on('error', () => undefined); // 'close' follows with the reason
  }

  /**
   * Connect; reject with a one-line reason (refused, busy, timed out). `options` carries what a
   * server-hosted board or a station needs: an Authorization header, a lab's own certificate
   * authority, and for a station the relay's ready note to wait for.
   */
  static open(url: string, timeoutMs = 5000, { ready, ...options }: SocketOpenOptions = {}): Promise<NodeSocketLink> {
    return new Promise((resolve, reject) => {
      const ws = new WebSocket(url, { ...options, handshakeTimeout: timeoutMs });
      const fail = (why: string) => reject(new Error(`Cannot connect to ${url}: ${why}`));
      ws.once('error', (err) => fail(err.message || 'connection failed'));
      ws.once('unexpected-response', (req, res) => {
        // Read the refusal before ending the socket, so its reason wins over ws's own error.
        void upgradeRefusal(res).then((why) => {
          fail(why);
          req.destroy();
        });
      });
      if (ready) {
        const early = (code: number, reason: Buffer) => fail(reason.toString() || `closed with code ${code}`);
        const timer = setTimeout(() => {
          fail(`no answer within ${timeoutMs / 1000} s`);
          ws.terminate();
        }, timeoutMs);
        ws.once('close', early);
        const onMessage = (data: Buffer, isBinary: boolean) => {
          if (isBinary || !ready(data.toString())) return;
          clearTimeout(timer);
          ws.off('close', early);
          ws.off('message', onMessage);
          resolve(new NodeSocketLink(ws));
        };
        ws.on('message', onMessage);
        return;
      }
      ws.once('open', () => {
        // A busy device accepts the handshake and closes at once: wait a moment for that.
        const early = (code: number, reason: Buffer) => fail(reason.toString() || `closed with code ${code}`);
        ws.once('close', early);
        setTimeout(() => {
          ws.off('close', early);
          if (ws.readyState === WebSocket.OPEN) resolve(new NodeSocketLink(ws));
        }, 50);
      });
    });
  }


  write(bytes: Uint8Array): Promise<void> {
    if (this.closed || this.ws.readyState !== WebSocket.OPEN) return Promise.reject(new LinkClosedError());
    return new Promise((resolve, reject) => this.ws.send(bytes, { binary: true }, (err) => (err ? reject(err) : resolve())));
  }

  close(): Promise<void> {
    if (this.closed) return Promise.resolve();
    this.requested = true;
    return new Promise((resolve) => {
      this.onClose(() => resolve());
      this.ws.close(1000, 'host closed');
    });
  }
}
