import { Lucia, TimeSpan } from 'lucia';
import { DrizzlePostgreSQLAdapter } from '@lucia-auth/adapter-drizzle';
import type { Db } from '../db/client';
import { sessions, users } from '../db/schema';

/**
 * Sessions live in PostgreSQL through lucia v3 (see docs/decisions/0002-sessions-with-lucia-v3.md
 * for why, and the path to the small @oslojs session design that replaces it).
 */
export function createLucia(db: Db, options: { secureCookie: boolean; sessionDays: number }) {
  const adapter = new DrizzlePostgreSQLAdapter(db, sessions, users);
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
