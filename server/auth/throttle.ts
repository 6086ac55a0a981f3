// Password guessing is limited two ways (OWASP ASVS 5.0 6.3.1): per address (express-rate-limit,
// failed attempts only, in the routes) and per account across addresses, here. The per-account
// limit slows rather than locks out, so an attacker cannot lock the real person out: after a few
// free failures each further attempt on that account must wait after the last failure, 1 s, then
// 2 s, 4 s … up to a minute. At most about 60 guesses an hour reach the password check of one
// account, whatever the number of addresses. A success clears the account's count.
import type { RequestHandler } from 'express';
import { sendProblem } from '../middleware/error-handler';

export interface AccountThrottleOptions {
  /** Failures allowed at full speed within the window. */
  freeFailures: number;
  /** Failures older than this (since the last one) are forgotten. */
  windowMs: number;
  maxDelayMs: number;
  /** Accounts remembered at once; the least recently failed are forgotten first. */
  maxEntries: number;
  now?: () => number;
}

export const ACCOUNT_THROTTLE: AccountThrottleOptions = { freeFailures: 5, windowMs: 15 * 60_000, maxDelayMs: 60_000, maxEntries: 50_000 };

export function accountThrottle(opts: AccountThrottleOptions) {
  const now = opts.now ?? (() => Date.now());
  const entries = new Map<string, { failures: number; lastAt: number }>();

  function current(key: string) {
    const e = entries.get(key);
    if (e && now() - e.lastAt > opts.windowMs) {
      entries.delete(key);
      return undefined;
    }
    return e;
  }

  return {
    /** Milliseconds before the next attempt on this account is heard, or 0. */
    waitMs(key: string): number {
      const e = current(key);
      if (!e || e.failures < opts.freeFailures) return 0;
      const delay = Math.min(1000 * 2 ** (e.failures - opts.freeFailures), opts.maxDelayMs);
      return Math.max(0, e.lastAt + delay - now());
    },
    failed(key: string) {
      const e = current(key);
      entries.delete(key);
      entries.set(key, { failures: (e?.failures ?? 0) + 1, lastAt: now() });
      if (entries.size > opts.maxEntries) entries.delete(entries.keys().next().value!);
    },
    succeeded(key: string) {
      entries.delete(key);
    },
  };
}
export type AccountThrottle = ReturnType<typeof accountThrottle>;

/**
 * Refuses an attempt on an account that must wait (429, Retry-After, problem+json) before any
 * password is checked; afterwards counts a 401 as a failure and a success as clearing the count.
 */
export function throttleAccount(throttle: AccountThrottle, keyOf: (req: Parameters<RequestHandler>[0]) => string): RequestHandler {
  return (req, res, next) => {
    const key = keyOf(req);
    const wait = throttle.waitMs(key);
    if (wait > 0) {
      const seconds = Math.ceil(wait / 1000);
      res.set('Retry-After', String(seconds));
      return sendProblem(
        res,
        429,
        'too-many-attempts',
        `Too many wrong passwords for this account. Wait ${seconds} second${seconds === 1 ? '' : 's'} and try again.`,
        { retryAfterSeconds: seconds },
      );
    }
    res.on('finish', () => {
      if (res.statusCode === 401) throttle.failed(key);
      else if (res.statusCode < 400) throttle.succeeded(key);
    });
    next();
  };
}
