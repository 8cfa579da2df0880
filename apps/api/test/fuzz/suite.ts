import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { eq } from 'drizzle-orm';
import { buildTestApp, type TestApp } from '../helpers';
import { loadAccessTables } from '../access/tables';
import { buildWorld } from '../access/world';
import { send } from '../access/send';
import type { AccessCase, Prepared, Role, Scope } from '../access/types';
import { users } from '../../src/db/schema';

/**
 * Property-based fuzzing of every API route. The route list and a valid request for each come from
 * the access tables (src/routes/<resource>/access.ts), so a new route is fuzzed as soon as it has
 * its matrix entry. From that valid request, fast-check derives hostile ones with the same shape:
 * fields replaced by very long strings, NUL bytes, lone surrogates, SQL and HTML payloads, wrong
 * types, huge numbers, dropped and extra keys, deep nesting; hostile path parameters and query
 * values; and raw bodies that are not valid UTF-8 or not JSON. Not one may answer 500.
 *
 * Fixed seed, bounded count: the same requests every run. The routes are split over two test
 * files (fuzz-1, fuzz-2) so the two halves run side by side; together they send over 10,000.
 */

const SEED = 20_261_201;
const TOTAL_REQUESTS = 10_000;
/** one at a time: concurrent requests on one row are the crash and load tests' business */
const CONCURRENCY = 1;

const hostileStrings = [
  '',
  ' ',
  'a'.repeat(12_000),
  'ü'.repeat(5_000),
  '\u0000',
  'before\u0000after',
  '\uD800',
  'lone \uDFFF surrogate',
  '\uFEFF\u202E\u200B',
  "' OR '1'='1",
  "'; drop table users; --",
  '1; select pg_sleep(0)',
  '" OR ""="',
  '\\',
  '%00',
  '%',
  '<script>alert(1)</script>',
  '<img src=x onerror=alert(1)>',
  '{{7*7}}',
  '${jndi:ldap://x}',
  '../../../../etc/passwd',
  '__proto__',
  'constructor',
  'NaN',
  '-1',
  '1e309',
  '2026-02-30T25:61:00Z',
  '9999-12-31T23:59:59Z',
  '0000-01-01',
];
const hostileString = fc.oneof(
  { weight: 3, arbitrary: fc.constantFrom(...hostileStrings) },
  { weight: 1, arbitrary: fc.string({ unit: 'binary', maxLength: 40 }) },
  { weight: 1, arbitrary: fc.string({ maxLength: 40 }) },
);
const hostileScalar: fc.Arbitrary<unknown> = fc.oneof(
  { weight: 4, arbitrary: hostileString },
  { weight: 1, arbitrary: fc.integer() },
  { weight: 1, arbitrary: fc.double() },
  {
    weight: 1,
    arbitrary: fc.constantFrom(
      0,
      -1,
      1e308,
      -1e308,
      Number.MAX_SAFE_INTEGER + 2,
      2 ** 31,
      0.1 + 0.2,
      true,
      false,
      null,
    ),
  },
);

/** Percent-encoding that also writes lone surrogates (as the invalid UTF-8 a hostile client sends). */
function encodeLoose(value: string): string {
  let out = '';
  for (let i = 0; i < value.length; i++) {
    const c = value.charCodeAt(i);
    const pair = c >= 0xd800 && c <= 0xdbff && i + 1 < value.length && (value.charCodeAt(i + 1) & 0xfc00) === 0xdc00;
    if (pair) {
      out += encodeURIComponent(value.slice(i, i + 2));
      i += 1;
    } else if (c >= 0xd800 && c <= 0xdfff) {
      out += [0xe0 | (c >> 12), 0x80 | ((c >> 6) & 0x3f), 0x80 | (c & 0x3f)]
        .map((b) => `%${b.toString(16).toUpperCase()}`)
        .join('');
    } else out += encodeURIComponent(value[i]!);
  }
  return out;
}

function urlWith(
  route: string,
  vars: Record<string, string>,
  query: Record<string, unknown>,
): { method: string; url: string } {
  const [method, template] = route.split(' ') as [string, string];
  const path = template.replace(/:(\w+)/g, (_, name: string) => encodeLoose(vars[name] ?? ''));
  const pairs = Object.entries(query).flatMap(([k, v]) =>
    (Array.isArray(v) ? v : [v]).map((x) => `${encodeLoose(k)}=${encodeLoose(String(x))}`),
  );
  return { method, url: pairs.length ? `${path}?${pairs.join('&')}` : path };
}

const isObject = (v: unknown): v is Record<string, unknown> => typeof v === 'object' && v !== null && !Array.isArray(v);

/** Requests shaped like `v`, with parts replaced, dropped, added or nested too deep. */
function mutate(v: unknown, depth = 0): fc.Arbitrary<unknown> {
  const options: fc.WeightedArbitrary<unknown>[] = [
    { weight: 3, arbitrary: fc.constant(v) },
    { weight: 2, arbitrary: hostileScalar },
    { weight: 1, arbitrary: fc.constantFrom<unknown>({}, [], { a: { b: { c: { d: { e: [[[[[]]]]] } } } } }) },
  ];
  if (depth < 4 && Array.isArray(v)) {
    options.push({ weight: 3, arbitrary: fc.array(mutate(v[0] ?? 'x', depth + 1), { maxLength: 4 }) });
    options.push({ weight: 1, arbitrary: fc.constant(Array.from({ length: 1_000 }, () => v[0] ?? 'x')) });
  }
  if (depth < 4 && isObject(v)) {
    const keys = Object.keys(v);
    const shape = Object.fromEntries(keys.map((k) => [k, mutate(v[k], depth + 1)]));
    options.push({
      weight: 6,
      arbitrary: fc
        .tuple(
          fc.record(shape, { requiredKeys: [] }),
          fc.dictionary(
            fc.constantFrom('__proto__', 'constructor', 'extra', 'id', 'ownerUserId', 'role'),
            hostileScalar,
            {
              maxKeys: 2,
            },
          ),
        )
        .map(([kept, extra]) => ({ ...kept, ...extra })),
    });
  }
  return fc.oneof(...options);
}

/** Query values as a browser would send them: strings, repeated keys, or nothing. */
function mutateQuery(q: Record<string, string> | undefined): fc.Arbitrary<Record<string, unknown> | undefined> {
  const base = q ?? {};
  const keys = [...new Set([...Object.keys(base), 'limit', 'offset', 'sort', 'q', 'page'])];
  return fc.record(
    Object.fromEntries(
      keys.map((k) => [
        k,
        fc.oneof(
          fc.constant(base[k] ?? '1'),
          hostileString,
          fc.array(hostileString, { minLength: 2, maxLength: 3 }),
          fc.constantFrom('-1', '0', '99999999999', '1.5', 'abc'),
        ),
      ]),
    ),
    { requiredKeys: [] },
  );
}

/** A raw body that is not valid UTF-8, not JSON, or JSON of the wrong kind. */
const rawBodies = fc.constantFrom(
  Buffer.from([0x7b, 0x22, 0x61, 0x22, 0x3a, 0x22, 0xff, 0xfe, 0xc0, 0xaf, 0x22, 0x7d]), // {"a":"<bad bytes>"}
  Buffer.from([0xc3, 0x28, 0xa0, 0xa1]),
  Buffer.from('{"a":'),
  Buffer.from('[1,2,3]'),
  Buffer.from('"just a string"'),
  Buffer.from('null'),
  Buffer.from('{"a":1,"a":2}'),
  Buffer.from(`${'['.repeat(5_000)}${']'.repeat(5_000)}`),
  Buffer.from('{"__proto__":{"admin":true}}'),
);

const { entries } = await loadAccessTables();
const allRoutes = [...entries];
const perRoute = Math.ceil(TOTAL_REQUESTS / allRoutes.length);

/** Fuzzes every `of`-th route starting at `shard`. */
export function defineFuzz(shard: number, of: number) {
  const routes = allRoutes.filter((_, i) => i % of === shard);

  let t: TestApp;
  let w: Awaited<ReturnType<typeof buildWorld>>;
  let ownerHash: string;
  let sent = 0;
  const fiveHundreds: string[] = [];

  beforeAll(async () => {
    t = await buildTestApp({ LOG_LEVEL: 'silent' });
    w = await buildWorld(t);
    const [row] = await t.database.db.select().from(users).where(eq(users.id, w.people.owner.id));
    ownerHash = row!.passwordHash;
  });
  afterAll(async () => {
    await t?.close();
  });

  /** Puts the fuzzing person back as they were: a route may have changed their password or ended the session. */
  async function restoreOwner() {
    await t.database.db.update(users).set({ passwordHash: ownerHash }).where(eq(users.id, w.people.owner.id));
    const me = await w.people.owner.agent.get('/api/auth/me');
    if (me.status !== 200) w.people.owner.agent = await w.freshSession(w.people.owner);
  }

  describe('fuzzing every route with hostile input', () => {
    it.each(routes.map(([route, { entry }]) => ({ route, entry, i: allRoutes.findIndex(([r]) => r === route) })))(
      '$route never answers 500',
      async ({ route, entry, i }) => {
        const scopes = Object.keys(entry.expect) as Scope[];
        const scope = (['own', 'none', 'club', 'other'] as const).find((s) => scopes.includes(s))!;
        const role: Role = 'owner';
        const clubId = await w.newClub(scope);
        const c: AccessCase = {
          role,
          scope,
          me: w.people.owner,
          holder: scope === 'club' ? w.people.clubKeeper : w.people.owner,
          clubId,
        };
        const valid: Prepared = (await entry.prepare?.(w, c)) ?? {};
        const vars: Record<string, string> = { clubId, ...valid.vars };
        const validBody = valid.body ?? entry.body;
        const agent = valid.agent ?? w.people.owner.agent;
        const varNames = [...route.matchAll(/:(\w+)/g)].map((m) => m[1]!);

        const inputs = fc.sample(
          fc.record({
            body: validBody !== undefined ? mutate(validBody) : fc.option(mutate({ x: 'y' }), { nil: undefined }),
            raw: fc.option(rawBodies, { freq: 8, nil: undefined }),
            query: mutateQuery(valid.query),
            vars: fc.record(
              Object.fromEntries(
                varNames.map((n) => [n, fc.oneof({ weight: 3, arbitrary: fc.constant(vars[n]!) }, hostileString)]),
              ),
            ),
          }),
          { seed: SEED + i, numRuns: perRoute },
        );
        const failures: string[] = [];
        const one = async (input: (typeof inputs)[number]) => {
          const { method, url } = urlWith(
            route,
            { ...vars, ...(input.vars as Record<string, string>) },
            input.query ?? {},
          );
          let res;
          if (valid.attach) {
            res = await send(agent, method, url, { ...valid, query: undefined });
          } else {
            let call = agent[method.toLowerCase() as 'post'](url);
            const body = input.raw ?? (input.body === undefined ? undefined : JSON.stringify(input.body));
            if (body !== undefined) call = call.set('Content-Type', 'application/json');
            res = await (body !== undefined ? call.send(body) : call);
          }
          sent += 1;
          if (res.status >= 500) {
            const shown = JSON.stringify({
              url: url.slice(0, 300),
              body: JSON.stringify(input.body ?? input.raw?.toString('latin1')).slice(0, 300),
            });
            failures.push(`${route} → ${res.status} for ${shown}`);
          }
        };
        // a few requests at a time, as a busy club night would send them; the order is fixed by the seed
        for (let k = 0; k < inputs.length; k += CONCURRENCY)
          await Promise.all(inputs.slice(k, k + CONCURRENCY).map(one));
        fiveHundreds.push(...failures);
        expect(failures).toEqual([]);
        await restoreOwner();
      },
      120_000,
    );

    it(`sent its share (${routes.length * perRoute} of at least ${TOTAL_REQUESTS}) and got no 500`, () => {
      expect(fiveHundreds).toEqual([]);
      expect(sent).toBe(routes.length * perRoute);
      expect(allRoutes.length * perRoute).toBeGreaterThanOrEqual(TOTAL_REQUESTS);
    });
  });
}
