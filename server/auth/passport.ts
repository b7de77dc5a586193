import passport from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import { User } from '../db/models';
import { verifyPassword } from './passwords';

/**
 * A Passport instance of the app's own (not the module's global one, so two apps in one test
 * process do not share strategies). The sign-in session holds only the user id; every request
 * reloads the user, so a role change or a disabled account takes effect at once.
 */
export function createPassport() {
  const p = new passport.Passport();
  p.use(
    new LocalStrategy({ usernameField: 'email', passwordField: 'password' }, (email, password, done) => {
      User.findOne({ where: { email: email.toLowerCase() } })
        .then(async (user) => {
          const ok = await verifyPassword(password, user?.passwordHash);
          if (!user || !ok) return done(null, false, { message: 'bad_credentials' });
          if (user.disabled) return done(null, false, { message: 'disabled' });
          return done(null, user);
        })
        .catch(done);
    }),
  );
  p.serializeUser((user, done) => done(null, user.id));
  p.deserializeUser((id: number, done) => {
    User.findByPk(id)
      .then((user) => done(null, user && !user.disabled ? user : false))
      .catch(done);
  });
  return p;
}
