import { rateLimit } from 'express-rate-limit';
import { AppError } from '../lib/errors';

/** The limiter for sign-in, sign-up, reset and invitation links: `max` attempts per 10 minutes per client. */
export function attemptLimiter(max: number) {
  return rateLimit({
    windowMs: 10 * 60_000,
    limit: max,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    handler: (_req, _res, next) =>
      next(new AppError(429, 'rate_limited', 'Too many attempts. Wait a few minutes and try again.')),
  });
}
