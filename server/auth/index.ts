import type { Express } from 'express';
import session from 'express-session';
import type { Config } from '../config';
import { bearerAuth } from './bearer';
import { csrfGuard } from './csrf';
import { createPassport } from './passport';
import { SignInStore } from './sign-in-store';
import './types';

export { requireRole, currentUser, hasRole } from './guards';
export { csrfTokenOf } from './csrf';

/**
 * Sign-in cookie (kept in the database), Passport, bearer tokens and the CSRF guard, in that
 * order: the guard must know whether the caller came with a token. Returns the Passport instance
 * for the sign-in route.
 */
export function installAuth(app: Express, config: Config) {
  app.use(
    session({
      name: 'anglebench.sid',
      secret: config.sessionSecret,
      store: new SignInStore(),
      resave: false,
      saveUninitialized: false,
      cookie: {
        httpOnly: true,
        sameSite: 'lax',
        // 'auto' marks the cookie secure only on https requests, so plain http on localhost
        // keeps working in production mode.
        secure: config.nodeEnv === 'production' ? 'auto' : false,
        maxAge: 7 * 24 * 60 * 60 * 1000,
      },
    }),
  );
  const passport = createPassport();
  app.use(passport.initialize());
  app.use(passport.session());
  app.use((req, _res, next) => {
    if (req.user) req.authVia = 'session';
    next();
  });
  app.use(bearerAuth);
  app.use('/api', csrfGuard);
  return passport;
}
