import { rateLimit } from 'express-rate-limit';
import type { AppContext } from '../app-context';
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
