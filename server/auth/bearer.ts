import type { RequestHandler } from 'express';
import { ApiToken, User } from '../db/models';
import { HttpError } from '../http-error';
import { sha256Hex } from './tokens';

/** The token in an `Authorization: Bearer <token>` header; null without the header. */
export function bearerTokenOf(header: string | undefined): string | null {
  if (!header) return null;
  const match = /^Bearer\s+(\S+)$/i.exec(header);
  if (!match) throw new HttpError(401, 'bad_token', 'The Authorization header must be "Bearer <token>"');
  return match[1];
}

/**
 * The owner of an API token: its SHA-256 is looked up and lastUsedAt stamped. 401 for an
 * unknown or revoked token, 403 for a disabled account.
 */
export async function userOfToken(secret: string): Promise<User> {
  const token = await ApiToken.findOne({ where: { tokenHash: sha256Hex(secret) }, include: [{ model: User, as: 'user' }] });
  if (!token?.user) throw new HttpError(401, 'bad_token', 'Unknown or revoked API token');
  if (token.user.disabled) throw new HttpError(403, 'disabled', 'This account is disabled');
  await token.update({ lastUsedAt: new Date() });
  return token.user;
}

/**
 * `Authorization: Bearer <token>` for the runner and CI: the token's owner becomes req.user for
 * this request only.
 */
export const bearerAuth: RequestHandler = async (req, _res, next) => {
  const secret = bearerTokenOf(req.get('authorization'));
  if (secret === null) return next();
  req.user = await userOfToken(secret);
  req.authVia = 'token';
  next();
};
