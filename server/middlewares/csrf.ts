import type { NextFunction, Request, Response } from 'express';
import { csrfSync } from 'csrf-sync';
import { CsrfError } from '@server/errors/index.ts';

/**
 * Synchronizer-token CSRF protection: the token lives in the session, clients send it in
 * the `x-csrf-token` header on every state-changing request (GET /api/auth/csrf hands it out).
 */
export function createCsrf() {
  const { generateToken, isRequestValid } = csrfSync({
    getTokenFromRequest: (req) => {
      const header = req.headers['x-csrf-token'];
      return typeof header === 'string' ? header : undefined;
    },
  });
  const SAFE = new Set(['GET', 'HEAD', 'OPTIONS']);
  const protect = (req: Request, _res: Response, next: NextFunction) => {
    next(SAFE.has(req.method) || isRequestValid(req) ? undefined : new CsrfError());
  };
  return { protect, generateToken };
}
