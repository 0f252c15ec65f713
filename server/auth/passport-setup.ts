import type { Request } from 'express';
import passport from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import type { UserService } from '../services/user.service';

/** One message for unknown e-mail and wrong password, so accounts cannot be enumerated. */
export const SIGN_IN_FAILED_MESSAGE = 'E-mail or password is not right, or the account is not active.';

/**
 * A passport instance of our own (not the global singleton), so several apps can run in
 * one test process. Only the user id is kept in the session.
 */
export function createPassport(users: UserService) {
  const instance = new passport.Passport();
  instance.use(
    new LocalStrategy({ usernameField: 'email', passwordField: 'password' }, (email, password, done) => {
      users
        .authenticate(email, password)
        .then((user) => done(null, user ?? false, user ? undefined : { message: SIGN_IN_FAILED_MESSAGE }))
        .catch((error: unknown) => done(error));
    }),
  );
  instance.serializeUser((user, done) => done(null, user.id));
  instance.deserializeUser<number, Request>((req, id, done) => {
    users
      .findSessionPrincipal(id)
      .then((principal) => {
        // Read with the user in the same statement, for the second-factor gate that runs next.
        req.secondFactorEnabledAt = principal?.secondFactorEnabledAt;
        // An unknown or deactivated user yields `false`: passport then drops the login.
        done(null, principal?.user ?? false);
      })
      .catch((error: unknown) => done(error));
  });
  return instance;
}

/** The passport instance type the routes receive. */
export type PassportInstance = ReturnType<typeof createPassport>;
