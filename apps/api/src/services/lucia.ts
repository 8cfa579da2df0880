import { Lucia, TimeSpan, type DatabaseSession, type DatabaseUser } from 'lucia';
import { DrizzlePostgreSQLAdapter } from '@lucia-auth/adapter-drizzle';
import { eq, sql } from 'drizzle-orm';
import type { Db } from '../db/client';
import { sessions, users } from '../db/schema';
import type { CoherentCache } from '../cache/coherentCache';
import { sessionOwner, type CachedSession } from '../cache/caches';

/**
 * The package's adapter, with the one query every signed-in request runs — session and user by
 * session id — as a named prepared statement: drizzle builds it once and PostgreSQL plans it once
 * per connection. Same query, same result shape as the parent's; everything else is the parent's.
 *
 * With `cache` (src/cache/caches.ts) a session found is kept in memory until it or its person
 * changes (the triggers of migration 0015 tell every process; this process also drops it itself
 * right after its own change) or the cache's time runs out. A session not found is never kept.
 */
class PreparedSessionAdapter extends DrizzlePostgreSQLAdapter {
  private readonly sessionAndUser;

  constructor(
    db: Db,
    private readonly cache?: CoherentCache<CachedSession>,
  ) {
    super(db, sessions, users);
    this.sessionAndUser = db
      .select({ user: users, session: sessions })
      .from(sessions)
      .innerJoin(users, eq(sessions.userId, users.id))
      .where(eq(sessions.id, sql.placeholder('sessionId')))
      .prepare('lucia_session_and_user');
  }

  override async getSessionAndUser(sessionId: string): Promise<[DatabaseSession | null, DatabaseUser | null]> {
    const hit = this.cache?.get(sessionId);
    if (hit) return [hit.session, hit.user];
    const ticket = this.cache?.ticket() ?? 0;
    const rows = await this.sessionAndUser.execute({ sessionId });
    if (rows.length !== 1) return [null, null];
    const { id, userId, expiresAt, ...sessionAttributes } = rows[0]!.session;
    const { id: uid, ...userAttributes } = rows[0]!.user;
    const session: DatabaseSession = Object.freeze({ id, userId, expiresAt, attributes: sessionAttributes });
    const user: DatabaseUser = Object.freeze({
      id: uid,
      attributes: userAttributes as unknown as DatabaseUser['attributes'],
    });
    this.cache?.set(sessionId, { session, user }, [sessionId, sessionOwner(userId)], ticket);
    return [session, user];
  }

  override async deleteSession(sessionId: string): Promise<void> {
    await super.deleteSession(sessionId);
    this.cache?.evict(sessionId);
  }

  override async deleteUserSessions(userId: string): Promise<void> {
    await super.deleteUserSessions(userId);
    this.cache?.evict(sessionOwner(userId));
  }

  override async updateSessionExpiration(sessionId: string, expiresAt: Date): Promise<void> {
    await super.updateSessionExpiration(sessionId, expiresAt);
    this.cache?.evict(sessionId);
  }
}

/**
 * Sessions live in PostgreSQL through lucia v3 (see docs/decisions/0002-sessions-with-lucia-v3.md
 * for why, and the path to the small @oslojs session design that replaces it).
 */
export function createLucia(
  db: Db,
  options: { secureCookie: boolean; sessionDays: number; cache?: CoherentCache<CachedSession> },
) {
  const adapter = new PreparedSessionAdapter(db, options.cache);
  return new Lucia(adapter, {
    sessionExpiresIn: new TimeSpan(options.sessionDays, 'd'),
    sessionCookie: {
      name: 'barmkeep_session',
      expires: true,
      attributes: { secure: options.secureCookie, sameSite: 'lax', path: '/' },
    },
    getUserAttributes: (row) => ({
      email: row.email,
      name: row.name,
      role: row.role,
      unitSystem: row.unitSystem,
      temperatureUnit: row.temperatureUnit,
      gravityUnit: row.gravityUnit,
      timeZone: row.timeZone,
      createdAt: row.createdAt,
    }),
  });
}

export type AppLucia = ReturnType<typeof createLucia>;

interface DatabaseUserAttributes {
  email: string;
  name: string;
  role: 'user' | 'admin';
  unitSystem: 'metric' | 'us';
  temperatureUnit: 'C' | 'F';
  gravityUnit: 'sg' | 'plato';
  timeZone: string;
  createdAt: Date;
}

declare module 'lucia' {
  interface Register {
    Lucia: AppLucia;
    DatabaseUserAttributes: DatabaseUserAttributes;
  }
}
