import type { NextFunction, Request, Response } from 'express';
import { ZodError } from 'zod';
import { ERROR_CODES } from '@shared/api/errors.ts';
import {
  DatabaseUnavailableError,
  HttpError,
  MalformedJsonError,
  NotFoundError,
  PayloadTooLargeError,
  ValidationError,
  isDatabaseUnreachable,
  type FieldProblem,
} from '@server/errors/index.ts';

/** "members[0].email" from ['members', 0, 'email']. */
export function dottedPath(path: readonly PropertyKey[]): string {
  return path.reduce<string>((acc, key) => (typeof key === 'number' ? `${acc}[${key}]` : acc ? `${acc}.${String(key)}` : String(key)), '');
}

export function fieldsOf(error: ZodError): FieldProblem[] {
  return error.issues.map((issue) => ({ path: dottedPath(issue.path) || '(body)', message: issue.message }));
}

type BodyParserError = Error & { type?: string; status?: number; expose?: boolean };

/** Turns what body-parser, zod and our services throw into an HttpError. */
function toHttpError(error: unknown): HttpError | null {
  if (error instanceof HttpError) return error;
  if (error instanceof ZodError) return new ValidationError('Some fields are not valid', fieldsOf(error));
  const e = error as BodyParserError;
  if (e?.type === 'entity.parse.failed') return new MalformedJsonError();
  if (e?.type === 'entity.too.large') return new PayloadTooLargeError();
  if (error instanceof URIError) {
    return new ValidationError('The address is not valid', [{ path: '(path)', message: 'The address contains a broken percent-encoding' }]);
  }
  if (isDatabaseUnreachable(error)) return new DatabaseUnavailableError();
  if (e?.expose && typeof e.status === 'number' && e.status >= 400 && e.status < 500) {
    return new ValidationError(`The request could not be read: ${e.message}`, [{ path: '(body)', message: e.message }]);
  }
  return null;
}

/**
 * The one error middleware: known errors keep their status and code; a lost database connection
 * is a 503 (logged, no details); anything else is a 500 without details.
 */
export function errorHandler(error: unknown, req: Request, res: Response, _next: NextFunction): void {
  const known = toHttpError(error);
  if (res.headersSent) {
    res.end();
    return;
  }
  if (known) {
    if (known instanceof DatabaseUnavailableError) console.error(`[api] ${req.method} ${req.originalUrl}: the database is not reachable (${(error as Error).message})`);
    res.status(known.status).json(known.toBody());
    return;
  }
  console.error(`[api] ${req.method} ${req.originalUrl} failed:`, error);
  res.status(500).json({ error: { code: ERROR_CODES.internal, message: 'Something went wrong on the server; it has been logged.' } });
}

export function apiNotFound(req: Request, _res: Response, next: NextFunction): void {
  next(new NotFoundError(`No API route ${req.method} ${req.path}`));
}
