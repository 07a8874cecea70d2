import type { Response } from 'express';
import { rateLimit } from 'express-rate-limit';
import { LIMITS } from '../../shared/limits';
import type { AccountRateLimits, AppContext, WindowLimit } from '../app-context';
import { ApiError } from '../http/api-error';

/** Limits sign-in, register and reset attempts per client address; over it, a 429 in our error shape. */
export function authRateLimit(context: AppContext) {
  return rateLimit({
    windowMs: context.config.authRateLimit.windowMs,
    limit: context.config.authRateLimit.limit,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    handler: (_request, response) => {
      const error = new ApiError(429, 'rate_limited', 'Too many attempts; wait a few minutes and try again');
      response.status(429).json(error.body());
    },
  });
}

/** The per-account limits in force: the server config's, else the defaults in LIMITS. */
export function accountRateLimits(context: AppContext): AccountRateLimits {
  return {
    signInFailures: LIMITS.signInFailuresPerAccount,
    passwordChecks: LIMITS.passwordChecksPerAccount,
    invitationMails: LIMITS.invitationMailsPerAddress,
    ...context.config.accountRateLimits,
  };
}

/**
 * Counts attempts per key (an e-mail address, an account, a studio and address) in fixed windows
 * on the server's clock, in memory. A key over its limit waits until its window ends.
 */
export class AttemptCounter {
  private readonly windows = new Map<string, { startMs: number; count: number }>();

  constructor(
    private readonly limit: WindowLimit,
    private readonly nowMs: () => number,
  ) {}

  /** Whole seconds until `key` may try again; 0 when it may try now. */
  retryAfterS(key: string): number {
    const window = this.current(key);
    if (!window || window.count < this.limit.limit) return 0;
    return Math.max(1, Math.ceil((window.startMs + this.limit.windowS * 1000 - this.nowMs()) / 1000));
  }

  /** Counts one attempt for `key`. */
  record(key: string): void {
    const window = this.current(key);
    if (window) window.count += 1;
    else {
      if (this.windows.size >= 10_000) this.prune();
      this.windows.set(key, { startMs: this.nowMs(), count: 1 });
    }
  }

  /** Forgets `key` (after a successful sign-in). */
  clear(key: string): void {
    this.windows.delete(key);
  }

  private current(key: string) {
    const window = this.windows.get(key);
    if (window && this.nowMs() - window.startMs >= this.limit.windowS * 1000) {
      this.windows.delete(key);
      return undefined;
    }
    return window;
  }

  private prune(): void {
    for (const key of [...this.windows.keys()]) this.current(key);
  }
}

/** A counter on the server's clock for one of the per-account limits. */
export function accountCounter(context: AppContext, which: keyof AccountRateLimits): AttemptCounter {
  return new AttemptCounter(accountRateLimits(context)[which], () => context.clock().getTime());
}

/** Minutes (or seconds, under one minute) in plain words. */
function waitText(seconds: number): string {
  if (seconds < 60) return `${seconds} second${seconds === 1 ? '' : 's'}`;
  const minutes = Math.ceil(seconds / 60);
  return `${minutes} minute${minutes === 1 ? '' : 's'}`;
}

/** A 429 with Retry-After: `what` says what was limited, in plain words. */
export function tooManyAttempts(response: Response, retryAfterS: number, what: string, field?: string): ApiError {
  response.setHeader('Retry-After', String(retryAfterS));
  return new ApiError(429, 'rate_limited', `${what}; try again in ${waitText(retryAfterS)}`, field);
}
