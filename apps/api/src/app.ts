import express, { type Express } from 'express';
import helmet from 'helmet';
import type { Logger } from 'pino';
import { httpLogger } from './lib/requestLog';
import { existsSync } from 'node:fs';
import path from 'node:path';
import type { Env } from './config/env';
import { poolOf, type Db } from './db/client';
import type { Mailer } from './mail/mailer';
import type { FakeInbox } from './mail/fakeSmtp';
import { createLucia } from './services/lucia';
import type { ServiceContext } from './services/context';
import { sessionMiddleware } from './middleware/session';
import type { AttemptLimitOptions } from './middleware/rateLimit';
import { originCheck } from './middleware/csrf';
import { cacheFence } from './middleware/cacheFence';
import type { Caches } from './cache/caches';
import { apiNotFound, errorHandler } from './middleware/errors';
import { authRouter } from './routes/auth/auth';
import { accountRouter } from './routes/account/account';
import { devMailRouter } from './routes/dev/devMail';
import { healthRouter } from './routes/health/health';
import { adminRouter } from './routes/admin/admin';
import { clubRouteMounts } from './routes/clubs/mounts';
import { culturesRouter } from './routes/cultures/cultures';
import { plansRouter } from './routes/plans/plans';
import { batchesRouter } from './routes/batches/batches';
import { equipmentRouter } from './routes/equipment/equipment';
import { notificationsRouter, reminderPreferencesRouter } from './routes/notifications/notifications';
import { emailPreferencesRouter, oneClickUnsubscribeRouter } from './routes/emailPreferences/emailPreferences';
import { calendarFeedRouter, calendarFileRouter } from './routes/calendar/calendar';
import { labelsRouter } from './routes/labels/labels';
import { culturePhotosRouter } from './routes/cultures/photos';
import { createStorage, type ObjectStorage } from './storage';
import { webAppRouter } from './web/webApp';

export interface AppDeps {
  env: Env;
  db: Db;
  mailer: Mailer;
  logger: Logger;
  /** The fake inbox, when mail goes to the local fake SMTP server. */
  inbox?: FakeInbox;
  now?: () => Date;
  /** Where photos go; by default chosen from env (local disk or S3). */
  storage?: ObjectStorage;
  /** In-memory caches kept coherent through the database (`startCaches`); absent: nothing is cached. */
  caches?: Caches;
}

export function appUrlOf(env: Env) {
  return (env.APP_URL ?? `http://${env.HOST}:${env.PORT}`).replace(/\/$/, '');
}

export function createApp(deps: AppDeps): { app: Express; ctx: ServiceContext } {
  const { env, db, mailer, logger } = deps;
  const appUrl = appUrlOf(env);
  const https = appUrl.startsWith('https://');
  const lucia = createLucia(db, {
    secureCookie: https,
    sessionDays: env.SESSION_DAYS,
    cache: deps.caches?.sessions,
  });
  const ctx: ServiceContext = { db, lucia, mailer, appUrl, now: deps.now ?? (() => new Date()), caches: deps.caches };

  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', env.TRUST_PROXY);
  app.use(httpLogger(logger, { autoLogging: env.NODE_ENV !== 'test' }));
  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          'img-src': ["'self'", 'data:', 'blob:'],
          'upgrade-insecure-requests': https ? [] : null,
        },
      },
      strictTransportSecurity: https,
    }),
  );

  const api = express.Router();
  api.use(cacheFence(deps.caches));
  api.use(express.json({ limit: '1mb' }));
  // Mail providers' one-click unsubscribe carries no Origin; the secret token is its authority.
  api.use('/email-preferences', oneClickUnsubscribeRouter(ctx));
  api.use(originCheck([appUrl, ...env.ALLOWED_ORIGINS.split(',').filter(Boolean)]));
  api.use(sessionMiddleware(lucia));
  api.use('/health', healthRouter(db));
  const rateLimit = {
    max: env.AUTH_RATE_LIMIT,
    store: env.RATE_LIMIT_STORE,
    pool: poolOf(db),
    prefix: env.RATE_LIMIT_PREFIX,
  } satisfies AttemptLimitOptions;
  api.use('/auth', authRouter(ctx, { rateLimit }));
  api.use('/account/equipment', equipmentRouter(ctx));
  api.use('/account', accountRouter(ctx));
  api.use('/admin', adminRouter(ctx));
  for (const mount of clubRouteMounts(ctx, { rateLimit })) api.use(mount.path, mount.router);
  const storage = deps.storage ?? createStorage(env);
  api.use('/cultures', culturesRouter(ctx, storage));
  api.use('/plans', plansRouter(ctx));
  api.use('/batches', batchesRouter(ctx));
  api.use('/cultures', culturePhotosRouter(ctx, storage));
  api.use('/notifications', notificationsRouter(ctx));
  api.use('/reminder-preferences', reminderPreferencesRouter(ctx));
  api.use('/email-preferences', emailPreferencesRouter(ctx));
  api.use('/calendar-feed', calendarFeedRouter(ctx));
  api.use('/calendar', calendarFileRouter(ctx));
  api.use('/labels', labelsRouter(ctx));
  if (deps.inbox) api.use('/dev/mail', devMailRouter(deps.inbox));
  api.use(apiNotFound);
  app.use('/api', api);

  const webDist = env.WEB_DIST ?? path.resolve(import.meta.dirname, '../../web/dist');
  if (env.NODE_ENV === 'production' && existsSync(path.join(webDist, 'index.html'))) {
    app.use(webAppRouter(webDist));
  }

  app.use(errorHandler);
  return { app, ctx };
}
