import { randomUUID } from 'node:crypto';
import type { Logger } from 'pino';
import type { DatabaseSession, DatabaseUser } from 'lucia';
import type { CultureListDto } from '@barmkeep/schemas';
import { CoherentCache } from './coherentCache';
import { startPgListener, type PgListener } from '../lib/pgListener';

/**
 * The NOTIFY channel of the triggers in migration 0015. Payloads: `u:<user id>` (the person's row
 * or one of their sessions changed), `l:<user id>` (a culture they keep was added, removed or
 * changed in a column the library shows), `f:<id>` (a fence, see `Caches.fence`).
 */
export const CACHE_CHANNEL = 'barmkeep_cache';

export interface CachedSession {
  session: DatabaseSession;
  user: DatabaseUser;
}

/**
 * What each API process keeps in memory (docs/decisions/0050-in-process-caches.md): signed-in
 * sessions with their person, and the library's unfiltered pages. Every process LISTENs on
 * CACHE_CHANNEL; the triggers notify whichever code writes, so every process drops what changed
 * when the change commits. While the listener is down the caches are off.
 */
export interface Caches {
  /** the listening connection's application_name (unique per process) */
  readonly listenerName: string;
  sessions: CoherentCache<CachedSession>;
  libraryPages: CoherentCache<CultureListDto>;
  readonly live: boolean;
  /**
   * Resolves once this process has heard every notification committed before the call. A request
   * that wrote awaits it before answering, so the next request — from anyone, to this process —
   * sees the change even if its notification was still on the wire.
   */
  fence(): Promise<void>;
  /** Drop what this process keeps of one person (their sessions and library pages), at once. */
  dropPerson(userId: string): void;
  stop(): Promise<void>;
}

export const sessionOwner = (userId: string) => `u:${userId}`;
export const libraryOwner = (userId: string) => `l:${userId}`;

const FENCE_TIMEOUT_MS = 2_000;

export async function startCaches(opts: {
  databaseUrl: string;
  /** how long an entry may be served without a change (the safety net for a lost notification) */
  seconds: number;
  logger: Pick<Logger, 'warn'>;
  now: () => Date;
}): Promise<Caches> {
  const ttlMs = opts.seconds * 1000;
  const sessions = new CoherentCache<CachedSession>({ max: 20_000, ttlMs, now: opts.now });
  const libraryPages = new CoherentCache<CultureListDto>({ max: 2_000, ttlMs, now: opts.now });
  const all = [sessions, libraryPages];
  const processId = randomUUID();
  const listenerName = `barmkeep cache ${processId.slice(0, 8)}`;
  let fenceSeq = 0;
  const fences = new Map<string, () => void>();

  const setEnabled = (on: boolean) => {
    for (const c of all) {
      c.clear();
      c.enabled = on;
    }
    if (!on) for (const release of fences.values()) release();
  };

  const listener: PgListener = await startPgListener({
    databaseUrl: opts.databaseUrl,
    channels: [CACHE_CHANNEL],
    name: 'cache invalidation',
    applicationName: listenerName,
    logger: opts.logger,
    onNotification(channel, payload) {
      if (channel !== CACHE_CHANNEL) return;
      const kind = payload.slice(0, 2);
      const id = payload.slice(2);
      if (kind === 'u:') sessions.evict(sessionOwner(id));
      else if (kind === 'l:') libraryPages.evict(libraryOwner(id));
      else if (kind === 'f:') fences.get(id)?.();
    },
    // notifications sent while it was down are lost: start empty
    onLive: () => setEnabled(true),
    onLost: () => setEnabled(false),
  });

  return {
    listenerName,
    sessions,
    libraryPages,
    get live() {
      return listener.live;
    },
    async fence() {
      if (!listener.live) return;
      const id = `${processId}-${++fenceSeq}`;
      let timer: NodeJS.Timeout | undefined;
      // heard: the fence came back; false: it did not within the time (or the notify failed)
      const heard = new Promise<boolean>((resolve) => {
        fences.set(id, () => resolve(true));
        timer = setTimeout(() => resolve(false), FENCE_TIMEOUT_MS);
        listener.notify(CACHE_CHANNEL, `f:${id}`).catch(() => resolve(false));
      });
      try {
        if (!(await heard)) {
          // nothing is known of what is on the wire: start empty
          opts.logger.warn('cache fence not heard in time: emptying the caches');
          for (const c of all) c.clear();
        }
      } finally {
        clearTimeout(timer);
        fences.delete(id);
      }
    },
    dropPerson(userId) {
      sessions.evict(sessionOwner(userId));
      libraryPages.evict(libraryOwner(userId));
    },
    async stop() {
      setEnabled(false);
      await listener.stop();
    },
  };
}
