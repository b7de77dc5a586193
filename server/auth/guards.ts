import type { RequestHandler } from 'express';
import { ROLES, type Role } from '../db/models';
import { HttpError } from '../http-error';

const rank = (role: Role) => ROLES.indexOf(role);

/** True when `role` includes everything `needed` may do (admin ⊃ engineer ⊃ reviewer). */
export const hasRole = (role: Role, needed: Role) => rank(role) >= rank(needed);

/** 401 when nobody is signed in, 403 when the caller's role is below `needed`. */
export function requireRole(needed: Role): RequestHandler {
  return (req, _res, next) => {
    if (!req.user) return next(new HttpError(401, 'signed_out', 'Sign in first'));
    if (!hasRole(req.user.role, needed)) return next(new HttpError(403, 'forbidden', `This needs the ${needed} role`));
    next();
  };
}

/** The signed-in user, for handlers behind requireRole. */
export function currentUser(req: Express.Request): Express.User {
  if (!req.user) throw new HttpError(401, 'signed_out', 'Sign in first');
  return req.user;
}
