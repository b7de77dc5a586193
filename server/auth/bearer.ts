import type { RequestHandler } from 'express';
import { ApiToken, User } from '../db/models';
import { HttpError } from '../http-error';
import { sha256Hex } from './tokens';

/**
 * `Authorization: Bearer <token>` for the runner and CI: the token's SHA-256 is looked up, its
 * owner becomes req.user for this request only, and lastUsedAt is stamped.
 */
export const bearerAuth: RequestHandler = async (req, _res, next) => {
  const header = req.get('authorization');
  if (!header) return next();
  const match = /^Bearer\s+(\S+)$/i.exec(header);
  if (!match) throw new HttpError(401, 'bad_token', 'The Authorization header must be "Bearer <token>"');
  const token = await ApiToken.findOne({ where: { tokenHash: sha256Hex(match[1]) }, include: [{ model: User, as: 'user' }] });
  if (!token?.user) throw new HttpError(401, 'bad_token', 'Unknown or revoked API token');
  if (token.user.disabled) throw new HttpError(403, 'disabled', 'This account is disabled');
  await token.update({ lastUsedAt: new Date() });
  req.user = token.user;
  req.authVia = 'token';
  next();
};
