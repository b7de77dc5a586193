import type { Express } from 'express';
import session from 'express-session';
import type { Config } from '../config';
import { bearerAuth } from './bearer';
import { csrfGuard } from './csrf';
import { createPassport } from './passport';
import { SignInStore } from './sign-in-store';
import { upgradeAuthenticator } from './socket-auth';
import './types';

export { requireRole, currentUser, hasRole } from './guards';
export { csrfTokenOf } from './csrf';

/**
 * Sign-in cookie (kept in the database), Passport, bearer tokens and the CSRF guard, in that
 * order: the guard must know whether the caller came with a token. Returns the Passport instance
 * for the sign-in route, and how WebSocket upgrades (which pass no Express middleware) learn who
 * they come from.
 */
export function installAuth(app: Express, config: Config) {
  const sessions = session({
    name: 'anglebench.sid',
    secret: config.sessionSecret,
    store: new SignInStore(),
    resave: false,
    saveUninitialized: false,
    cookie: {
      httpOnly: true,
      sameSite: 'lax',
      // 'auto': Secure whenever the request came over HTTPS, directly or through a trusted
      // proxy (req.secure, TRUST_PROXY); plain http on localhost keeps working.
      secure: 'auto',
      maxAge: 7 * 24 * 60 * 60 * 1000,
    },
  });
  app.use(sessions);
  const passport = createPassport();
  const passportMiddleware = [passport.initialize(), passport.session()];
  app.use(passportMiddleware);
  app.use((req, _res, next) => {
    if (req.user) req.authVia = 'session';
    next();
  });
  app.use(bearerAuth);
  app.use('/api', csrfGuard);
  return { passport, authenticateUpgrade: upgradeAuthenticator(sessions, passportMiddleware) };
}
