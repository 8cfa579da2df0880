/**
 * The reminders worker: a separate process beside the API (infra/start.sh starts both). It
 * evaluates the reminder rules on a pg-boss schedule and sends the e-mails.
 */
import { loadEnv } from './config/env';
import { sql } from 'drizzle-orm';
import { connect } from './db/client';
import { appUrlOf } from './app';
import { createLogger } from './lib/logger';
import { createSmtpMailer, type Mailer } from './mail/mailer';
import { startReminderWorker } from './jobs/reminders';

const env = loadEnv();
const logger = createLogger(env).child({ process: 'worker' });
const database = connect(env.DATABASE_URL, { max: env.WORKER_POOL_MAX });

// The API process applies migrations; wait for them rather than racing it.
for (let tries = 0; ; tries += 1) {
  try {
    const { rows } = await database.db.execute<{ ok: boolean }>(
      sql`select to_regclass('public.notifications') is not null as ok`,
    );
    if (rows[0]?.ok) break;
  } catch {
    // the database may still be starting
  }
  if (tries > 120) throw new Error('The reminders tables never appeared; is the API running its migrations?');
  await new Promise((r) => setTimeout(r, 500));
}

// The API process owns the local fake inbox; the worker delivers to it by port.
let mailer: Mailer;
if (env.SMTP_URL && env.FAKE_SMTP !== '1') mailer = createSmtpMailer({ url: env.SMTP_URL }, env.MAIL_FROM);
else if (env.FAKE_SMTP_PORT) mailer = createSmtpMailer({ port: env.FAKE_SMTP_PORT }, env.MAIL_FROM);
else throw new Error('The worker needs SMTP_URL, or FAKE_SMTP_PORT pointing at the API’s fake inbox');

const worker = await startReminderWorker({
  databaseUrl: env.DATABASE_URL,
  deps: { db: database.db, mailer, appUrl: appUrlOf(env), logger },
  now: () => new Date(),
  logger,
  cron: env.REMINDER_CRON,
});
logger.info({ cron: env.REMINDER_CRON }, 'reminders worker started');

async function shutdown() {
  await worker.stop();
  await database.close();
  process.exit(0);
}
process.on('SIGINT', shutdown);
process.on('SIGTERM', shutdown);
