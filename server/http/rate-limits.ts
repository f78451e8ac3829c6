/**
 * The rate limits of the public endpoints (sign-in, password reset, one-time links), per 15 minutes.
 * Counters live in this process's memory: with N API processes behind a load balancer a client
 * that is spread over all of them gets up to N times the limit (README, "Production").
 */
import type { Request, RequestHandler } from 'express';
import { ipKeyGenerator, rateLimit } from 'express-rate-limit';
import type { Config } from '../config';

const WINDOW_MS = 15 * 60 * 1000;

export type LimitConfig = Pick<Config, 'SIGN_IN_LIMIT' | 'SIGN_IN_ADDRESS_LIMIT' | 'RESET_LIMIT'>;

/** The client's address; IPv6 by its /56, which one subscriber usually holds whole. */
const address = (req: Request) => ipKeyGenerator(req.ip ?? '');
/** The address and the e-mail (or one-time token) the request is about. */
const addressAnd = (req: Request) =>
  `${address(req)}|${String(req.body?.email ?? req.params?.token ?? '').toLowerCase()}`;

function limiter(
  limit: number,
  key: (req: Request) => string,
  message: string,
  options: { failuresOnly?: boolean } = {},
): RequestHandler {
  return rateLimit({
    windowMs: WINDOW_MS,
    limit,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    keyGenerator: key,
    // a success is taken back when its answer is < 400, so a user who signs in often is never locked out
    skipSuccessfulRequests: options.failuresOnly ?? false,
    handler: (_req, res) => {
      res.status(429).json({ error: { code: 'too_many_attempts', message } });
    },
  });
}

const SIGN_IN_MESSAGE = 'Too many sign-in attempts. Wait 15 minutes and try again.';

/**
 * Sign-in: failed attempts per address and e-mail (guessing one account's password), then per
 * address across every e-mail (one password tried on many accounts). The account's limiter runs
 * first so that a request it refuses does not count against the whole address as well.
 */
export function signInLimiters(config: LimitConfig): RequestHandler[] {
  return [
    limiter(config.SIGN_IN_LIMIT, addressAnd, SIGN_IN_MESSAGE, { failuresOnly: true }),
    limiter(config.SIGN_IN_ADDRESS_LIMIT, address, SIGN_IN_MESSAGE, { failuresOnly: true }),
  ];
}

/** The one-time links (reset, invitation): per address and e-mail or token, like sign-in. */
export function oneTimeLinkLimiter(config: LimitConfig): RequestHandler {
  return limiter(config.SIGN_IN_LIMIT, addressAnd, 'Too many attempts. Wait 15 minutes and try again.');
}

/**
 * Password-reset e-mails per address, whatever addresses they go to: the answer is always 200 (it
 * must not tell whether an account exists), so every request counts.
 */
export function resetRequestLimiter(config: LimitConfig): RequestHandler {
  return limiter(config.RESET_LIMIT, address, 'Too many password-reset requests. Wait 15 minutes and try again.');
}
