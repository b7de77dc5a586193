import { Router } from 'express';
import { rateLimit, type Store } from 'express-rate-limit';
import type { createPassport } from '../auth/passport';
import { csrfTokenOf, requireRole } from '../auth';
import type { User } from '../db/models';
import { HttpError } from '../http-error';
import { validate } from '../middleware/validate';
import { csrfReply, currentReply, loginBody, loginReply, meReply } from '../../shared/contract/people';
import { reply } from './reply';

export interface LoginLimit {
  windowMs: number;
  /** Failed sign-ins allowed per address and window; successful ones do not count. */
  max: number;
}

/** /api/auth: the CSRF token, sign-in, sign-out, who am I and who is signed in. */
export function authRouter(passport: ReturnType<typeof createPassport>, limit: LoginLimit, store: Store) {
  const router = Router();
  const loginLimiter = rateLimit({
    windowMs: limit.windowMs,
    limit: limit.max,
    skipSuccessfulRequests: true,
    // Counted in the database: every server instance on it shares the limit.
    store,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    handler: (_req, _res, next) => next(new HttpError(429, 'too_many_attempts', 'Too many failed sign-ins; wait a while and try again')),
  });

  router.route('/csrf').get((req, res) => {
    reply(res, csrfReply, { token: csrfTokenOf(req) });
  });

  router.route('/login').post(loginLimiter, validate({ body: loginBody }), (req, res, next) => {
    passport.authenticate('local', (err: unknown, user: User | false, info?: { message?: string }) => {
      if (err) return next(err);
      if (!user && info?.message === 'disabled') return next(new HttpError(403, 'disabled', 'This account is disabled'));
      if (!user) return next(new HttpError(401, 'bad_credentials', 'Wrong e-mail or password'));
      // Passport regenerates the session here (a new id: no session fixation); the old CSRF
      // token goes with it, so the reply carries the new one.
      req.logIn(user, (loginErr) => {
        if (loginErr) return next(loginErr);
        reply(res, loginReply, { user: user.toPublic(), csrfToken: csrfTokenOf(req) });
      });
    })(req, res, next);
  });

  router.route('/logout').post((req, res, next) => {
    req.logOut((err) => {
      if (err) return next(err);
      req.session.destroy((destroyErr) => (destroyErr ? next(destroyErr) : res.status(204).end()));
    });
  });

  router.route('/me').get(requireRole('reviewer'), (req, res) => {
    reply(res, meReply, { user: req.user!.toPublic(), via: req.authVia! });
  });

  // The browser's question at every page load. Nobody signed in is an answer, not an error, so it
  // is 200 with null (a 401 would be logged in the browser's console); /me stays 401 for clients
  // that must be signed in.
  router.route('/current').get((req, res) => {
    reply(res, currentReply, { user: req.user ? req.user.toPublic() : null });
  });

  return router;
}
