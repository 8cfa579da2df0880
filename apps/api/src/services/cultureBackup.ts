import { BACKUP_FORMAT, CultureBackupSchema, type CultureBackup, type CultureOriginDetails } from '@barmkeep/schemas';
import type { ZodError } from 'zod';
import { insertCultures, insertEvents, listAllCultures, listEventsForCultures } from '../db/queries/cultures';
import type { CultureInsert } from '../db/schema';
import { badRequest, validationFailed } from '../lib/errors';
import { newId } from '../lib/ids';
import { visibleCulturesWhere, type Actor } from './cultureAccess';
import { attentionOf } from './cultureHealth';
import { deriveGeneration, ROOT_ONLY_ORIGINS } from './cultureLineage';
import { presentCultureSummary } from '../presenters/culture';
import type { ServiceContext } from './context';

function csvCell(value: unknown): string {
  const s = value === null || value === undefined ? '' : String(value);
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}
/** Text a person typed: a spreadsheet program must not run it as a formula. */
function csvText(value: string | null): string {
  const s = value ?? '';
  return csvCell(/^[=+\-@\t\r]/.test(s) ? `'${s}` : s);
}

export async function exportLibraryCsv(ctx: ServiceContext, actor: Actor): Promise<string> {
  const now = ctx.now();
  const rows = await listAllCultures(ctx.db, visibleCulturesWhere(actor));
  const header = [
    'id',
    'strain',
    'species',
    'tags',
    'form',
    'origin',
    'state',
    'generation',
    'parent_id',
    'location',
    'storage_temp_c',
    'made_at',
    'age_days',
    'projected_viability_pct',
    'viability_basis',
    'days_until_attention',
    'suspect',
  ];
  const lines = rows.map((r) => {
    const s = presentCultureSummary(r, now);
    return [
      csvCell(s.id),
      csvText(s.strainName),
      csvText(s.species),
      csvText(s.tags.join(' ')),
      csvCell(s.form),
      csvCell(s.origin),
      csvCell(s.state),
      csvCell(s.generation),
      csvCell(s.parentId),
      csvText(s.locationLabel),
      csvCell(s.storageTempC),
      csvCell(s.madeAt),
      csvCell(s.ageDays),
      csvCell(Math.round(s.projectedViability * 1000) / 10),
      csvCell(s.viabilityBasis),
      csvCell(s.daysUntilAttention),
      csvCell(s.suspect),
    ].join(',');
  });
  return [header.join(','), ...lines].join('\r\n') + '\r\n';
}

/** Parents before children (a re-parented culture may be older than its new parent). */
function lineageOrder<T extends { id: string; parentId: string | null }>(rows: T[]): T[] {
  const ids = new Set(rows.map((r) => r.id));
  const children = new Map<string, T[]>();
  const out: T[] = [];
  for (const r of rows) {
    if (r.parentId && ids.has(r.parentId))
      (children.get(r.parentId) ?? children.set(r.parentId, []).get(r.parentId)!).push(r);
    else out.push(r);
  }
  for (let i = 0; i < out.length; i++) out.push(...(children.get(out[i]!.id) ?? []));
  return out;
}

export async function exportBackup(ctx: ServiceContext, actor: Actor): Promise<CultureBackup> {
  const rows = lineageOrder(await listAllCultures(ctx.db, visibleCulturesWhere(actor)));
  const events = await listEventsForCultures(
    ctx.db,
    rows.map((r) => r.id),
  );
  const exported = new Set(rows.map((r) => r.id));
  return {
    format: BACKUP_FORMAT,
    version: 1,
    exportedAt: ctx.now().toISOString(),
    cultures: rows.map((r) => ({
      id: r.id,
      // a parent the person may not see is not in the file: the culture starts the lineage there
      parentId: r.parentId && exported.has(r.parentId) ? r.parentId : null,
      generation: r.generation,
      strainName: r.strainName,
      species: r.species,
      tags: r.tags,
      origin: r.origin,
      originDetails: r.originDetails as never,
      form: r.form,
      amount: r.amount,
      locationLabel: r.locationLabel,
      storageTempC: r.storageTempC,
      madeAt: r.madeAt.toISOString(),
      state: r.state,
      suspect: r.suspect,
      notes: r.notes,
    })),
    events: events.map((e) => ({
      id: e.id,
      cultureId: e.cultureId,
      kind: e.kind,
      occurredAt: e.occurredAt.toISOString(),
      notes: e.notes,
      data: e.data,
      supersedesEventId: e.supersedesEventId,
    })),
  };
}

/** "cultures[3] (id abc): originDetails.bestBy: …" — the row a person can find in the file. */
function rowMessages(error: ZodError, raw: unknown): Record<string, string[]> {
  const fields: Record<string, string[]> = {};
  for (const issue of error.issues) {
    const [list, index, ...rest] = issue.path;
    let where = issue.path.map(String).join('.') || 'file';
    if ((list === 'cultures' || list === 'events') && typeof index === 'number') {
      const id = (raw as Record<string, { id?: unknown }[]>)[list]?.[index]?.id;
      where = `${list}[${index}]${typeof id === 'string' ? ` (id ${id})` : ''}${rest.length ? `: ${rest.join('.')}` : ''}`;
    }
    (fields[where] ??= []).push(issue.message);
  }
  return fields;
}

/**
 * Adds every culture and log entry of a backup as new rows of the actor, all or nothing. Ids are
 * new (a backup can be imported twice without clashing); parents must come earlier in the file, so
 * a lineage can only be rebuilt from its root down and a loop cannot be expressed.
 */
export async function importBackup(ctx: ServiceContext, actor: Actor, file: Buffer) {
  let raw: unknown;
  try {
    raw = JSON.parse(file.toString('utf8'));
  } catch {
    throw badRequest('This file is not valid JSON; nothing was imported', 'invalid_backup', {
      file: ['Not valid JSON'],
    });
  }
  const parsed = CultureBackupSchema.safeParse(raw);
  if (!parsed.success) throw validationFailed(rowMessages(parsed.error, raw));
  const backup = parsed.data;
  const now = ctx.now();
  const fields: Record<string, string[]> = {};
  const bad = (where: string, message: string) => (fields[where] ??= []).push(message);

  const idMap = new Map<string, string>();
  const generationOf = new Map<string, number>();
  const rows: CultureInsert[] = [];
  backup.cultures.forEach((c, i) => {
    const where = `cultures[${i}] (id ${c.id})`;
    if (idMap.has(c.id)) return bad(where, 'This id appears twice in the file');
    if (c.originDetails.origin !== c.origin) bad(where, 'origin and originDetails.origin differ');
    if (c.madeAt.getTime() > now.getTime() + 5 * 60_000) bad(where, 'madeAt is in the future');
    let parentGeneration: number | undefined;
    if (c.parentId !== null) {
      if (!idMap.has(c.parentId)) return bad(where, 'Its parent must appear earlier in the file');
      if (ROOT_ONLY_ORIGINS.includes(c.origin)) bad(where, 'Bottle dregs and bought yeast cannot have a parent');
      parentGeneration = generationOf.get(c.parentId);
    }
    // a re-culture without a parent is allowed here: its parent was not the person's to export
    const generation = deriveGeneration(
      parentGeneration === undefined ? undefined : { generation: parentGeneration },
      c.origin,
      c.generation,
    );
    const id = newId();
    idMap.set(c.id, id);
    generationOf.set(c.id, generation);
    const row: CultureInsert = {
      id,
      ownerUserId: actor.id,
      parentId: c.parentId === null ? null : idMap.get(c.parentId)!,
      generation,
      strainName: c.strainName,
      species: c.species,
      tags: c.tags,
      origin: c.origin,
      originDetails: JSON.parse(JSON.stringify(c.originDetails)) as CultureOriginDetails,
      form: c.form,
      amount: c.amount,
      locationLabel: c.locationLabel,
      storageTempC: c.storageTempC,
      madeAt: c.madeAt,
      state: c.state,
      stateChangedAt: now,
      stateChangedBy: actor.id,
      suspect: c.suspect,
      suspectSince: c.suspect ? now : null,
      notes: c.notes,
    };
    row.attentionDueAt =
      attentionOf({ form: row.form, storageTempC: row.storageTempC, madeAt: row.madeAt, state: row.state! })?.dueAt ??
      null;
    rows.push(row);
  });
  const eventIds = new Map<string, string>();
  const superseded = new Set<string>();
  const events = backup.events.flatMap((e, i) => {
    const where = `events[${i}] (id ${e.id})`;
    const cultureId = idMap.get(e.cultureId);
    if (!cultureId) return (bad(where, 'Its culture is not in the file'), []);
    if (eventIds.has(e.id)) return (bad(where, 'This id appears twice in the file'), []);
    if (e.supersedesEventId !== null && superseded.has(e.supersedesEventId)) {
      return (bad(where, 'Another entry already corrects the same entry'), []);
    }
    if (e.supersedesEventId !== null) superseded.add(e.supersedesEventId);
    if (e.supersedesEventId !== null && !eventIds.has(e.supersedesEventId)) {
      return (bad(where, 'The entry it corrects must appear earlier in the file'), []);
    }
    const id = newId();
    eventIds.set(e.id, id);
    return [
      {
        id,
        cultureId,
        authorUserId: actor.id,
        kind: e.kind,
        occurredAt: e.occurredAt,
        notes: e.notes,
        data: e.data,
        supersedesEventId: e.supersedesEventId === null ? null : eventIds.get(e.supersedesEventId)!,
      },
    ];
  });
  if (Object.keys(fields).length) throw validationFailed(fields);

  // the latest effective count of each culture anchors its projection, as it did before export
  const supersededNew = new Set(events.map((e) => e.supersedesEventId).filter(Boolean));
  const byId = new Map(rows.map((r) => [r.id, r]));
  for (const e of [...events].sort((a, b) => a.occurredAt.getTime() - b.occurredAt.getTime())) {
    if (e.kind !== 'counted' || supersededNew.has(e.id)) continue;
    const result = e.data.result as { cellsPerMl?: number; viability?: number } | undefined;
    const row = byId.get(e.cultureId)!;
    row.measuredAt = e.occurredAt;
    row.measuredCellsPerMl = result?.cellsPerMl ?? null;
    row.measuredViability = result?.viability ?? null;
  }

  await ctx.db.transaction(async (tx) => {
    for (let i = 0; i < rows.length; i += 1000) await insertCultures(tx, rows.slice(i, i + 1000));
    for (let i = 0; i < events.length; i += 1000) await insertEvents(tx, events.slice(i, i + 1000));
  });
  return { cultures: rows.length, events: events.length };
}
