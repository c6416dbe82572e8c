import { ERROR_CODES } from '@shared/api/errors.ts';
import { HttpError } from './http.error.ts';

/** 503: the database could not be reached (stopped, restarting, network down); the request changed nothing. */
export class DatabaseUnavailableError extends HttpError {
  constructor(message = 'The database is not reachable; nothing was saved. Try again in a moment.') {
    super(503, ERROR_CODES.databaseUnavailable, message);
  }
}

/** Socket errors of a connection that could not be made or was cut. */
const NETWORK_CODES = new Set([
  'ECONNREFUSED',
  'ECONNRESET',
  'ETIMEDOUT',
  'EPIPE',
  'EHOSTUNREACH',
  'ENETUNREACH',
  'ENOTFOUND',
  'EAI_AGAIN',
]);

/**
 * PostgreSQL SQLSTATEs that mean the server is going away or not accepting connections
 * (class 08 connection exception; 57P01–57P03 shutdown and start-up).
 */
const SERVER_GONE_STATES = new Set(['57P01', '57P02', '57P03', '08000', '08001', '08003', '08004', '08006']);

/** What node-postgres says when the socket closes under a client or a connection times out (it sets no code then). */
const CUT_CONNECTION = /^Connection terminated|connection timeout|timeout exceeded when trying to connect|Client has encountered a connection error/i;

type ErrorLike = {
  code?: unknown;
  message?: unknown;
  driverError?: unknown;
  cause?: unknown;
  errors?: unknown;
  $metadata?: unknown;
};

/**
 * True when `error` (or the driver error TypeORM wraps, or an error it was caused by) says the
 * database connection failed rather than the query. File storage errors (they carry the AWS
 * SDK's `$metadata`) are not database errors and are left to their own handling.
 */
export function isDatabaseUnreachable(error: unknown, depth = 0): boolean {
  if (!error || typeof error !== 'object' || depth > 4) return false;
  const e = error as ErrorLike;
  if (e.$metadata !== undefined) return false;
  if (typeof e.code === 'string' && (NETWORK_CODES.has(e.code) || SERVER_GONE_STATES.has(e.code)))
    return true;
  if (typeof e.message === 'string' && CUT_CONNECTION.test(e.message)) return true;
  const inner = [e.driverError, e.cause, ...(Array.isArray(e.errors) ? e.errors : [])];
  return inner.some((next) => isDatabaseUnreachable(next, depth + 1));
}
