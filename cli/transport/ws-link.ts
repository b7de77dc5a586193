import WebSocket, { type ClientOptions } from 'ws';
import { ByteLinkBase, LinkClosedError } from '../../shared/link-engine/byte-link';

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
   * server-hosted board needs: an Authorization header, a lab's own certificate authority.
   */
  static open(url: string, timeoutMs = 5000, options: Pick<ClientOptions, 'headers' | 'ca'> = {}): Promise<NodeSocketLink> {
    return new Promise((resolve, reject) => {
      const ws = new WebSocket(url, { ...options, handshakeTimeout: timeoutMs });
      const fail = (why: string) => reject(new Error(`Cannot connect to ${url}: ${why}`));
      ws.once('error', (err) => fail(err.message || 'connection failed'));
      // A refused upgrade (401, 403, 404…) says why in its JSON body: show that, not just the code.
      ws.once('unexpected-response', (req, res) => {
        let body = '';
        res.setEncoding('utf8');
        res.on('data', (chunk: string) => (body += chunk.slice(0, 2000)));
        res.on('end', () => {
          let message = '';
          try {
            message = (JSON.parse(body) as { error?: { message?: string } }).error?.message ?? '';
          } catch {
            // not the server's JSON: the status alone
          }
          fail(`${res.statusCode} ${res.statusMessage ?? ''}${message ? `: ${message}` : ''}`.trim());
          req.destroy();
        });
      });
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
