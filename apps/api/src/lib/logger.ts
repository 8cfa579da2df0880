import { pino } from 'pino';
import type { Env } from '../config/env';

export const createLogger = (env: Env) =>
  pino({ level: env.NODE_ENV === 'test' ? 'silent' : env.LOG_LEVEL, redact: ['req.headers.cookie'] });
