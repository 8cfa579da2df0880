import pg from 'pg';
import type { Logger } from 'pino';

export interface PgListenerOptions {
  databaseUrl: string;
  /** NOTIFY channels to LISTEN on (plain identifiers) */
  channels: readonly string[];
  /** names the listener in log lines */
  name: string;
  /** the connection's application_name in pg_stat_activity */
  applicationName?: string;
  logger: Pick<Logger, 'warn'>;
  onNotification(channel: string, payload: string): void;
  /** LISTEN is in place on a fresh connection (first time, or after a lost one) */
  onLive?(): void;
  /** the connection is gone: notifications sent from now until the next onLive are missed */
  onLost?(): void;
}

export interface PgListener {
  /** true while LISTEN is in place: every notification committed from then on reaches onNotification */
  readonly live: boolean;
  /** NOTIFY on this listener's own connection (it hears its own notifications, after every earlier one) */
  notify(channel: string, payload: string): Promise<void>;
  stop(): Promise<void>;
}

/**
 * One connection that LISTENs, reconnecting with backoff (0.5 s doubling to 30 s) when it drops.
 * PostgreSQL delivers a notification when its transaction commits, in commit order.
 */
export async function startPgListener(opts: PgListenerOptions): Promise<PgListener> {
  let client: pg.Client | null = null;
  let live = false;
  let stopped = false;
  let retryMs = 500;
  let timer: NodeJS.Timeout | null = null;

  const lose = (c: pg.Client) => {
    if (client !== c) return;
    client = null;
    if (live) {
      live = false;
      opts.onLost?.();
    }
    void c.end().catch(() => {});
    reconnectLater();
  };

  const reconnectLater = () => {
    if (stopped || timer) return;
    timer = setTimeout(() => {
      timer = null;
      void open();
    }, retryMs);
    retryMs = Math.min(retryMs * 2, 30_000);
  };

  async function open() {
    const c = new pg.Client({
      connectionString: opts.databaseUrl,
      keepAlive: true,
      application_name: opts.applicationName,
    });
    client = c;
    c.on('error', (err) => {
      opts.logger.warn({ err }, `${opts.name} listener lost its connection`);
      lose(c);
    });
    c.on('end', () => lose(c));
    c.on('notification', (msg) => {
      if (client === c && msg.payload !== undefined) opts.onNotification(msg.channel, msg.payload);
    });
    try {
      await c.connect();
      for (const channel of opts.channels) await c.query(`LISTEN ${channel}`);
      if (stopped || client !== c) {
        await c.end();
        return;
      }
      retryMs = 500;
      live = true;
      opts.onLive?.();
    } catch (err) {
      opts.logger.warn({ err }, `${opts.name} listener could not connect`);
      lose(c);
    }
  }

  await open();
  return {
    get live() {
      return live;
    },
    async notify(channel, payload) {
      const c = client;
      if (!c || !live) throw new Error(`${opts.name} listener is not connected`);
      await c.query('select pg_notify($1, $2)', [channel, payload]);
    },
    async stop() {
      stopped = true;
      if (timer) clearTimeout(timer);
      const c = client;
      client = null;
      live = false;
      await c?.end().catch(() => {});
    },
  };
}
