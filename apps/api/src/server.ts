import { loadEnv, mailModeOf } from './config/env';
import { connect, runMigrations } from './db/client';
import { createApp, appUrlOf } from './app';
import { createLogger } from './lib/logger';
import { FakeInbox, startFakeSmtp } from './mail/fakeSmtp';
import { createSmtpMailer, type Mailer } from './mail/mailer';
import { seedDemoIfEmpty, DEMO_PASSWORD } from './db/seed';
import { startCaches } from './cache/caches';

const env = loadEnv();
const logger = createLogger(env);
const database = connect(env.DATABASE_URL, { max: env.DATABASE_POOL_MAX });

await runMigrations(database.db);
logger.info('migrations applied');

let mailer: Mailer;
let inbox: FakeInbox | undefined;
let closeSmtp: (() => Promise<void>) | undefined;
if (mailModeOf(env) === 'smtp') {
  mailer = createSmtpMailer({ url: env.SMTP_URL! }, env.MAIL_FROM);
} else {
  inbox = new FakeInbox();
  const smtp = await startFakeSmtp(inbox, env.FAKE_SMTP_PORT);
  closeSmtp = smtp.close;
  mailer = createSmtpMailer({ port: smtp.port }, env.MAIL_FROM);
  logger.info({ port: smtp.port }, 'fake SMTP inbox listening on loopback');
}

let demoUsers: string[] = [];
if (env.SEED_DEMO === '1') demoUsers = await seedDemoIfEmpty(database.db);

// sessions and library pages in memory, dropped when the database says they changed (CACHE_SECONDS=0: off)
const caches =
  env.CACHE_SECONDS > 0
    ? await startCaches({ databaseUrl: env.DATABASE_URL, seconds: env.CACHE_SECONDS, logger, now: () => new Date() })
    : undefined;

const { app } = createApp({ env, db: database.db, mailer, logger, inbox, caches });
const server = app.listen(env.PORT, env.HOST, () => {
  const url = appUrlOf(env);
  console.log(`\nBarmkeep is running at ${url}`);
  if (inbox) console.log(`Mail goes to the local fake inbox: ${url}/dev/mail`);
  if (demoUsers.length) {
    console.log(`Demo sign-ins (password for each: ${DEMO_PASSWORD}):`);
    for (const u of demoUsers) console.log(`  ${u}`);
  }
});
// Idle keep-alive connections outlive a load balancer's own idle timeout (60 s in nginx and most
// cloud balancers), so the balancer closes them, never Node mid-reuse (a 502 under load otherwise).
server.keepAliveTimeout = 65_000;
server.headersTimeout = 66_000;

async function shutdown() {
  server.close();
  await caches?.stop();
  await closeSmtp?.();
  await database.close();
  process.exit(0);
}
process.on('SIGINT', shutdown);
process.on('SIGTERM', shutdown);
