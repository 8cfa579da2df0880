import {
  BACKUP_FORMAT,
  BACKUP_VERSION,
  CultureBackupSchema,
  type CultureBackup,
  type CultureOriginDetails,
} from '@barmkeep/schemas';
import type { ZodError } from 'zod';
import {
  insertCultures,
  insertEvents,
  insertPhotos,
  listAllCultures,
  listEventsForCultures,
  listPhotosForCultures,
} from '../db/queries/cultures';
import type { CultureInsert, culturePhotos } from '../db/schema';
import { AppError, badRequest, validationFailed } from '../lib/errors';
import { newId } from '../lib/ids';
import { processPhoto, type ProcessedPhoto } from '../lib/images';
import type { ObjectStorage } from '../storage';
import { inTransaction } from './context';
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

/** Photos of the exported cultures: each web-size image as base64 (the thumbnail is made again on import). */
async function exportPhotos(ctx: ServiceContext, storage: ObjectStorage, cultureIds: string[]) {
  const rows = await listPhotosForCultures(ctx.db, cultureIds);
  const out: NonNullable<CultureBackup['photos']> = [];
  for (const p of rows) {
    const image = await storage.get(p.webKey);
    // an object lost from storage cannot be exported; the rest of the file still is
    if (!image) continue;
    out.push({
      id: p.id,
      cultureId: p.cultureId,
      eventId: p.eventId,
      caption: p.caption,
      createdAt: p.createdAt.toISOString(),
      contentType: p.contentType,
      imageBase64: image.toString('base64'),
    });
  }
  return out;
}

export async function exportBackup(
  ctx: ServiceContext,
  storage: ObjectStorage,
  actor: Actor,
  options: { photos: boolean } = { photos: false },
): Promise<CultureBackup> {
  const rows = lineageOrder(await listAllCultures(ctx.db, visibleCulturesWhere(actor)));
  const events = await listEventsForCultures(
    ctx.db,
    rows.map((r) => r.id),
  );
  const exported = new Set(rows.map((r) => r.id));
  const photos = options.photos
    ? await exportPhotos(
        ctx,
        storage,
        rows.map((r) => r.id),
      )
    : [];
  return {
    format: BACKUP_FORMAT,
    version: BACKUP_VERSION,
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
    photos,
  };
}

/** "cultures[3] (id abc): originDetails.bestBy: …" — the row a person can find in the file. */
function rowMessages(error: ZodError, raw: unknown): Record<string, string[]> {
  const fields: Record<string, string[]> = {};
  for (const issue of error.issues) {
    const [list, index, ...rest] = issue.path;
    let where = issue.path.map(String).join('.') || 'file';
    if ((list === 'cultures' || list === 'events' || list === 'photos') && typeof index === 'number') {
      const id = (raw as Record<string, { id?: unknown }[]>)[list]?.[index]?.id;
      where = `${list}[${index}]${typeof id === 'string' ? ` (id ${id})` : ''}${rest.length ? `: ${rest.join('.')}` : ''}`;
    }
    (fields[where] ??= []).push(issue.message);
  }
  return fields;
}

/** The words an upload of this image would have been refused with. */
function imageProblem(err: unknown): string {
  if (err instanceof AppError) return err.message;
  return 'This image could not be read';
}

/**
 * Adds every culture, log entry and photo of a backup as new rows of the actor, all or nothing. Ids
 * are new (a backup can be imported twice without clashing); parents must come earlier in the file,
 * so a lineage can only be rebuilt from its root down and a loop cannot be expressed. Each photo
 * goes through the upload pipeline (judged by its bytes, re-encoded, metadata dropped) before
 * anything is written; storage objects are written only once every row is good, and removed again
 * if the database refuses the rows.
 */
export async function importBackup(ctx: ServiceContext, storage: ObjectStorage, actor: Actor, file: Buffer) {
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
  const cultureOfEvent = new Map(backup.events.map((e) => [e.id, e.cultureId]));
  const photoIds = new Set<string>();
  const photoRows: {
    where: string;
    source: (typeof backup.photos)[number];
    cultureId: string;
    eventId: string | null;
  }[] = [];
  backup.photos.forEach((p, i) => {
    const where = `photos[${i}] (id ${p.id})`;
    const cultureId = idMap.get(p.cultureId);
    if (!cultureId) return bad(where, 'Its culture is not in the file');
    if (photoIds.has(p.id)) return bad(where, 'This id appears twice in the file');
    photoIds.add(p.id);
    let eventId: string | null = null;
    if (p.eventId !== null) {
      if (!eventIds.has(p.eventId)) return bad(where, 'Its log entry is not in the file');
      if (cultureOfEvent.get(p.eventId) !== p.cultureId) return bad(where, 'Its log entry belongs to another culture');
      eventId = eventIds.get(p.eventId)!;
    }
    photoRows.push({ where, source: p, cultureId, eventId });
  });
  if (Object.keys(fields).length) throw validationFailed(fields);

  // every image through the upload pipeline before anything is written; one at a time (sharp is CPU-bound)
  const processed: ProcessedPhoto[] = [];
  for (const p of photoRows) {
    try {
      processed.push(await processPhoto(Buffer.from(p.source.imageBase64, 'base64')));
    } catch (err) {
      bad(p.where, imageProblem(err));
    }
  }
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

  const photos: (typeof culturePhotos.$inferInsert)[] = photoRows.map((p, i) => {
    const id = newId();
    const image = processed[i]!;
    return {
      id,
      cultureId: p.cultureId,
      eventId: p.eventId,
      uploadedBy: actor.id,
      caption: p.source.caption,
      webKey: `cultures/${p.cultureId}/${id}-web.webp`,
      thumbKey: `cultures/${p.cultureId}/${id}-thumb.webp`,
      contentType: image.contentType,
      width: image.web.width,
      height: image.web.height,
      bytes: image.web.data.length,
      createdAt: p.source.createdAt,
    };
  });
  const written: string[] = [];
  try {
    for (const [i, p] of photos.entries()) {
      const image = processed[i]!;
      written.push(p.webKey);
      await storage.put(p.webKey, image.web.data, image.contentType);
      written.push(p.thumbKey);
      await storage.put(p.thumbKey, image.thumb.data, image.contentType);
    }
    await inTransaction(ctx, async ({ db: tx }) => {
      for (let i = 0; i < rows.length; i += 1000) await insertCultures(tx, rows.slice(i, i + 1000));
      for (let i = 0; i < events.length; i += 1000) await insertEvents(tx, events.slice(i, i + 1000));
      for (let i = 0; i < photos.length; i += 1000) await insertPhotos(tx, photos.slice(i, i + 1000));
    });
  } catch (err) {
    await Promise.allSettled(written.map((key) => storage.delete(key)));
    throw err;
  }
  return { cultures: rows.length, events: events.length, photos: photos.length };
}
