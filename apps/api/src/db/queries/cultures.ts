import { and, asc, desc, eq, gte, ilike, inArray, lte, or, sql, type SQL } from 'drizzle-orm';
import type { CultureState, CultureForm, CultureSort } from '@barmkeep/schemas';
import type { Db } from '../client';
import {
  cultureEvents,
  culturePhotos,
  cultures,
  users,
  type CultureEventRow,
  type CultureInsert,
  type CulturePhotoRow,
  type CultureRow,
} from '../schema';

type Executor = Pick<Db, 'select' | 'insert' | 'update' | 'execute' | 'delete'>;

export async function insertCultures(db: Executor, values: CultureInsert[]): Promise<CultureRow[]> {
  if (values.length === 0) return [];
  return db.insert(cultures).values(values).returning();
}

export async function findCultureById(db: Executor, id: string): Promise<CultureRow | undefined> {
  const [row] = await db.select().from(cultures).where(eq(cultures.id, id)).limit(1);
  return row;
}

/** Locks the row for the rest of the transaction (state changes and events on one culture queue up). */
export async function findCultureForUpdate(db: Executor, id: string): Promise<CultureRow | undefined> {
  const [row] = await db.select().from(cultures).where(eq(cultures.id, id)).limit(1).for('update');
  return row;
}

export async function findCulturesByIds(db: Executor, ids: string[]): Promise<CultureRow[]> {
  if (ids.length === 0) return [];
  return db.select().from(cultures).where(inArray(cultures.id, ids));
}

export async function updateCultureRow(
  db: Executor,
  id: string,
  values: Partial<Omit<CultureInsert, 'id' | 'ownerUserId' | 'createdAt'>>,
): Promise<CultureRow | undefined> {
  const [row] = await db
    .update(cultures)
    .set({ ...values, updatedAt: new Date() })
    .where(eq(cultures.id, id))
    .returning();
  return row;
}

export interface CultureListFilter {
  /** the access predicate from services/cultureAccess.ts */
  visible: SQL;
  q?: string;
  states?: CultureState[];
  forms?: CultureForm[];
  strain?: string;
  tag?: string;
  madeAfter?: Date;
  madeBefore?: Date;
}

const escapeLike = (s: string) => s.replace(/[\\%_]/g, (c) => `\\${c}`);

function listWhere(f: CultureListFilter): SQL {
  const parts: (SQL | undefined)[] = [f.visible];
  if (f.states?.length) parts.push(inArray(cultures.state, f.states));
  if (f.forms?.length) parts.push(inArray(cultures.form, f.forms));
  if (f.strain) parts.push(ilike(cultures.strainName, `%${escapeLike(f.strain)}%`));
  if (f.tag) parts.push(sql`${cultures.tags} @> array[${f.tag.toLowerCase()}]::text[]`);
  if (f.madeAfter) parts.push(gte(cultures.madeAt, f.madeAfter));
  if (f.madeBefore) parts.push(lte(cultures.madeAt, f.madeBefore));
  if (f.q) {
    const like = `%${escapeLike(f.q)}%`;
    parts.push(
      or(
        ilike(cultures.strainName, like),
        ilike(cultures.labelCode, like),
        ilike(cultures.species, like),
        ilike(cultures.locationLabel, like),
        ilike(cultures.notes, like),
        sql`exists (select 1 from unnest(${cultures.tags}) t where t ilike ${like})`,
      ),
    );
  }
  return and(...parts)!;
}

const SQL_SORTS: Record<Exclude<CultureSort, 'viability'>, (dir: 'asc' | 'desc') => SQL[]> = {
  attention: (d) => [
    d === 'asc' ? sql`${cultures.attentionDueAt} asc nulls last` : sql`${cultures.attentionDueAt} desc nulls last`,
    asc(cultures.id),
  ],
  name: (d) => [
    d === 'asc' ? sql`lower(${cultures.strainName}) asc` : sql`lower(${cultures.strainName}) desc`,
    asc(cultures.id),
  ],
  made: (d) => [d === 'asc' ? asc(cultures.madeAt) : desc(cultures.madeAt), asc(cultures.id)],
  generation: (d) => [d === 'asc' ? asc(cultures.generation) : desc(cultures.generation), asc(cultures.id)],
  state: (d) => [d === 'asc' ? asc(cultures.state) : desc(cultures.state), asc(cultures.id)],
  form: (d) => [d === 'asc' ? asc(cultures.form) : desc(cultures.form), asc(cultures.id)],
};

/** What a library row needs; the list leaves the JSON details and notes in the table. */
export const summaryColumns = {
  id: cultures.id,
  labelCode: cultures.labelCode,
  ownerUserId: cultures.ownerUserId,
  strainName: cultures.strainName,
  species: cultures.species,
  tags: cultures.tags,
  form: cultures.form,
  origin: cultures.origin,
  state: cultures.state,
  generation: cultures.generation,
  parentId: cultures.parentId,
  locationLabel: cultures.locationLabel,
  storageTempC: cultures.storageTempC,
  madeAt: cultures.madeAt,
  attentionDueAt: cultures.attentionDueAt,
  measuredAt: cultures.measuredAt,
  measuredViability: cultures.measuredViability,
  suspect: cultures.suspect,
};
export type CultureSummaryRow = Pick<CultureRow, keyof typeof summaryColumns>;

type PageSpec = { sort: Exclude<CultureSort, 'viability'>; dir: 'asc' | 'desc'; limit: number; offset: number };

/** The number of cultures matching `where`, counted. */
const countOf = (where: SQL) => sql`(select count(*) from ${cultures} where ${where})`;

/**
 * A page in the given order, `total` (a scalar SQL expression) carried on every row; limit and
 * offset are added by the caller.
 */
const pageQuery = (db: Executor, where: SQL, total: SQL, sort: PageSpec['sort'], dir: PageSpec['dir']) =>
  db
    .select({ ...summaryColumns, total: sql<number>`${total}`.mapWith(Number) })
    .from(cultures)
    .where(where)
    .orderBy(...SQL_SORTS[sort](dir));

/**
 * Strips the carried total off the rows. A page past the end has no row to carry it: then the
 * matching cultures (`countWhere`) are counted alone.
 */
async function pageResult(
  db: Executor,
  rows: (CultureSummaryRow & { total: number })[],
  page: PageSpec,
  countWhere: SQL,
): Promise<{ rows: CultureSummaryRow[]; total: number }> {
  if (rows.length === 0 && page.offset > 0) return { rows: [], total: await countCultures(db, countWhere) };
  return { rows: rows.map(({ total: _total, ...row }) => row as CultureSummaryRow), total: rows[0]?.total ?? 0 };
}

async function countCultures(db: Executor, where: SQL) {
  const [c] = await db
    .select({ n: sql<number>`count(*)`.mapWith(Number) })
    .from(cultures)
    .where(where);
  return c?.n ?? 0;
}

/**
 * One page of cultures and the total, in ONE statement: the page reads only its rows through the
 * (owner, attention, id) index, the total is a scalar subquery (an index-only scan on a settled
 * table), so a page costs one round trip. `count(*) over ()` would instead carry every matching
 * row through a window.
 */
export async function listCulturesPage(
  db: Executor,
  f: CultureListFilter,
  page: PageSpec,
): Promise<{ rows: CultureSummaryRow[]; total: number }> {
  const where = listWhere(f);
  const rows = await pageQuery(db, where, countOf(where), page.sort, page.dir).limit(page.limit).offset(page.offset);
  return pageResult(db, rows, page, where);
}

const preparedPages = new WeakMap<object, Map<string, ReturnType<typeof preparePage>>>();

function preparePage(db: Db, visible: SQL, total: SQL, sort: PageSpec['sort'], dir: PageSpec['dir']) {
  return pageQuery(db, visible, total, sort, dir)
    .limit(sql.placeholder('limit'))
    .offset(sql.placeholder('offset'))
    .prepare(`cultures_page_${sort}_${dir}`);
}

/**
 * The unfiltered library page — what everyone opens — as a named prepared statement: drizzle builds
 * it once per sort and direction, and PostgreSQL parses and plans it once per connection.
 * `access.template` is the access predicate with the actor as the placeholder `actorId`
 * (services/cultureAccess.ts `visibleCulturesTemplate`, the same object on every call) and
 * `access.totalTemplate` the number of cultures it matches, read from a counter rather than counted
 * (`visibleCulturesTotalTemplate`); `access.visible` is the predicate for this actor, for the rare
 * page past the end.
 */
export async function listCulturesDefaultPage(
  db: Db,
  access: { template: SQL; totalTemplate: SQL; actorId: string; visible: SQL },
  page: PageSpec,
): Promise<{ rows: CultureSummaryRow[]; total: number }> {
  let byDb = preparedPages.get(db);
  if (!byDb) preparedPages.set(db, (byDb = new Map()));
  const key = `${page.sort}:${page.dir}`;
  let statement = byDb.get(key);
  if (!statement)
    byDb.set(key, (statement = preparePage(db, access.template, access.totalTemplate, page.sort, page.dir)));
  const rows = await statement.execute({ actorId: access.actorId, limit: page.limit, offset: page.offset });
  return pageResult(db, rows, page, access.visible);
}

/** The few columns a viability projection needs, for every culture matching the filter. */
export async function listCultureProjectionInputs(db: Executor, f: CultureListFilter) {
  return db
    .select({
      id: cultures.id,
      form: cultures.form,
      madeAt: cultures.madeAt,
      storageTempC: cultures.storageTempC,
      measuredAt: cultures.measuredAt,
      measuredViability: cultures.measuredViability,
    })
    .from(cultures)
    .where(listWhere(f));
}

export async function listAllCultures(db: Executor, visible: SQL): Promise<CultureRow[]> {
  return db.select().from(cultures).where(visible).orderBy(asc(cultures.createdAt), asc(cultures.id));
}

export type LineageRow = {
  id: string;
  parent_id: string | null;
  depth: number;
  strain_name: string;
  generation: number;
  state: CultureState;
  form: CultureForm;
  suspect: boolean;
  owner_user_id: string;
  owner_club_id: string | null;
  visibility: 'private' | 'club';
  owner_name: string | null;
};

/**
 * The whole lineage a culture belongs to, from its founding culture down, in ONE query: a recursive
 * CTE climbs to the root, a second one walks every descendant of the root. Depth is from the root.
 */
export async function lineageOf(db: Executor, cultureId: string): Promise<LineageRow[]> {
  const result = await db.execute<LineageRow>(sql`
    with recursive up as (
      select id, parent_id, 0 as hops from cultures where id = ${cultureId}
      union all
      select c.id, c.parent_id, up.hops + 1 from cultures c join up on c.id = up.parent_id
      where up.hops < 100000
    ),
    root as (select id from up where parent_id is null limit 1),
    down as (
      select c.id, c.parent_id, 0 as depth from cultures c where c.id = (select id from root)
      union all
      select c.id, c.parent_id, down.depth + 1 from cultures c join down on c.parent_id = down.id
      where down.depth < 100000
    )
    select c.id, c.parent_id, down.depth, c.strain_name, c.generation, c.state, c.form, c.suspect,
           c.owner_user_id, c.owner_club_id, c.visibility, u.name as owner_name
    from down
    join cultures c on c.id = down.id
    left join users u on u.id = c.owner_user_id
    order by down.depth, c.made_at, c.id
  `);
  return result.rows;
}

/** Every descendant of a culture (not the culture itself), nearest first. */
export async function descendantsOf(db: Executor, cultureId: string) {
  const result = await db.execute<{
    id: string;
    parent_id: string;
    depth: number;
    strain_name: string;
    generation: number;
    state: CultureState;
    suspect: boolean;
    owner_user_id: string;
    owner_club_id: string | null;
    visibility: 'private' | 'club';
  }>(sql`
    with recursive down as (
      select id, 1 as depth from cultures where parent_id = ${cultureId}
      union all
      select c.id, down.depth + 1 from cultures c join down on c.parent_id = down.id
      where down.depth < 100000
    )
    select c.id, c.parent_id, down.depth, c.strain_name, c.generation, c.state, c.suspect,
           c.owner_user_id, c.owner_club_id, c.visibility
    from down join cultures c on c.id = down.id
    order by down.depth, c.made_at, c.id
  `);
  return result.rows;
}

/** Adds `delta` to the generation of a culture and every descendant, in one statement. */
export async function shiftSubtreeGeneration(db: Executor, cultureId: string, delta: number): Promise<number> {
  if (delta === 0) return 0;
  const result = await db.execute(sql`
    with recursive down as (
      select id from cultures where id = ${cultureId}
      union all
      select c.id from cultures c join down on c.parent_id = down.id
    )
    update cultures set generation = generation + ${delta}, updated_at = now()
    where id in (select id from down)
  `);
  return result.rowCount ?? 0;
}

export async function markSuspect(
  db: Executor,
  ids: string[],
  values: { fromCultureId: string; since: Date },
): Promise<void> {
  if (ids.length === 0) return;
  await db
    .update(cultures)
    .set({
      suspect: true,
      suspectFromCultureId: values.fromCultureId,
      suspectSince: values.since,
      updatedAt: new Date(),
    })
    .where(inArray(cultures.id, ids));
}

// ---------------------------------------------------------------- events

export async function insertEvents(
  db: Executor,
  values: (typeof cultureEvents.$inferInsert)[],
): Promise<CultureEventRow[]> {
  if (values.length === 0) return [];
  return db.insert(cultureEvents).values(values).returning();
}

export async function findEventById(db: Executor, id: string): Promise<CultureEventRow | undefined> {
  const [row] = await db.select().from(cultureEvents).where(eq(cultureEvents.id, id)).limit(1);
  return row;
}

export async function isEventSuperseded(db: Executor, id: string): Promise<boolean> {
  const [row] = await db
    .select({ id: cultureEvents.id })
    .from(cultureEvents)
    .where(eq(cultureEvents.supersedesEventId, id))
    .limit(1);
  return Boolean(row);
}

export async function listEventsOfCulture(db: Executor, cultureId: string) {
  const later = sql.raw('later');
  return db
    .select({
      event: cultureEvents,
      authorName: users.name,
      supersededBy: sql<
        string | null
      >`(select ${later}.id from culture_events ${later} where ${later}.supersedes_event_id = ${cultureEvents.id} limit 1)`,
    })
    .from(cultureEvents)
    .leftJoin(users, eq(users.id, cultureEvents.authorUserId))
    .where(eq(cultureEvents.cultureId, cultureId))
    .orderBy(asc(cultureEvents.occurredAt), asc(cultureEvents.recordedAt), asc(cultureEvents.id));
}

/** Effective (not superseded) count events of a culture, newest first. */
export async function effectiveCounts(db: Executor, cultureId: string): Promise<CultureEventRow[]> {
  return db
    .select()
    .from(cultureEvents)
    .where(
      and(
        eq(cultureEvents.cultureId, cultureId),
        eq(cultureEvents.kind, 'counted'),
        sql`not exists (select 1 from culture_events s where s.supersedes_event_id = ${cultureEvents.id})`,
      ),
    )
    .orderBy(desc(cultureEvents.occurredAt), desc(cultureEvents.recordedAt));
}

export async function listEventsForCultures(db: Executor, cultureIds: string[]): Promise<CultureEventRow[]> {
  if (cultureIds.length === 0) return [];
  return db
    .select()
    .from(cultureEvents)
    .where(inArray(cultureEvents.cultureId, cultureIds))
    .orderBy(asc(cultureEvents.recordedAt), asc(cultureEvents.id));
}

export async function findUserNames(db: Executor, ids: string[]): Promise<Map<string, string>> {
  const unique = [...new Set(ids.filter(Boolean))];
  if (unique.length === 0) return new Map();
  const rows = await db.select({ id: users.id, name: users.name }).from(users).where(inArray(users.id, unique));
  return new Map(rows.map((r) => [r.id, r.name]));
}

// ---------------------------------------------------------------- photos

export async function insertPhoto(db: Executor, values: typeof culturePhotos.$inferInsert): Promise<CulturePhotoRow> {
  const [row] = await db.insert(culturePhotos).values(values).returning();
  return row!;
}

export async function listPhotosOfCulture(db: Executor, cultureId: string): Promise<CulturePhotoRow[]> {
  return db
    .select()
    .from(culturePhotos)
    .where(eq(culturePhotos.cultureId, cultureId))
    .orderBy(desc(culturePhotos.createdAt), desc(culturePhotos.id));
}

export async function insertPhotos(db: Executor, values: (typeof culturePhotos.$inferInsert)[]): Promise<void> {
  if (values.length === 0) return;
  await db.insert(culturePhotos).values(values);
}

/** Every photo of these cultures, oldest first (the order a backup lists them in). */
export async function listPhotosForCultures(db: Executor, cultureIds: string[]): Promise<CulturePhotoRow[]> {
  if (cultureIds.length === 0) return [];
  return db
    .select()
    .from(culturePhotos)
    .where(inArray(culturePhotos.cultureId, cultureIds))
    .orderBy(asc(culturePhotos.createdAt), asc(culturePhotos.id));
}

export async function findPhoto(
  db: Executor,
  cultureId: string,
  photoId: string,
): Promise<CulturePhotoRow | undefined> {
  const [row] = await db
    .select()
    .from(culturePhotos)
    .where(and(eq(culturePhotos.id, photoId), eq(culturePhotos.cultureId, cultureId)))
    .limit(1);
  return row;
}

export async function deletePhotoRow(db: Executor, photoId: string): Promise<void> {
  await db.delete(culturePhotos).where(eq(culturePhotos.id, photoId));
}
