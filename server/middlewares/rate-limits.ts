import type { Request } from 'express';
import { ipKeyGenerator, rateLimit } from 'express-rate-limit';
import type { DataSource } from 'typeorm';
import { RateLimitedError } from '@server/errors/index.ts';
import { PostgresRateLimitStore } from './postgres-rate-limit-store.ts';

/** How many attempts each limited route allows per window. */
export interface RateLimitSettings {
  windowMs: number;
  /** Failed sign-ins per address and e-mail. */
  signInFailures: number;
  /** Reset requests per address. */
  resetRequests: number;
  /** Invitations created per administrator, and invite lookups/acceptances per address. */
  invites: number;
  /**
   * Names this set of counters in the shared table: instances with the same namespace count
   * together (the default ""); a test app gets its own so its limits start from zero.
   */
  namespace: string;
}

export const DEFAULT_RATE_LIMITS: RateLimitSettings = { windowMs: 15 * 60_000, signInFailures: 10, resetRequests: 10, invites: 50, namespace: '' };

const emailOf = (req: Request) => (typeof req.body?.email === 'string' ? req.body.email.toLowerCase().trim() : '');
const ipOf = (req: Request) => ipKeyGenerator(req.ip ?? 'unknown');

function limiter(store: PostgresRateLimitStore, windowMs: number, limit: number, key: (req: Request) => string, skipSuccessfulRequests = false) {
  return rateLimit({
    store,
    windowMs,
    limit,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    skipSuccessfulRequests,
    keyGenerator: key,
    handler: (_req, _res, next) => next(new RateLimitedError()),
  });
}

/** The limited routes' middlewares, counting in PostgreSQL so the limits hold across instances. */
export function createRateLimits(dataSource: DataSource, settings: RateLimitSettings) {
  const store = (name: string) => new PostgresRateLimitStore(dataSource, settings.namespace ? `${settings.namespace}:${name}` : name);
  return {
    signIn: limiter(store('sign-in'), settings.windowMs, settings.signInFailures, (req) => `${ipOf(req)}|${emailOf(req)}`, true),
    passwordReset: limiter(store('password-reset'), settings.windowMs, settings.resetRequests, ipOf),
    invites: limiter(store('invites'), settings.windowMs, settings.invites, (req) => req.user?.id ?? ipOf(req)),
  };
}
export type RateLimits = ReturnType<typeof createRateLimits>;
