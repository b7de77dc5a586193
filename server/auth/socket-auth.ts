import { ServerResponse, type IncomingMessage } from 'node:http';
import type { RequestHandler } from 'express';
import type { UpgradeAuthenticator } from '../sockets/upgrade';
import { bearerTokenOf, userOfToken } from './bearer';

type Middleware = (req: IncomingMessage, res: ServerResponse, next: (err?: unknown) => void) => void;

const run = (mw: Middleware, req: IncomingMessage, res: ServerResponse) =>
  new Promise<void>((resolve, reject) => mw(req, res, (err) => (err ? reject(err) : resolve())));

/**
 * Who a WebSocket upgrade comes from: an `Authorization: Bearer` API token (the runner, a
 * station), else the sign-in cookie read through the very session middleware and Passport the app
 * uses, so a signed-out, expired or disabled account is refused the same way as on any request.
 * The response handed to the middleware is never sent: the upgrade answers on the raw socket.
 */
export function upgradeAuthenticator(sessions: RequestHandler, passportMiddleware: RequestHandler[]): UpgradeAuthenticator {
  const chain = [sessions, ...passportMiddleware] as unknown as Middleware[];
  return async (req) => {
    const secret = bearerTokenOf(req.headers.authorization);
    if (secret !== null) return { user: await userOfToken(secret), via: 'token' };
    const res = new ServerResponse(req);
    for (const mw of chain) await run(mw, req, res);
    const user = (req as IncomingMessage & { user?: Express.User }).user;
    return user ? { user, via: 'session' } : undefined;
  };
}
