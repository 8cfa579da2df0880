import { bigint, integer, pgTable, varchar } from 'drizzle-orm/pg-core';

/**
 * Attempt counters shared by every API instance (middleware/rateLimit.ts). The layout is the one
 * rate-limiter-flexible's PostgreSQL store reads and writes — key, points, expire (epoch ms), in
 * this column order — so the package never creates a table of its own.
 */
export const rateLimits = pgTable('rate_limits', {
  key: varchar('key', { length: 255 }).primaryKey(),
  points: integer('points').notNull().default(0),
  expire: bigint('expire', { mode: 'number' }),
});
