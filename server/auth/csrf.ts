import { randomBytes } from 'node:crypto';
import type { Request, RequestHandler } from 'express';
import { HttpError } from '../http-error';
import { sameSecret } from './tokens';

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

/** The session's synchroniser token, made on first use. */
export function csrfTokenOf(req: Request): string {
  req.session.csrfToken ??= randomBytes(24).toString('base64url');
  return req.session.csrfToken;
}

/**
 * Refuse every state-changing request whose x-csrf-token header does not match the token kept
 * in the caller's session. A cookie rides along on forged cross-site requests; a header the
 * attacker cannot read does not. Bearer-token callers send no cookie, so they need no token.
 */
export const csrfGuard: RequestHandler = (req, _res, next) => {
  if (SAFE_METHODS.has(req.method) || req.authVia === 'token') return next();
  const sent = req.get('x-csrf-token');
  const kept = req.session?.csrfToken;
  if (!sent || !kept || !sameSecret(sent, kept)) {
    return next(new HttpError(403, 'csrf', 'Missing or stale x-csrf-token header: get one from GET /api/auth/csrf'));
  }
  next();
};
