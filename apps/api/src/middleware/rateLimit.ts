import type { RequestHandler } from 'express';
import type pg from 'pg';
import { ipKeyGenerator } from 'express-rate-limit';
import { RateLimiterMemory, RateLimiterPostgres, RateLimiterRes } from 'rate-limiter-flexible';
import { AppError } from '../lib/errors';

export interface AttemptLimitOptions {
  /** attempts per client address per window */
  max: number;
  /** 'postgres': one count shared by every instance on the database; 'memory': this process only */
  store: 'postgres' | 'memory';
  /** the app's pool, for the PostgreSQL store */
  pool?: pg.Pool;
  /** keeps apps that share a database (tests, several deployments) from sharing counts */
  prefix: string;
}

const WINDOW_SECONDS = 10 * 60;

/**
 * The limiter for sign-in, sign-up, reset and invitation links: `max` attempts per 10 minutes per
 * client address (IPv6 counted per /56, as express-rate-limit does), counted in PostgreSQL so two
 * instances behind a balancer share one count. If the database cannot be reached, each instance
 * falls back to counting in its own memory rather than letting every attempt through.
 */
export function attemptLimiter(name: string, options: AttemptLimitOptions): RequestHandler {
  const common = { points: options.max, duration: WINDOW_SECONDS, keyPrefix: `${options.prefix}:${name}` };
  const memory = new RateLimiterMemory(common);
  const limiter =
    options.store === 'postgres' && options.pool
      ? new RateLimiterPostgres({
          ...common,
          storeClient: options.pool,
          storeType: 'pool',
          tableName: 'rate_limits',
          tableCreated: true,
          insuranceLimiter: memory,
        })
      : memory;
  const headers = (res: Parameters<RequestHandler>[1], r: RateLimiterRes) => {
    res.setHeader('RateLimit-Policy', `${options.max};w=${WINDOW_SECONDS}`);
    res.setHeader(
      'RateLimit',
      `limit=${options.max}, remaining=${r.remainingPoints}, reset=${Math.ceil(r.msBeforeNext / 1000)}`,
    );
  };
  return async (req, res, next) => {
    try {
      headers(res, await limiter.consume(ipKeyGenerator(req.ip ?? 'unknown')));
      next();
    } catch (err) {
      if (!(err instanceof RateLimiterRes)) return next(err);
      headers(res, err);
      res.setHeader('Retry-After', String(Math.max(1, Math.ceil(err.msBeforeNext / 1000))));
      next(new AppError(429, 'rate_limited', 'Too many attempts. Wait a few minutes and try again.'));
    }
  };
}
