import type { Request, RequestHandler } from 'express';
import { rateLimit, type Options, type RateLimitInfo } from 'express-rate-limit';
import type { Config } from '../config';
import { HttpProblem } from '../http/problem';

function tooManyAttempts(retryAfterSeconds: number, what: string): HttpProblem {
  return new HttpProblem(
    429,
    'Too many sign-in attempts',
    `Too many sign-in attempts ${what}; try again in ${retryAfterSeconds} s.`,
    [],
    { 'Retry-After': String(retryAfterSeconds) },
  );
}

function limiter(config: Config, limit: number, what: string, extra: Partial<Options>): RequestHandler {
  return rateLimit({
    windowMs: config.signInLimit.windowMs,
    limit,
    standardHeaders: 'draft-7',
    legacyHeaders: false,
    handler: (req, _res, next) => {
      const reset = (req as Request & { rateLimit?: RateLimitInfo }).rateLimit?.resetTime?.getTime() ?? Date.now() + config.signInLimit.windowMs;
      next(tooManyAttempts(Math.max(1, Math.ceil((reset - Date.now()) / 1000)), what));
    },
    ...extra,
  });
}

/**
 * Two limits on sign-in: every attempt from one address, and failed attempts on one account
 * (so a guessing run against one account stops even when it comes from many addresses).
 */
export function signInLimits(config: Config): RequestHandler[] {
  return [
    limiter(config, config.signInLimit.perAddress, 'from this address', {}),
    limiter(config, config.signInLimit.perAccount, 'for this account', {
      skipSuccessfulRequests: true,
      keyGenerator: (req) => {
        const email = (req.body as { email?: unknown } | undefined)?.email;
        return `account:${typeof email === 'string' ? email.trim().toLowerCase().slice(0, 254) : ''}`;
      },
    }),
  ];
}
