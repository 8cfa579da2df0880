import { Lucia, TimeSpan, type DatabaseSession, type DatabaseUser } from 'lucia';
import { DrizzlePostgreSQLAdapter } from '@lucia-auth/adapter-drizzle';
import { eq, sql } from 'drizzle-orm';
import type { Db } from '../db/client';
import { sessions, users } from '../db/schema';

/**
 * The package's adapter, with the one query every signed-in request runs — session and user by
 * session id — as a named prepared statement: drizzle builds it once and PostgreSQL plans it once
 * per connection. Same query, same result shape as the parent's; everything else is the parent's.
 */
class PreparedSessionAdapter extends DrizzlePostgreSQLAdapter {
  private readonly sessionAndUser;

  constructor(db: Db) {
    super(db, sessions, users);
    this.sessionAndUser = db
      .select({ user: users, session: sessions })
      .from(sessions)
      .innerJoin(users, eq(sessions.userId, users.id))
      .where(eq(sessions.id, sql.placeholder('sessionId')))
      .prepare('lucia_session_and_user');
  }

  override async getSessionAndUser(sessionId: string): Promise<[DatabaseSession | null, DatabaseUser | null]> {
    const rows = await this.sessionAndUser.execute({ sessionId });
    if (rows.length !== 1) return [null, null];
    const { id, userId, expiresAt, ...sessionAttributes } = rows[0]!.session;
    const { id: uid, ...userAttributes } = rows[0]!.user;
    return [
      { id, userId, expiresAt, attributes: sessionAttributes },
      { id: uid, attributes: userAttributes as unknown as DatabaseUser['attributes'] },
    ];
  }
}

/**
 * Sessions live in PostgreSQL through lucia v3 (see docs/decisions/0002-sessions-with-lucia-v3.md
 * for why, and the path to the small @oslojs session design that replaces it).
 */
export function createLucia(db: Db, options: { secureCookie: boolean; sessionDays: number }) {
  const adapter = new PreparedSessionAdapter(db);
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
