import { Passport } from 'passport';
import type { PassportStatic } from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import type { AuthService } from './auth.service';
import { toSessionUser } from './auth.service';

/** A Passport instance per app (not the global one), so tests can run several apps side by side. */
export function createPassport(auth: AuthService): PassportStatic {
  const passport = new Passport() as PassportStatic;
  passport.use(
    new LocalStrategy({ usernameField: 'email', passwordField: 'password' }, (email, password, done) => {
      auth
        .verifyCredentials(email, password)
        .then((user) => done(null, user ? toSessionUser(user) : false))
        .catch(done);
    }),
  );
  passport.serializeUser((user, done) => done(null, user.id));
  passport.deserializeUser((id: string, done) => {
    auth
      .findUser(id)
      .then((user) => done(null, user ? toSessionUser(user) : false))
      .catch(done);
  });
  return passport;
}
