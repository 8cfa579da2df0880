import PgBoss from 'pg-boss';
import type { Logger } from 'pino';
import type { DeliveryDeps } from '../services/reminders/delivery';
import { runReminderTick } from '../services/reminders/tick';

/** The scheduled pass over every rule. */
export const REMINDER_TICK_QUEUE = 'reminders-tick';
/** A pass for a few people right away (after they edit a culture or a plan). */
export const REMINDER_USERS_QUEUE = 'reminders-users';

export interface ReminderWorkerOptions {
  databaseUrl: string;
  deps: DeliveryDeps;
  now: () => Date;
  logger: Pick<Logger, 'info' | 'warn' | 'error'>;
  /** cron (UTC) for the scheduled pass; default every five minutes */
  cron?: string;
  /** register the cron schedule (tests send jobs themselves) */
  schedule?: boolean;
  pollingIntervalSeconds?: number;
}

export interface ReminderWorker {
  boss: PgBoss;
  stop(): Promise<void>;
}

/** Create the queue unless it exists. Two workers starting together can deadlock inside pg-boss's create_queue: retry. */
async function ensureQueue(boss: PgBoss, name: string) {
  for (let attempt = 0; ; attempt += 1) {
    try {
      if (!(await boss.getQueue(name)))
        await boss.createQueue(name, { name, retryLimit: 2, retryDelay: 30, expireInSeconds: 600 });
      return;
    } catch (err) {
      if (attempt >= 4) throw err;
      await new Promise((r) => setTimeout(r, 100 + Math.random() * 400));
    }
  }
}

/**
 * A pg-boss worker on the app's database: a cron job runs `runReminderTick`. pg-boss fires a cron
 * slot once however many workers run, and even when two passes overlap the notices' unique dedupe
 * key and the SKIP LOCKED e-mail claims keep every notice stored and sent once.
 */
export async function startReminderWorker(opts: ReminderWorkerOptions): Promise<ReminderWorker> {
  const boss = new PgBoss({ connectionString: opts.databaseUrl, schema: 'pgboss', max: 3 });
  boss.on('error', (err) => opts.logger.error({ err }, 'pg-boss error'));
  await boss.start();
  await ensureQueue(boss, REMINDER_TICK_QUEUE);
  await ensureQueue(boss, REMINDER_USERS_QUEUE);
  if (opts.schedule !== false) await boss.schedule(REMINDER_TICK_QUEUE, opts.cron ?? '*/5 * * * *', {}, { tz: 'UTC' });
  const workOptions = { pollingIntervalSeconds: opts.pollingIntervalSeconds ?? 2, batchSize: 1 };
  await boss.work(REMINDER_TICK_QUEUE, workOptions, async () => {
    const result = await runReminderTick(opts.deps, opts.now());
    opts.logger.info(result, 'reminder pass');
  });
  await boss.work<{ userIds: string[] }>(REMINDER_USERS_QUEUE, workOptions, async ([job]) => {
    if (!job) return;
    await runReminderTick(opts.deps, opts.now(), job.data.userIds);
  });
  return {
    boss,
    stop: () => boss.stop({ graceful: true, wait: true, timeout: 10_000 }),
  };
}
