import type { RequestHandler } from 'express';
import passport from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import type { Role } from '../../shared/contracts/roles';
import { hasAnyRole } from '../../shared/auth/access';
import type { Database } from '../db';
import { AppError, forbidden } from '../errors/app-error';
import type { SessionUserRecord } from '../repositories/users.repository';
import { loadSessionUser, verifyCredentials } from '../services/auth.service';

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    // eslint-disable-next-line @typescript-eslint/no-empty-object-type
    interface User extends SessionUserRecord {}
  }
}

/** A passport instance wired to our users: local e-mail + password, user id in the session. */
export function createPassport(db: Database): passport.PassportStatic {
  const instance = new passport.Passport() as unknown as passport.PassportStatic;
  instance.use(
    new LocalStrategy(
      { usernameField: 'email', passwordField: 'password' },
      (email, password, done) => {
        verifyCredentials(db, email, password).then(
          (user) => done(null, user ?? false),
          (err: unknown) => done(err),
        );
      },
    ),
  );
  instance.serializeUser((user, done) => done(null, user.id));
  instance.deserializeUser((id: string, done) => {
    // A member removed or disabled since signing in loses the session on the next request.
    loadSessionUser(db, id).then(
      (user) => done(null, user ?? false),
      (err: unknown) => done(err),
    );
  });
  return instance;
}

/** The signed-in user of a request; throws 401 when there is none. */
export function currentUser(req: { user?: Express.User }): SessionUserRecord {
  if (!req.user) throw new AppError(401, 'not_signed_in', 'Sign in first');
  return req.user;
}

/** Lets the request through only when someone is signed in (else 401). */
export const requireSignedIn: RequestHandler = (req, _res, next) => {
  currentUser(req);
  next();
};

/** Lets the request through only for a member holding one of `roles` (401 / 403 otherwise). */
export function requireRoles(...roles: Role[]): RequestHandler {
  return (req, _res, next) => {
    const user = currentUser(req);
    if (!hasAnyRole(user.roles, roles)) {
      throw forbidden(`This needs one of these roles: ${roles.join(', ')}`);
    }
    next();
  };
}
