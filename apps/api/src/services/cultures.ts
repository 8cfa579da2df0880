import {
  CORRECTABLE_EVENT_KINDS,
  IN_USE_STATES,
  type CultureCreateData,
  type CultureEventCreateData,
  type CultureListQuery,
  type CultureOriginDetails,
  type CultureOriginDetailsData,
  type CultureState,
  type CultureUpdateInput,
} from '@barmkeep/schemas';
import { hemocytometerCount, viabilityFromStain, SQUARE_VOLUME_ML } from '@barmkeep/core';
import type { z } from 'zod';
import type {
  CultureListDto,
  CultureParentDto,
  CultureSplitSchema,
  CultureStateChangeSchema,
  CultureQuarantineSchema,
} from '@barmkeep/schemas';
import type { Db } from '../db/client';
import type { CultureEventRow, CultureInsert, CultureRow } from '../db/schema';
import {
  descendantsOf,
  effectiveCounts,
  findCultureById,
  findCultureForUpdate,
  findCulturesByIds,
  findEventById,
  findUserNames,
  insertCultures,
  insertEvents,
  isEventSuperseded,
  lineageOf,
  listCultureProjectionInputs,
  listCulturesDefaultPage,
  listCulturesPage,
  listEventsOfCulture,
  markSuspect,
  shiftSubtreeGeneration,
  updateCultureRow,
  type CultureListFilter,
} from '../db/queries/cultures';
import { conflict, validationFailed } from '../lib/errors';
import { newId } from '../lib/ids';
import {
  assertCanEdit,
  assertUsableParent,
  canEdit,
  canSeeInLineage,
  canView,
  loadCultureForView,
  loadLineageTies,
  visibleCulturesTemplate,
  visibleCulturesTotalTemplate,
  visibleCulturesWhere,
  type Actor,
} from './cultureAccess';
import { attentionOf, healthOf, projectedViabilityOf, viabilitySeries } from './cultureHealth';
import { deriveGeneration, PARENT_REQUIRED_ORIGINS, ROOT_ONLY_ORIGINS } from './cultureLineage';
import { alertLineage } from './lineageAlerts';
import { presentCultureDetail, presentCultureSummary, presentEvent, presentLineageNode } from '../presenters/culture';
import { inTransaction, type ServiceContext } from './context';
import { libraryOwner } from '../cache/caches';

const MS_PER_DAY = 86_400_000;
const FUTURE_SKEW_MS = 5 * 60_000;
type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];

/** Stored JSON has ISO strings where the parsed input had dates. */
function storedOrigin(o: CultureOriginDetailsData): CultureOriginDetails {
  const out: Record<string, unknown> = {};
  for (const [k, v] of Object.entries(o)) if (v !== undefined) out[k] = v instanceof Date ? v.toISOString() : v;
  return out as CultureOriginDetails;
}

function assertNotFuture(at: Date, now: Date, field: string) {
  if (at.getTime() > now.getTime() + FUTURE_SKEW_MS)
    throw validationFailed({ [field]: ['This date is in the future'] });
}

function isPgError(err: unknown, code: string, constraint?: string): boolean {
  const e = err as { code?: string; constraint?: string; cause?: unknown } | undefined;
  if (!e) return false;
  if (e.code === code && (!constraint || e.constraint === constraint)) return true;
  return e.cause ? isPgError(e.cause, code, constraint) : false;
}

const CYCLE_MESSAGE = 'That culture descends from this one; a culture cannot be its own ancestor';

// ---------------------------------------------------------------- create

export async function createCulture(ctx: ServiceContext, actor: Actor, input: CultureCreateData): Promise<CultureRow> {
  const now = ctx.now();
  assertNotFuture(input.madeAt, now, 'body.madeAt');
  return ctx.db.transaction(async (tx) => {
    let parent: CultureRow | undefined;
    if (input.parentId) {
      parent = assertUsableParent(actor, await findCultureForUpdate(tx, input.parentId));
      if (parent.state === 'discarded') {
        throw validationFailed({ 'body.parentId': ['That culture was discarded; it cannot be re-cultured'] });
      }
      if (input.madeAt.getTime() < parent.madeAt.getTime() - MS_PER_DAY) {
        throw validationFailed({ 'body.madeAt': ['This is before the parent culture was made'] });
      }
    }
    const inheritsSuspicion = parent ? parent.suspect || parent.state === 'quarantined' : false;
    const values: CultureInsert = {
      id: newId(),
      ownerUserId: actor.id,
      parentId: parent?.id ?? null,
      generation: deriveGeneration(parent, input.origin.origin, input.generation),
      strainName: input.strainName,
      species: input.species || null,
      tags: input.tags,
      origin: input.origin.origin,
      originDetails: storedOrigin(input.origin),
      form: input.form,
      amount: input.amount,
      locationLabel: input.locationLabel,
      storageTempC: input.storageTempC,
      madeAt: input.madeAt,
      state: input.state,
      stateChangedAt: now,
      stateChangedBy: actor.id,
      notes: input.notes,
      ...(inheritsSuspicion && parent
        ? { suspect: true, suspectFromCultureId: parent.suspectFromCultureId ?? parent.id, suspectSince: now }
        : {}),
    };
    values.attentionDueAt = attentionOf(values as CultureRow)?.dueAt ?? null;
    const [row] = await insertCultures(tx, [values]);
    const events: (typeof import('../db/schema').cultureEvents.$inferInsert)[] = [
      {
        id: newId(),
        cultureId: row!.id,
        authorUserId: actor.id,
        kind: 'created',
        occurredAt: input.madeAt,
        data: { origin: input.origin.origin, parentId: parent?.id ?? null, generation: row!.generation },
      },
    ];
    if (parent) {
      events.push({
        id: newId(),
        cultureId: parent.id,
        authorUserId: actor.id,
        kind: 'recultured',
        occurredAt: input.madeAt,
        data: { childId: row!.id, origin: input.origin.origin },
      });
    }
    await insertEvents(tx, events);
    return row!;
  });
}

// ---------------------------------------------------------------- read

function listFilter(actor: Actor, q: CultureListQuery, now: Date): CultureListFilter {
  return {
    visible: visibleCulturesWhere(actor),
    q: q.q || undefined,
    states: q.state,
    forms: q.form,
    strain: q.strain || undefined,
    tag: q.tag || undefined,
    // age in whole days: minAgeDays ≤ floor(age) ≤ maxAgeDays
    madeBefore: q.minAgeDays !== undefined ? new Date(now.getTime() - q.minAgeDays * MS_PER_DAY) : undefined,
    madeAfter: q.maxAgeDays !== undefined ? new Date(now.getTime() - (q.maxAgeDays + 1) * MS_PER_DAY + 1) : undefined,
  };
}

/**
 * A page of the library. The unfiltered pages — what people open and come back to, in any order —
 * are kept in memory (ctx.caches) until one of the person's cultures changes or the cache's time
 * runs out; filtered pages are always read afresh.
 */
export async function listCultures(ctx: ServiceContext, actor: Actor, q: CultureListQuery): Promise<CultureListDto> {
  const now = ctx.now();
  const filter = listFilter(actor, q, now);
  const unfiltered =
    q.viabilityMinPct === undefined &&
    q.viabilityMaxPct === undefined &&
    Object.entries(filter).every(
      ([k, v]) => k === 'visible' || v === undefined || (Array.isArray(v) && v.length === 0),
    );
  const cache = unfiltered ? ctx.caches?.libraryPages : undefined;
  if (!cache) return buildCultureList(ctx, q, now, filter, unfiltered, actor);
  const key = `${actor.id}|${q.sort}|${q.dir}|${q.page}|${q.pageSize}`;
  const hit = cache.get(key);
  if (hit) return hit;
  const ticket = cache.ticket();
  const list = await buildCultureList(ctx, q, now, filter, unfiltered, actor);
  cache.set(key, list, [libraryOwner(actor.id)], ticket);
  return list;
}

async function buildCultureList(
  ctx: ServiceContext,
  q: CultureListQuery,
  now: Date,
  filter: ReturnType<typeof listFilter>,
  unfiltered: boolean,
  actor: Actor,
): Promise<CultureListDto> {
  const offset = (q.page - 1) * q.pageSize;
  const byViability = q.sort === 'viability' || q.viabilityMinPct !== undefined || q.viabilityMaxPct !== undefined;
  if (!byViability) {
    const page = { sort: q.sort as Exclude<typeof q.sort, 'viability'>, dir: q.dir, limit: q.pageSize, offset };
    const { rows, total } = unfiltered
      ? await listCulturesDefaultPage(
          ctx.db,
          {
            template: visibleCulturesTemplate,
            totalTemplate: visibleCulturesTotalTemplate,
            actorId: actor.id,
            visible: filter.visible,
          },
          page,
        )
      : await listCulturesPage(ctx.db, filter, page);
    return { cultures: rows.map((r) => presentCultureSummary(r, now)), page: q.page, pageSize: q.pageSize, total };
  }
  // Projected viability is core's model, not a column: project every matching culture, then page.
  const inputs = await listCultureProjectionInputs(ctx.db, filter);
  let projected = inputs.map((c) => ({ id: c.id, v: projectedViabilityOf(c, now).viability }));
  if (q.viabilityMinPct !== undefined) projected = projected.filter((p) => p.v * 100 >= q.viabilityMinPct!);
  if (q.viabilityMaxPct !== undefined) projected = projected.filter((p) => p.v * 100 <= q.viabilityMaxPct!);
  if (q.sort === 'viability') {
    const sign = q.dir === 'asc' ? 1 : -1;
    projected.sort((a, b) => sign * (a.v - b.v) || (a.id < b.id ? -1 : 1));
    const page = projected.slice(offset, offset + q.pageSize);
    const rows = new Map(
      (
        await findCulturesByIds(
          ctx.db,
          page.map((p) => p.id),
        )
      ).map((r) => [r.id, r]),
    );
    return {
      cultures: page.map((p) => presentCultureSummary(rows.get(p.id)!, now, p.v)),
      page: q.page,
      pageSize: q.pageSize,
      total: projected.length,
    };
  }
  // filtered by viability, sorted by a column: sort the matching ids in SQL order
  const keep = new Map(projected.map((p) => [p.id, p.v]));
  const rows = (await findCulturesByIds(ctx.db, [...keep.keys()])).sort(columnComparator(q.sort, q.dir));
  return {
    cultures: rows.slice(offset, offset + q.pageSize).map((r) => presentCultureSummary(r, now, keep.get(r.id))),
    page: q.page,
    pageSize: q.pageSize,
    total: rows.length,
  };
}

function columnComparator(sort: CultureListQuery['sort'], dir: 'asc' | 'desc') {
  const sign = dir === 'asc' ? 1 : -1;
  const key = (r: CultureRow): number | string => {
    switch (sort) {
      case 'name':
        return r.strainName.toLowerCase();
      case 'made':
        return r.madeAt.getTime();
      case 'generation':
        return r.generation;
      case 'state':
        return r.state;
      case 'form':
        return r.form;
      default:
        return r.attentionDueAt?.getTime() ?? (dir === 'asc' ? Infinity : -Infinity);
    }
  };
  return (a: CultureRow, b: CultureRow) => {
    const ka = key(a);
    const kb = key(b);
    return (ka < kb ? -sign : ka > kb ? sign : 0) || (a.id < b.id ? -1 : 1);
  };
}

export async function getCultureDetail(ctx: ServiceContext, actor: Actor, id: string) {
  const row = await loadCultureForView(ctx.db, actor, id);
  return presentDetail(ctx, actor, row);
}

/**
 * The parent as this actor may see it: openable when it is theirs; its name and keeper when it is
 * a fellow club member's (the same fields the lineage shows them, decision 0040); nothing else.
 */
async function parentAsSeenBy(ctx: ServiceContext, actor: Actor, row: CultureRow): Promise<CultureParentDto | null> {
  if (!row.parentId) return null;
  const parent = await findCultureById(ctx.db, row.parentId);
  if (!parent) return null;
  if (canView(actor, parent)) return { id: parent.id, strainName: parent.strainName, openable: true, keeperName: null };
  if (canSeeInLineage(actor, parent, await loadLineageTies(ctx.db, actor))) {
    const names = await findUserNames(ctx.db, [parent.ownerUserId]);
    return {
      id: parent.id,
      strainName: parent.strainName,
      openable: false,
      keeperName: names.get(parent.ownerUserId) ?? null,
    };
  }
  return { id: parent.id, strainName: null, openable: false, keeperName: null };
}

async function presentDetail(ctx: ServiceContext, actor: Actor, row: CultureRow) {
  const now = ctx.now();
  const [latestCount] = await effectiveCounts(ctx.db, row.id);
  const names = await findUserNames(ctx.db, row.stateChangedBy ? [row.stateChangedBy] : []);
  let suspectFrom: { id: string; strainName: string } | null = null;
  if (row.suspect && row.suspectFromCultureId) {
    const from = row.suspectFromCultureId === row.id ? row : await findCultureById(ctx.db, row.suspectFromCultureId);
    suspectFrom = from ? { id: from.id, strainName: from.strainName } : null;
  }
  return presentCultureDetail(row, now, {
    parent: await parentAsSeenBy(ctx, actor, row),
    health: healthOf(row, now, latestCount),
    stateChangedByName: row.stateChangedBy ? (names.get(row.stateChangedBy) ?? null) : null,
    suspectFrom,
  });
}

export async function getCultureHealthSeries(ctx: ServiceContext, actor: Actor, id: string, days: number) {
  const row = await loadCultureForView(ctx.db, actor, id);
  const now = ctx.now();
  const counts = await effectiveCounts(ctx.db, id);
  const measured = counts
    .map((e) => ({
      at: e.occurredAt.toISOString(),
      result: e.data.result as { viability?: number; viabilityCi95?: [number, number] },
    }))
    .filter((m) => typeof m.result?.viability === 'number')
    .map((m) => ({ at: m.at, viability: m.result.viability!, ci95: m.result.viabilityCi95 ?? null }))
    .reverse();
  return { now: now.toISOString(), series: viabilitySeries(row, now, days), measured };
}

export async function listCultureEvents(ctx: ServiceContext, actor: Actor, id: string) {
  await loadCultureForView(ctx.db, actor, id);
  const rows = await listEventsOfCulture(ctx.db, id);
  return rows.map((r) => presentEvent(r.event, r.authorName, r.supersededBy));
}

export async function getLineage(ctx: ServiceContext, actor: Actor, id: string) {
  await loadCultureForView(ctx.db, actor, id);
  const rows = await lineageOf(ctx.db, id);
  // club ties matter only when someone else keeps part of the tree
  const ties = rows.some((r) => r.owner_user_id !== actor.id)
    ? await loadLineageTies(ctx.db, actor)
    : { clubIds: new Set<string>(), coMemberIds: new Set<string>() };
  const nodes = rows.map((r) => {
    const c = { ownerUserId: r.owner_user_id, ownerClubId: r.owner_club_id, visibility: r.visibility };
    return presentLineageNode(r, canView(actor, c) ? 'full' : canSeeInLineage(actor, c, ties) ? 'path' : 'hidden');
  });
  return { focusId: id, rootId: rows[0]?.id ?? id, nodes };
}

// ---------------------------------------------------------------- update

const DETAIL_LABELS = { strainName: 'strain name', species: 'species', tags: 'tags', notes: 'notes' } as const;
type DetailField = keyof typeof DETAIL_LABELS;

/**
 * Descriptive fields and the parent. The row keeps only the latest values, so every change is also
 * written to the append-only handling log (a "note" with `data.change`), as a parent correction is:
 * the history of what a culture was called never disappears.
 */
export async function updateCulture(ctx: ServiceContext, actor: Actor, id: string, input: CultureUpdateInput) {
  try {
    return await inTransaction(ctx, async (t) => {
      const tx = t.db;
      const row = assertCanEdit(actor, await findCultureForUpdate(tx, id));
      const next: Partial<Pick<CultureRow, DetailField>> = {};
      if (input.strainName !== undefined) next.strainName = input.strainName;
      if (input.species !== undefined) next.species = input.species || null;
      if (input.tags !== undefined) next.tags = input.tags as string[];
      if (input.notes !== undefined) next.notes = input.notes;
      const changed = (Object.keys(next) as DetailField[]).filter(
        (k) => JSON.stringify(next[k]) !== JSON.stringify(row[k]),
      );
      if (input.parentId !== undefined && input.parentId !== row.parentId) {
        await reparent(tx, ctx, actor, row, input.parentId);
      }
      if (!changed.length) return (await findCultureById(tx, id))!;
      const set = Object.fromEntries(changed.map((k) => [k, next[k]])) as Partial<CultureInsert>;
      const updated = await updateCultureRow(tx, id, set);
      await insertEvents(tx, [
        {
          id: newId(),
          cultureId: row.id,
          authorUserId: actor.id,
          kind: 'note',
          occurredAt: ctx.now(),
          notes: `Details corrected: ${changed.map((k) => DETAIL_LABELS[k]).join(', ')}`,
          data: {
            change: 'details',
            from: Object.fromEntries(changed.map((k) => [k, row[k]])),
            to: Object.fromEntries(changed.map((k) => [k, next[k]])),
          },
        },
      ]);
      return updated!;
    });
  } catch (err) {
    if (isPgError(err, '23514', 'cultures_no_cycle')) throw validationFailed({ 'body.parentId': [CYCLE_MESSAGE] });
    throw err;
  }
}

async function reparent(tx: Db, ctx: ServiceContext, actor: Actor, row: CultureRow, parentId: string | null) {
  if (parentId === null) {
    if (PARENT_REQUIRED_ORIGINS.includes(row.origin)) {
      throw validationFailed({ 'body.parentId': ['A re-culture needs the culture it was grown from'] });
    }
  } else {
    if (ROOT_ONLY_ORIGINS.includes(row.origin)) {
      throw validationFailed({
        'body.parentId': ['Bottle dregs and bought yeast start a new lineage; they have no parent'],
      });
    }
    if (parentId === row.id) throw validationFailed({ 'body.parentId': [CYCLE_MESSAGE] });
    const parent = assertUsableParent(actor, await findCultureById(tx, parentId));
    const below = await descendantsOf(tx, row.id);
    if (below.some((d) => d.id === parentId)) throw validationFailed({ 'body.parentId': [CYCLE_MESSAGE] });
    const generation = deriveGeneration(parent, row.origin);
    await updateCultureRow(tx, row.id, { parentId });
    await shiftSubtreeGeneration(tx, row.id, generation - row.generation);
  }
  if (parentId === null) await updateCultureRow(tx, row.id, { parentId: null });
  await insertEvents(tx, [
    {
      id: newId(),
      cultureId: row.id,
      authorUserId: actor.id,
      kind: 'note',
      occurredAt: ctx.now(),
      notes: 'Parent corrected',
      data: { change: 'parent', from: row.parentId, to: parentId },
    },
  ]);
}

// ---------------------------------------------------------------- events

const NO_LONGER_KEPT_KINDS = new Set(['harvested', 'fed', 'washed', 'moved', 'pitched']);

function countResult(data: Extract<CultureEventCreateData, { kind: 'counted' }>['data']) {
  const count = hemocytometerCount({
    cellsCounted: data.cellsCounted,
    squaresCounted: data.squaresCounted,
    dilution: data.dilution,
    squareVolumeMl: SQUARE_VOLUME_ML[data.squareSize],
  });
  const stain =
    data.live !== undefined && data.dead !== undefined
      ? viabilityFromStain({ live: data.live, dead: data.dead })
      : undefined;
  return {
    cellsPerMl: count.cellsPerMl,
    ci95: count.ci95,
    relativeHalfWidth95: Number.isFinite(count.relativeHalfWidth95) ? count.relativeHalfWidth95 : null,
    warnings: [...count.warnings, ...(stain?.warnings ?? [])],
    ...(stain ? { viability: stain.viability, viabilityCi95: stain.ci95 } : {}),
  };
}

async function refreshMeasured(tx: Tx, cultureId: string) {
  const [latest] = await effectiveCounts(tx, cultureId);
  const r = latest?.data.result as { cellsPerMl?: number; viability?: number } | undefined;
  await updateCultureRow(tx, cultureId, {
    measuredAt: latest?.occurredAt ?? null,
    measuredCellsPerMl: r?.cellsPerMl ?? null,
    measuredViability: r?.viability ?? null,
  });
}

export async function addCultureEvent(ctx: ServiceContext, actor: Actor, id: string, input: CultureEventCreateData) {
  const now = ctx.now();
  const occurredAt = input.occurredAt ?? now;
  assertNotFuture(occurredAt, now, 'body.occurredAt');
  try {
    return await ctx.db.transaction(async (tx) => {
      const row = assertCanEdit(actor, await findCultureForUpdate(tx, id));
      if (occurredAt.getTime() < row.madeAt.getTime() - MS_PER_DAY) {
        throw validationFailed({ 'body.occurredAt': ['This is before the culture was made'] });
      }
      if (!IN_USE_STATES.includes(row.state) && NO_LONGER_KEPT_KINDS.has(input.kind) && !input.supersedesEventId) {
        throw conflict(
          'culture_not_kept',
          `This culture is ${row.state.replace('_', ' ')}; it can no longer be ${input.kind === 'fed' ? 'fed' : 'handled'}`,
        );
      }
      if (input.supersedesEventId) {
        const old = await findEventById(tx, input.supersedesEventId);
        if (!old || old.cultureId !== row.id) {
          throw validationFailed({ 'body.supersedesEventId': ['No entry in this culture’s log has this id'] });
        }
        const written = (old.data as { change?: unknown } | null)?.change;
        if (!CORRECTABLE_EVENT_KINDS.includes(old.kind) || written === 'details' || written === 'parent') {
          throw validationFailed({
            'body.supersedesEventId': ['This entry changed the culture; record a new one instead of correcting it'],
          });
        }
        if (old.kind !== input.kind) {
          throw validationFailed({
            'body.kind': [`A correction must be of the same kind as the entry it replaces (${old.kind})`],
          });
        }
        if (await isEventSuperseded(tx, old.id)) {
          throw conflict('already_corrected', 'This entry was already corrected; correct the latest version instead');
        }
      }
      let data: Record<string, unknown> = { ...input.data };
      if (input.kind === 'counted') {
        try {
          data = { ...input.data, result: countResult(input.data) };
        } catch (err) {
          if (err instanceof RangeError) throw validationFailed({ 'body.data': [err.message] });
          throw err;
        }
      }
      const [event] = await insertEvents(tx, [
        {
          id: newId(),
          cultureId: row.id,
          authorUserId: actor.id,
          kind: input.kind,
          occurredAt,
          notes: input.notes,
          data,
          supersedesEventId: input.supersedesEventId ?? null,
        },
      ]);
      await applyEventEffects(tx, actor, row, input, occurredAt, now);
      return event!;
    });
  } catch (err) {
    if (isPgError(err, '23505', 'culture_events_supersedes_once')) {
      throw conflict('already_corrected', 'This entry was already corrected; correct the latest version instead');
    }
    throw err;
  }
}

async function applyEventEffects(
  tx: Tx,
  actor: Actor,
  row: CultureRow,
  input: CultureEventCreateData,
  occurredAt: Date,
  now: Date,
) {
  switch (input.kind) {
    case 'counted':
      await refreshMeasured(tx, row.id);
      if (input.data.cultureVolumeMl !== undefined) {
        await updateCultureRow(tx, row.id, { amount: { ...row.amount, volumeMl: input.data.cultureVolumeMl } });
      }
      break;
    case 'moved': {
      const next = {
        locationLabel: input.data.locationLabel ?? row.locationLabel,
        storageTempC: input.data.storageTempC ?? row.storageTempC,
      };
      await updateCultureRow(tx, row.id, { ...next, attentionDueAt: attentionOf({ ...row, ...next })?.dueAt ?? null });
      break;
    }
    case 'pitched':
      if (input.data.usedUp) {
        await updateCultureRow(tx, row.id, {
          state: 'pitched',
          stateChangedAt: now,
          stateChangedBy: actor.id,
          attentionDueAt: null,
        });
      }
      break;
    case 'contamination_suspected':
      await updateCultureRow(tx, row.id, { suspect: true, suspectFromCultureId: row.id, suspectSince: occurredAt });
      break;
    default:
      break;
  }
}

export async function changeCultureState(
  ctx: ServiceContext,
  actor: Actor,
  id: string,
  input: z.output<typeof CultureStateChangeSchema>,
) {
  const now = ctx.now();
  return ctx.db.transaction(async (tx) => {
    const row = assertCanEdit(actor, await findCultureForUpdate(tx, id));
    if (row.state === 'discarded') {
      throw conflict('culture_discarded', 'A discarded culture stays discarded; add a new culture instead');
    }
    if (row.state === input.state && !input.clearSuspect) {
      throw conflict('same_state', `This culture is already ${input.state.replace('_', ' ')}`);
    }
    const next = { ...row, state: input.state as CultureState };
    await updateCultureRow(tx, id, {
      state: input.state,
      stateChangedAt: now,
      stateChangedBy: actor.id,
      attentionDueAt: attentionOf(next)?.dueAt ?? null,
      ...(input.clearSuspect ? { suspect: false, suspectFromCultureId: null, suspectSince: null } : {}),
    });
    await insertEvents(tx, [
      {
        id: newId(),
        cultureId: id,
        authorUserId: actor.id,
        kind: 'state_changed',
        occurredAt: now,
        notes: input.notes,
        data: { from: row.state, to: input.state, ...(input.clearSuspect ? { clearedSuspect: true } : {}) },
      },
    ]);
    return (await findCultureById(tx, id))!;
  });
}

export async function splitCulture(
  ctx: ServiceContext,
  actor: Actor,
  id: string,
  input: z.output<typeof CultureSplitSchema>,
) {
  const now = ctx.now();
  return ctx.db.transaction(async (tx) => {
    const parent = assertCanEdit(actor, await findCultureForUpdate(tx, id));
    if (!IN_USE_STATES.includes(parent.state)) {
      throw conflict(
        'culture_not_kept',
        `This culture is ${parent.state.replace('_', ' ')}; there is nothing left to split`,
      );
    }
    const children: CultureInsert[] = [];
    for (let i = 0; i < input.count; i++) {
      const child: CultureInsert = {
        id: newId(),
        ownerUserId: parent.ownerUserId,
        ownerClubId: parent.ownerClubId,
        visibility: parent.visibility,
        parentId: parent.id,
        generation: deriveGeneration(parent, 'reculture'),
        strainName: parent.strainName,
        species: parent.species,
        tags: parent.tags,
        origin: 'reculture',
        originDetails: { origin: 'reculture', method: 'split' },
        form: input.form ?? parent.form,
        amount: { ...parent.amount, ...(input.volumeMlEach ? { volumeMl: input.volumeMlEach } : {}) },
        locationLabel: input.locationLabel ?? parent.locationLabel,
        storageTempC: input.storageTempC ?? parent.storageTempC,
        madeAt: now,
        state: 'stored',
        stateChangedAt: now,
        stateChangedBy: actor.id,
        measuredAt: parent.measuredAt,
        measuredViability: parent.measuredViability,
        measuredCellsPerMl: parent.measuredCellsPerMl,
        suspect: parent.suspect,
        suspectFromCultureId: parent.suspectFromCultureId,
        suspectSince: parent.suspectSince,
        notes: input.notes,
      };
      child.attentionDueAt = attentionOf(child as CultureRow)?.dueAt ?? null;
      children.push(child);
    }
    const rows = await insertCultures(tx, children);
    await updateCultureRow(tx, parent.id, {
      state: 'used_up',
      stateChangedAt: now,
      stateChangedBy: actor.id,
      attentionDueAt: null,
    });
    await insertEvents(tx, [
      {
        id: newId(),
        cultureId: parent.id,
        authorUserId: actor.id,
        kind: 'split',
        occurredAt: now,
        notes: input.notes,
        data: { childIds: rows.map((r) => r.id), from: parent.state, to: 'used_up' },
      },
      ...rows.map((r) => ({
        id: newId(),
        cultureId: r.id,
        authorUserId: actor.id,
        kind: 'created' as const,
        occurredAt: now,
        data: { origin: 'reculture', method: 'split', parentId: parent.id, generation: r.generation },
      })),
    ]);
    return rows;
  });
}

// ---------------------------------------------------------------- quarantine

async function descendantsInUse(db: Db | Tx, actor: Actor, id: string) {
  const rows = await descendantsOf(db, id);
  return rows.filter(
    (d) =>
      IN_USE_STATES.includes(d.state) &&
      canEdit(actor, { ownerUserId: d.owner_user_id, ownerClubId: d.owner_club_id, visibility: d.visibility }),
  );
}

export async function quarantinePreview(ctx: ServiceContext, actor: Actor, id: string) {
  const root = await loadCultureForView(ctx.db, actor, id);
  assertCanEdit(actor, root);
  const rows = await descendantsInUse(ctx.db, actor, id);
  return rows.map((d) => ({
    id: d.id,
    parentId: d.parent_id,
    depth: d.depth,
    strainName: d.strain_name,
    generation: d.generation,
    state: d.state,
    suspect: d.suspect,
  }));
}

export async function quarantineCulture(
  ctx: ServiceContext,
  actor: Actor,
  id: string,
  input: z.output<typeof CultureQuarantineSchema>,
) {
  const now = ctx.now();
  return ctx.db.transaction(async (tx) => {
    const root = assertCanEdit(actor, await findCultureForUpdate(tx, id));
    if (root.state === 'discarded') throw conflict('culture_discarded', 'This culture was already discarded');
    const allowed = new Set((await descendantsInUse(tx, actor, id)).map((d) => d.id));
    const requested = [...new Set(input.flagDescendantIds)];
    const wrong = requested.filter((r) => !allowed.has(r));
    if (wrong.length) {
      throw validationFailed({
        'body.flagDescendantIds': [
          `Not a descendant still in use: ${wrong.slice(0, 5).join(', ')}${wrong.length > 5 ? '…' : ''}`,
        ],
      });
    }
    const eventId = newId();
    await insertEvents(tx, [
      {
        id: eventId,
        cultureId: root.id,
        authorUserId: actor.id,
        kind: 'contamination_confirmed',
        occurredAt: now,
        notes: input.notes,
        data: { from: root.state, to: 'quarantined', flaggedIds: requested },
      },
    ]);
    await updateCultureRow(tx, root.id, {
      state: 'quarantined',
      stateChangedAt: now,
      stateChangedBy: actor.id,
      suspect: true,
      suspectFromCultureId: root.id,
      suspectSince: now,
      attentionDueAt: attentionOf({ ...root, state: 'quarantined' })?.dueAt ?? null,
    });
    await markSuspect(tx, requested, { fromCultureId: root.id, since: now });
    await insertEvents(
      tx,
      requested.map((d) => ({
        id: newId(),
        cultureId: d,
        authorUserId: actor.id,
        kind: 'contamination_suspected' as const,
        occurredAt: now,
        notes: `Contamination confirmed in an ancestor (${root.strainName})`,
        data: { fromCultureId: root.id, fromEventId: eventId },
      })),
    );
    // descendants in other people's keeping, across owners and clubs: flagged, keepers told
    const across = await alertLineage({ db: tx, now: ctx.now }, actor.id, root, eventId);
    return { flagged: requested.length + across.othersFlagged, eventId, keepersNotified: across.keepersNotified };
  });
}

export type { CultureEventRow };
export { presentDetail };
