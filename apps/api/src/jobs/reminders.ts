import PgBoss from 'pg-boss';
import type { Logger } from 'pino';
import type { DeliveryDeps } from '../services/reminders/delivery';
import { runReminderTick } from '../services/reminders/tick';
import { startPgListener } from '../lib/pgListener';

/** The scheduled pass over every rule. */
export const REMINDER_TICK_QUEUE = 'reminders-tick';
/** A pass for a few people right away (after they edit a culture or a plan). */
export const REMINDER_USERS_QUEUE = 'reminders-users';
/** NOTIFY channel the database triggers use when a reminder input changes (payload: the person's id). */
export const REMINDER_INPUTS_CHANNEL = 'reminder_inputs';
/**
 * A person's re-check is debounced to one pass per this many seconds: the first change in a slot is
 * checked at once, later ones in the same slot by one more pass at the start of the next slot.
 */
export const RECHECK_DEBOUNCE_SECONDS = 10;

export interface ReminderWorkerOptions {
  databaseUrl: string;
  deps: DeliveryDeps;
  now: () => Date;
  logger: Pick<Logger, 'info' | 'warn' | 'error'>;
  /** cron (UTC) for the scheduled pass; default every five minutes */
  cron?: string;
  /** register the cron schedule (tests send jobs themselves) */
  schedule?: boolean;
  /** LISTEN for changed reminder inputs and enqueue a debounced pass per person (default on) */
  listen?: boolean;
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
  const listener = opts.listen === false ? null : await listenForInputChanges(opts, boss);
  return {
    boss,
    async stop() {
      await listener?.stop();
      await boss.stop({ graceful: true, wait: true, timeout: 10_000 });
    },
  };
}

/** Enqueue a debounced pass for one person (singleton per person and slot, see RECHECK_DEBOUNCE_SECONDS). */
export function enqueueRecheck(boss: PgBoss, userId: string) {
  return boss.sendDebounced(REMINDER_USERS_QUEUE, { userIds: [userId] }, {}, RECHECK_DEBOUNCE_SECONDS, userId);
}

/**
 * The triggers on cultures and notification_preferences send NOTIFY reminder_inputs with the owner's
 * id when something a rule reads changes, whichever code wrote it; PostgreSQL delivers it when the
 * transaction commits, so the pass sees the change. This keeps one connection listening and turns
 * each notification into a debounced job. A notification sent while no worker listens is lost; the
 * scheduled pass still finds the change within its interval. With several workers each enqueues;
 * the singleton key keeps that to one job per person per slot (plus at most one for the next slot).
 */
async function listenForInputChanges(opts: ReminderWorkerOptions, boss: PgBoss): Promise<{ stop(): Promise<void> }> {
  return startPgListener({
    databaseUrl: opts.databaseUrl,
    channels: [REMINDER_INPUTS_CHANNEL],
    name: 'reminder inputs',
    logger: opts.logger,
    onNotification(channel, userId) {
      if (channel !== REMINDER_INPUTS_CHANNEL || !userId) return;
      enqueueRecheck(boss, userId).catch((err: unknown) =>
        opts.logger.warn({ err, userId }, 'could not enqueue a reminder re-check'),
      );
    },
  });
}
