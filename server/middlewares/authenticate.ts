import type { NextFunction, Request, Response } from 'express';
import passport from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import type { DataSource } from 'typeorm';
import { UserEntity } from '@server/entities/user.entity.ts';
import { UnauthenticatedError } from '@server/errors/index.ts';
import { verifyCredentials } from '@server/services/auth/verify-credentials.ts';

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    // eslint-disable-next-line @typescript-eslint/no-empty-object-type
    interface User extends UserEntity {}
  }
}

/** A passport instance for one app: local (e-mail + password) strategy, sessions hold the user id. */
export function createPassport(dataSource: DataSource): passport.PassportStatic {
  const instance = new passport.Passport() as passport.PassportStatic;
  instance.use(
    new LocalStrategy({ usernameField: 'email', passwordField: 'password', session: true }, (email, password, done) => {
      verifyCredentials(dataSource.manager, email, password).then(
        (user) => done(null, user ?? false),
        (error: Error) => done(error),
      );
    }),
  );
  instance.serializeUser((user, done) => done(null, user.id));
  instance.deserializeUser((id: string, done) => {
    dataSource.manager.findOne(UserEntity, { where: { id, active: true } }).then(
      (user) => done(null, user ?? false),
      (error: Error) => done(error),
    );
  });
  return instance;
}

/** Runs the local strategy and resolves with the user (or null for wrong credentials). */
export function authenticateLocal(instance: passport.PassportStatic, req: Request, res: Response): Promise<UserEntity | null> {
  return new Promise((resolve, reject) => {
    const middleware = instance.authenticate('local', { session: false }, (error: Error | null, user: UserEntity | false) => {
      if (error) reject(error);
      else resolve(user || null);
    }) as (req: Request, res: Response, next: NextFunction) => void;
    middleware(req, res, reject);
  });
}

/** Starts a signed-in session (new session id; the CSRF token carries over). */
export function logIn(req: Request, user: UserEntity): Promise<void> {
  return new Promise((resolve, reject) => req.login(user, { session: true, keepSessionInfo: true }, (error) => (error ? reject(error) : resolve())));
}

export function logOut(req: Request): Promise<void> {
  return new Promise((resolve, reject) => req.logout({ keepSessionInfo: true }, (error) => (error ? reject(error) : resolve())));
}

/** Refuses the request with 401 unless someone is signed in. */
export function requireUser(req: Request, _res: Response, next: NextFunction): void {
  next(req.user ? undefined : new UnauthenticatedError());
}

/** The signed-in user (after requireUser). */
export function currentUser(req: Request): UserEntity {
  if (!req.user) throw new UnauthenticatedError();
  return req.user;
}
