import type { Request } from 'express';
import passport from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import { logSignInRefused, logSignInSucceeded } from '../logging/security-events';
import type { SignInAddressHash } from '../logging/sign-in-address-hash';
import type { UserService } from '../services/user.service';

/** One message for unknown e-mail and wrong password, so accounts cannot be enumerated. */
export const SIGN_IN_FAILED_MESSAGE = 'E-mail or password is not right, or the account is not active.';

/**
 * A passport instance of our own (not the global singleton), so several apps can run in
 * one test process. Only the user id is kept in the session. `hashAddress` turns a refused
 * sign-in's typed address into what the security log keeps of it.
 */
export function createPassport(users: UserService, hashAddress: SignInAddressHash) {
  const instance = new passport.Passport();
  instance.use(
    new LocalStrategy({ usernameField: 'email', passwordField: 'password', passReqToCallback: true }, (req, email, password, done) => {
      users
        .authenticate(email, password)
        .then((check) => {
          // The password step's security events (ASVS 5.0 §16.3.1); the answer is the same sentence whatever the reason.
          if ('user' in check) {
            logSignInSucceeded(req, check.user);
            return done(null, check.user);
          }
          logSignInRefused(req, { reason: check.refusal, accountId: check.accountId, emailHash: hashAddress(email) });
          done(null, false, { message: SIGN_IN_FAILED_MESSAGE });
        })
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
