import { eq } from 'drizzle-orm';
import type supertest from 'supertest';
import { buildPerson, signUp, type TestApp } from './helpers';
import { clubs, memberships, users, type ClubRole } from '../src/db/schema';
import { newId } from '../src/lib/ids';

export type Agent = ReturnType<typeof supertest.agent>;
export const ACTORS = ['anonymous', 'nonMember', 'member', 'steward', 'owner', 'siteAdmin'] as const;
export type ActorName = (typeof ACTORS)[number];

export interface Person {
  agent: Agent;
  id: string;
  email: string;
  name: string;
}

export async function signedUpPerson(t: TestApp, name?: string): Promise<Person> {
  const agent = t.agent();
  const { person, user } = await signUp(agent, buildPerson(name ? { name } : {}));
  return { agent, id: user.id, email: person.email, name: person.name };
}

export async function makeSiteAdmin(t: TestApp, p: Person) {
  await t.database.db.update(users).set({ role: 'admin' }).where(eq(users.id, p.id));
}

let clubCounter = 0;
/** A club written straight to the database with the given members (fast; no API calls). */
export async function buildClub(t: TestApp, members: { person: Person; role: ClubRole }[], name?: string) {
  clubCounter += 1;
  const id = newId();
  await t.database.db
    .insert(clubs)
    .values({ id, name: name ?? `Test club ${clubCounter}`, description: 'Made up for a test' });
  if (members.length) {
    await t.database.db
      .insert(memberships)
      .values(members.map((m) => ({ clubId: id, userId: m.person.id, role: m.role })));
  }
  return id;
}

/** Waits for the fake SMTP server to receive a message to `to` (delivery is asynchronous). */
export async function waitForMail(t: TestApp, to: string, previousId?: string) {
  for (let i = 0; i < 100; i++) {
    const m = t.inbox.latestTo(to);
    if (m && m.id !== previousId) return m;
    await new Promise((r) => setTimeout(r, 30));
  }
  throw new Error(`no mail to ${to}`);
}

export function tokenFromMail(text: string): string {
  const match = /\/invitation\?token=([A-Za-z0-9_%-]+)/.exec(text);
  if (!match) throw new Error('no invitation link in the mail');
  return decodeURIComponent(match[1]!);
}
