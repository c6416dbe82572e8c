import type { Request } from 'express';
import { ipKeyGenerator, rateLimit } from 'express-rate-limit';
import { RateLimitedError } from '@server/errors/index.ts';

/** How many attempts each limited route allows per window. */
export interface RateLimitSettings {
  windowMs: number;
  /** Failed sign-ins per address and e-mail. */
  signInFailures: number;
  /** Reset requests per address. */
  resetRequests: number;
  /** Invitations created per administrator, and invite lookups/acceptances per address. */
  invites: number;
}

export const DEFAULT_RATE_LIMITS: RateLimitSettings = { windowMs: 15 * 60_000, signInFailures: 10, resetRequests: 10, invites: 50 };

const emailOf = (req: Request) => (typeof req.body?.email === 'string' ? req.body.email.toLowerCase().trim() : '');
const ipOf = (req: Request) => ipKeyGenerator(req.ip ?? 'unknown');

function limiter(windowMs: number, limit: number, key: (req: Request) => string, skipSuccessfulRequests = false) {
  return rateLimit({
    windowMs,
    limit,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    skipSuccessfulRequests,
    keyGenerator: key,
    handler: (_req, _res, next) => next(new RateLimitedError()),
  });
}

export function createRateLimits(settings: RateLimitSettings) {
  return {
    signIn: limiter(settings.windowMs, settings.signInFailures, (req) => `${ipOf(req)}|${emailOf(req)}`, true),
    passwordReset: limiter(settings.windowMs, settings.resetRequests, ipOf),
    invites: limiter(settings.windowMs, settings.invites, (req) => req.user?.id ?? ipOf(req)),
  };
}
export type RateLimits = ReturnType<typeof createRateLimits>;
