/**
 * Batches: pitching from cultures (through the culture library's own event log), results, and
 * slurry harvested into a new culture one generation on. ABV and attenuation come from core.
 */
import { abv, apparentAttenuation, pitchRateOf, platoFromSg, realAttenuation } from '@barmkeep/core';
import {
  IN_USE_STATES,
  makeCultureCreateSchema,
  type BatchCreateData,
  type BatchDerivedDto,
  type BatchDto,
  type BatchUpdateInput,
  type GenerationPointDto,
} from '@barmkeep/schemas';
import type { z } from 'zod';
import type { BatchHarvestSchema } from '@barmkeep/schemas';
import type { BatchRow, CultureRow } from '../db/schema';
import {
  batchesPitchedWith,
  batchesPitchedWithStrain,
  findBatch,
  harvestsOf,
  insertBatch,
  insertHarvest,
  insertPitches,
  listBatchesOf,
  pitchesOf,
  updateBatchRow,
} from '../db/queries/planning';
import { findCultureById, findCultureForUpdate } from '../db/queries/cultures';
import { conflict, notFound, validationFailed } from '../lib/errors';
import { newId } from '../lib/ids';
import { assertCanEdit, type Actor } from './cultureAccess';
import { addCultureEvent, createCulture, getLineage } from './cultures';
import { markPlanPitched, ownPlan } from './planning';
import { inTransaction, type ServiceContext } from './context';

const MS_PER_DAY = 86_400_000;

export function derivedOf(
  b: Pick<BatchRow, 'ogSg' | 'fgSg' | 'volumeL'>,
  cellsPitched: number | null,
): BatchDerivedDto {
  const ogPlato = platoFromSg(b.ogSg);
  const hasFg = b.fgSg != null && b.fgSg <= b.ogSg;
  return {
    abv: hasFg ? abv({ og: b.ogSg, fg: b.fgSg! }) : null,
    apparentAttenuation: hasFg ? apparentAttenuation({ og: b.ogSg, fg: b.fgSg! }) : null,
    realAttenuation: hasFg ? realAttenuation({ og: b.ogSg, fg: b.fgSg! }) : null,
    ogPlato,
    pitchRate:
      cellsPitched != null && ogPlato > 0
        ? pitchRateOf({ cells: cellsPitched, volumeL: b.volumeL, plato: ogPlato })
        : null,
  };
}

function assertOwnBatch(actor: Actor, row: BatchRow | undefined): BatchRow {
  if (!row || row.ownerUserId !== actor.id) throw notFound('This batch');
  return row;
}

async function present(ctx: ServiceContext, row: BatchRow): Promise<BatchDto> {
  const pitches = await pitchesOf(ctx.db, [row.id]);
  const harvests = await harvestsOf(ctx.db, row.id);
  const known = pitches.map((p) => p.pitch.cellsPitched).filter((c): c is number => c != null);
  return {
    id: row.id,
    name: row.name,
    brewedAt: row.brewedAt.toISOString(),
    volumeL: row.volumeL,
    ogSg: row.ogSg,
    fgSg: row.fgSg,
    fermentationTempC: row.fermentationTempC,
    lagHours: row.lagHours,
    notes: row.notes,
    planId: row.planId,
    pitches: pitches.map((p) => ({
      cultureId: p.pitch.cultureId,
      strainName: p.strainName,
      generation: p.pitch.generation,
      cellsPitched: p.pitch.cellsPitched,
    })),
    harvests: harvests.map((h) => ({
      cultureId: h.harvest.cultureId,
      parentCultureId: h.harvest.parentCultureId,
      strainName: h.strainName,
      generation: h.generation,
    })),
    derived: derivedOf(row, known.length ? known.reduce((s, c) => s + c, 0) : null),
    createdAt: row.createdAt.toISOString(),
  };
}

/** Record a batch and pitch its cultures: each gets a "pitched" entry in its own log. */
/**
 * A batch, its pitches, each culture's "pitched" log entry and the plan's status: one transaction.
 * The pitched cultures are locked first (in id order, so two batches pitching the same cultures
 * queue instead of deadlocking) and checked under the lock: a culture used up or discarded by a
 * request running at the same moment cannot be pitched, and a failure leaves nothing behind.
 */
export async function createBatch(ctx: ServiceContext, actor: Actor, input: BatchCreateData): Promise<BatchDto> {
  const row = await inTransaction(ctx, async (t) => {
    if (input.planId) await ownPlan(t, actor, input.planId);
    const locked = new Map<string, CultureRow>();
    for (const id of [...new Set(input.pitches.map((p) => p.cultureId))].sort()) {
      const c = await findCultureForUpdate(t.db, id);
      if (c) locked.set(id, c);
    }
    const parents: CultureRow[] = input.pitches.map((p, i) => {
      const c = locked.get(p.cultureId);
      if (!c || c.ownerUserId !== actor.id) {
        throw validationFailed({ [`body.pitches.${i}.cultureId`]: ['No culture of yours has this id'] });
      }
      assertCanEdit(actor, c);
      if (!IN_USE_STATES.includes(c.state)) {
        throw conflict(
          'culture_not_kept',
          `${c.strainName} is ${c.state.replace('_', ' ')}; it cannot be pitched again`,
        );
      }
      if (c.state === 'quarantined' || c.suspect) {
        throw conflict(
          'culture_suspect',
          `${c.strainName} is ${c.state === 'quarantined' ? 'in quarantine' : 'suspected of contamination'}; check it and clear it on its page before pitching it`,
        );
      }
      if (input.brewedAt.getTime() < c.madeAt.getTime() - MS_PER_DAY) {
        throw validationFailed({ 'body.brewedAt': [`This is before ${c.strainName} was made`] });
      }
      return c;
    });
    const b = await insertBatch(t.db, {
      id: newId(),
      ownerUserId: actor.id,
      planId: input.planId ?? null,
      name: input.name,
      brewedAt: input.brewedAt,
      volumeL: input.volumeL,
      ogSg: input.ogSg,
      fgSg: input.fgSg ?? null,
      fermentationTempC: input.fermentationTempC ?? null,
      lagHours: input.lagHours ?? null,
      notes: input.notes,
    });
    await insertPitches(
      t.db,
      input.pitches.map((p, i) => ({
        batchId: b.id,
        cultureId: p.cultureId,
        cellsPitched: p.cellsPitched ?? null,
        generation: parents[i]!.generation,
      })),
    );
    for (const c of parents) {
      await addCultureEvent(t, actor, c.id, {
        kind: 'pitched',
        occurredAt: input.brewedAt,
        notes: '',
        data: { batchName: input.name, usedUp: input.usedUp },
      });
    }
    if (input.planId) await markPlanPitched(t, input.planId);
    return b;
  });
  return present(ctx, row);
}

export async function getBatch(ctx: ServiceContext, actor: Actor, id: string) {
  return present(ctx, assertOwnBatch(actor, await findBatch(ctx.db, id)));
}

export async function listBatches(ctx: ServiceContext, actor: Actor): Promise<BatchDto[]> {
  const rows = await listBatchesOf(ctx.db, actor.id);
  return Promise.all(rows.map((r) => present(ctx, r)));
}

export async function updateBatch(ctx: ServiceContext, actor: Actor, id: string, input: BatchUpdateInput) {
  const row = assertOwnBatch(actor, await findBatch(ctx.db, id));
  const fg = input.fgSg === undefined ? row.fgSg : input.fgSg;
  if (fg != null && fg > row.ogSg)
    throw validationFailed({ 'body.fgSg': ['The final gravity is above the original gravity'] });
  const updated = await updateBatchRow(ctx.db, id, input);
  return present(ctx, updated);
}

/** Slurry cropped from the batch becomes a culture whose parent is the culture pitched (generation + 1). */
export async function harvestFromBatch(
  ctx: ServiceContext,
  actor: Actor,
  id: string,
  input: z.output<typeof BatchHarvestSchema>,
) {
  const batch = assertOwnBatch(actor, await findBatch(ctx.db, id));
  const pitches = await pitchesOf(ctx.db, [batch.id]);
  if (!pitches.some((p) => p.pitch.cultureId === input.parentCultureId)) {
    throw validationFailed({ 'body.parentCultureId': ['Choose a culture that was pitched into this batch'] });
  }
  const parent = await findCultureById(ctx.db, input.parentCultureId);
  if (!parent)
    throw validationFailed({ 'body.parentCultureId': ['Choose a culture that was pitched into this batch'] });
  const now = ctx.now();
  const data = makeCultureCreateSchema(() => now).parse({
    strainName: parent.strainName,
    ...(parent.species ? { species: parent.species } : {}),
    tags: parent.tags,
    form: input.form,
    origin: { origin: 'batch_slurry', batchName: batch.name, crop: 'bottom', washed: input.form === 'slurry_washed' },
    parentId: parent.id,
    amount: { volumeMl: input.volumeMl },
    locationLabel: input.locationLabel,
    storageTempC: input.storageTempC,
    madeAt: now.toISOString(),
    state: 'stored',
    notes: input.notes,
  });
  const child = await createCulture(ctx, actor, data);
  await insertHarvest(ctx.db, { batchId: batch.id, cultureId: child.id, parentCultureId: parent.id });
  return {
    culture: { id: child.id, generation: child.generation, strainName: child.strainName },
    batch: await present(ctx, batch),
  };
}

/** Attenuation and lag by generation, over a culture's whole lineage or every culture of a strain. */
export async function generationChart(
  ctx: ServiceContext,
  actor: Actor,
  q: { cultureId?: string; strain?: string },
): Promise<{ points: GenerationPointDto[]; scope: { kind: 'lineage' | 'strain'; label: string } }> {
  let rows;
  let label: string;
  let kind: 'lineage' | 'strain';
  if (q.cultureId) {
    const lineage = await getLineage(ctx, actor, q.cultureId);
    const ids = lineage.nodes.filter((n) => n.visible).map((n) => n.id);
    rows = await batchesPitchedWith(ctx.db, actor.id, ids);
    label = lineage.nodes.find((n) => n.id === lineage.rootId)?.strainName ?? 'this lineage';
    kind = 'lineage';
  } else {
    rows = await batchesPitchedWithStrain(ctx.db, actor.id, q.strain!);
    label = q.strain!;
    kind = 'strain';
  }
  const points = rows.map((r) => ({
    batchId: r.batch.id,
    batchName: r.batch.name,
    brewedAt: r.batch.brewedAt.toISOString(),
    cultureId: r.pitch.cultureId,
    strainName: r.strainName,
    generation: r.pitch.generation,
    apparentAttenuation: derivedOf(r.batch, null).apparentAttenuation,
    lagHours: r.batch.lagHours,
  }));
  return { points, scope: { kind, label } };
}
