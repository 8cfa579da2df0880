import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { buildTestApp, type TestApp } from './helpers';
import { memberships } from '../src/db/schema';
import { listRoutes } from './access/routes';
import { buildWorld } from './access/world';
import { loadAccessTables } from './access/tables';
import { send, urlOf } from './access/send';
import { ROLES, SCOPES, type AccessCase, type AccessEntry } from './access/types';

/**
 * The authorization matrix over EVERY API route. Routes are read from the app's router stack; the
 * expected statuses come from the `access` table each router keeps beside it in
 * src/routes/<resource>/access.ts. A route with no entry, or an entry for a route that no longer
 * exists, fails here by name. See DEVELOPERS.md, "Add a route".
 *
 * Besides the status, every response is checked for other people's private text: each person's
 * rows carry a private mark, and a response to anyone else holding it is a leak.
 */

const { entries, duplicates } = await loadAccessTables();

let t: TestApp;
let w: Awaited<ReturnType<typeof buildWorld>>;
beforeAll(async () => {
  t = await buildTestApp();
  w = await buildWorld(t);
});
afterAll(async () => {
  await t?.close();
});

describe('authorization matrix: coverage', () => {
  it('every API route has an access entry, and every entry is a real route', async () => {
    const probe = await buildTestApp();
    const routes = listRoutes(probe.app);
    await probe.close();
    expect(routes.length).toBeGreaterThan(30);
    const missing = routes.filter((r) => !entries.has(r));
    const stale = [...entries.keys()].filter((r) => !routes.includes(r));
    const problems = [
      ...missing.map(
        (r) => `${r} has no access entry: add it to src/routes/<resource>/access.ts (DEVELOPERS.md, "Add a route")`,
      ),
      ...stale.map((r) => `${r} is in ${entries.get(r)!.file} but no such route is mounted`),
      ...duplicates.map((r) => `${r} has two entries`),
    ];
    expect(problems).toEqual([]);
  });

  it('every entry names at least one scope, and only known ones', () => {
    for (const [route, { entry }] of entries) {
      const scopes = Object.keys(entry.expect);
      expect(scopes.length, route).toBeGreaterThan(0);
      for (const s of scopes) expect(SCOPES, `${route}: scope ${s}`).toContain(s);
    }
  });
});

const cases = [...entries].flatMap(([route, { entry }]) =>
  (Object.keys(entry.expect) as (keyof AccessEntry['expect'])[]).flatMap((scope) =>
    ROLES.map((role) => ({ route, scope, role, entry, want: entry.expect[scope]![role] })),
  ),
);

/** Other people's private text in a response, found by the marks the world puts in every row. */
async function leaks(text: string, c: AccessCase, entry: AccessEntry): Promise<string[]> {
  if (!/(private-mark|club-mark|club-about)-/.test(text)) return [];
  const found: string[] = [];
  for (const m of text.matchAll(/private-mark-([A-Za-z0-9_-]{16})/g)) {
    if (m[1] !== c.me?.id && !(entry.shows === 'holder' && m[1] === c.holder.id))
      found.push(`private text of user ${m[1]}`);
  }
  // asked after the request, so a club the caller just joined or left counts as it is now
  const mine = c.me
    ? new Set(
        (
          await t.database.db
            .select({ clubId: memberships.clubId })
            .from(memberships)
            .where(eq(memberships.userId, c.me.id))
        ).map((r) => r.clubId),
      )
    : new Set<string>();
  for (const m of text.matchAll(/club-mark-([A-Za-z0-9_-]{16})/g)) {
    if (!mine.has(m[1]!)) found.push(`text shared only with club ${m[1]}`);
  }
  // a club's own description: its members, and a site admin (moderation)
  for (const m of text.matchAll(/club-about-([A-Za-z0-9_-]{16})/g)) {
    if (!mine.has(m[1]!) && c.role !== 'admin' && entry.shows !== 'club-about')
      found.push(`the description of club ${m[1]}`);
  }
  return [...new Set(found)];
}

describe('authorization matrix: every route × role × scope', () => {
  it.each(cases)('$route [$scope] as $role → $want', async ({ route, scope, role, entry, want }) => {
    const clubId = await w.newClub(scope);
    const me = role === 'anonymous' ? null : w.people[role];
    const holder =
      scope === 'other' ? w.people.neighbour : scope === 'club' ? w.people.clubKeeper : (me ?? w.people.neighbour);
    const c: AccessCase = { role, scope, me, holder, clubId };
    const prepared = (await entry.prepare?.(w, c)) ?? {};
    const vars: Record<string, string> = { clubId, ...prepared.vars };
    const { method, url } = urlOf(route, vars);
    const res = await send(prepared.agent ?? me?.agent ?? t.agent(), method, url, prepared, entry);
    expect({ status: res.status, body: res.status === want ? 'as expected' : res.body }).toEqual({
      status: want,
      body: 'as expected',
    });
    if (res.status >= 400) {
      expect(res.headers['content-type']).toMatch(/application\/json/);
      expect(res.body.error.code).toEqual(expect.any(String));
    }
    const text = /json|text/.test(String(res.headers['content-type'])) ? (res.text ?? '') : '';
    expect(await leaks(text, c, entry)).toEqual([]);
  });
});
