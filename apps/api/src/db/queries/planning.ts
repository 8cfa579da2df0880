import { and, asc, desc, eq, inArray, isNotNull, sql } from 'drizzle-orm';
import type { Db } from '../client';
import {
  batchHarvests,
  batchPitches,
  batches,
  brewingEquipment,
  cultures,
  starterPlanSteps,
  starterPlans,
  type BatchRow,
  type BrewingEquipmentRow,
  type StarterPlanRow,
  type StarterPlanStepRow,
} from '../schema';

type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];
type Executor = Db | Tx;

// ---------------------------------------------------------------- equipment

export async function findEquipment(db: Executor, userId: string): Promise<BrewingEquipmentRow | undefined> {
  const [row] = await db.select().from(brewingEquipment).where(eq(brewingEquipment.userId, userId)).limit(1);
  return row;
}

export async function upsertEquipment(
  db: Executor,
  userId: string,
  values: Omit<typeof brewingEquipment.$inferInsert, 'userId' | 'updatedAt'>,
): Promise<BrewingEquipmentRow> {
  const [row] = await db
    .insert(brewingEquipment)
    .values({ ...values, userId })
    .onConflictDoUpdate({ target: brewingEquipment.userId, set: { ...values, updatedAt: new Date() } })
    .returning();
  return row!;
}

/** Every counted step of a person's plans, oldest first: the data behind the growth correction. */
export async function measuredStepsOf(db: Executor, userId: string) {
  return db
    .select({
      startCells: starterPlanSteps.startCells,
      expectedCells: starterPlanSteps.expectedCells,
      measuredCells: starterPlanSteps.measuredCells,
      completedAt: starterPlanSteps.completedAt,
    })
    .from(starterPlanSteps)
    .innerJoin(starterPlans, eq(starterPlans.id, starterPlanSteps.planId))
    .where(and(eq(starterPlans.ownerUserId, userId), isNotNull(starterPlanSteps.measuredCells)))
    .orderBy(asc(starterPlanSteps.completedAt));
}

// ---------------------------------------------------------------- plans

export async function insertPlan(db: Executor, values: typeof starterPlans.$inferInsert): Promise<StarterPlanRow> {
  const [row] = await db.insert(starterPlans).values(values).returning();
  return row!;
}

export async function findPlan(db: Executor, id: string): Promise<StarterPlanRow | undefined> {
  const [row] = await db.select().from(starterPlans).where(eq(starterPlans.id, id)).limit(1);
  return row;
}

export async function findPlanForUpdate(db: Executor, id: string): Promise<StarterPlanRow | undefined> {
  const [row] = await db.select().from(starterPlans).where(eq(starterPlans.id, id)).for('update').limit(1);
  return row;
}

export async function listPlansOf(db: Executor, ownerUserId: string, limit = 100) {
  return db
    .select({
      plan: starterPlans,
      stepsDone: sql<number>`(select count(*)::int from ${starterPlanSteps} s where s.plan_id = ${starterPlans.id} and s.completed_at is not null)`,
    })
    .from(starterPlans)
    .where(eq(starterPlans.ownerUserId, ownerUserId))
    .orderBy(desc(starterPlans.createdAt), desc(starterPlans.id))
    .limit(limit);
}

export async function updatePlanRow(db: Executor, id: string, set: Partial<typeof starterPlans.$inferInsert>) {
  const [row] = await db
    .update(starterPlans)
    .set({ ...set, updatedAt: new Date() })
    .where(eq(starterPlans.id, id))
    .returning();
  return row;
}

export async function stepsOfPlan(db: Executor, planId: string): Promise<StarterPlanStepRow[]> {
  return db
    .select()
    .from(starterPlanSteps)
    .where(eq(starterPlanSteps.planId, planId))
    .orderBy(asc(starterPlanSteps.position));
}

export async function insertStep(db: Executor, values: typeof starterPlanSteps.$inferInsert) {
  const [row] = await db.insert(starterPlanSteps).values(values).returning();
  return row!;
}

export async function updateStep(db: Executor, id: string, set: Partial<typeof starterPlanSteps.$inferInsert>) {
  const [row] = await db.update(starterPlanSteps).set(set).where(eq(starterPlanSteps.id, id)).returning();
  return row!;
}

export async function culturesByIds(db: Executor, ids: string[]) {
  if (ids.length === 0) return [];
  return db.select().from(cultures).where(inArray(cultures.id, ids));
}

// ---------------------------------------------------------------- batches

export async function insertBatch(db: Executor, values: typeof batches.$inferInsert): Promise<BatchRow> {
  const [row] = await db.insert(batches).values(values).returning();
  return row!;
}

export async function insertPitches(db: Executor, values: (typeof batchPitches.$inferInsert)[]) {
  if (values.length) await db.insert(batchPitches).values(values);
}

export async function insertHarvest(db: Executor, values: typeof batchHarvests.$inferInsert) {
  await db.insert(batchHarvests).values(values);
}

export async function findBatch(db: Executor, id: string): Promise<BatchRow | undefined> {
  const [row] = await db.select().from(batches).where(eq(batches.id, id)).limit(1);
  return row;
}

export async function updateBatchRow(db: Executor, id: string, set: Partial<typeof batches.$inferInsert>) {
  const [row] = await db
    .update(batches)
    .set({ ...set, updatedAt: new Date() })
    .where(eq(batches.id, id))
    .returning();
  return row!;
}

export async function listBatchesOf(db: Executor, ownerUserId: string, limit = 200) {
  return db
    .select()
    .from(batches)
    .where(eq(batches.ownerUserId, ownerUserId))
    .orderBy(desc(batches.brewedAt), desc(batches.id))
    .limit(limit);
}

export async function batchIdsOfPlan(db: Executor, planId: string): Promise<string[]> {
  const rows = await db.select({ id: batches.id }).from(batches).where(eq(batches.planId, planId));
  return rows.map((r) => r.id);
}

export async function pitchesOf(db: Executor, batchIds: string[]) {
  if (batchIds.length === 0) return [];
  return db
    .select({ pitch: batchPitches, strainName: cultures.strainName })
    .from(batchPitches)
    .innerJoin(cultures, eq(cultures.id, batchPitches.cultureId))
    .where(inArray(batchPitches.batchId, batchIds));
}

export async function harvestsOf(db: Executor, batchId: string) {
  return db
    .select({ harvest: batchHarvests, strainName: cultures.strainName, generation: cultures.generation })
    .from(batchHarvests)
    .innerJoin(cultures, eq(cultures.id, batchHarvests.cultureId))
    .where(eq(batchHarvests.batchId, batchId))
    .orderBy(asc(batchHarvests.createdAt));
}

/** Batches of one owner pitched with any of `cultureIds`, with the pitch's generation. */
export async function batchesPitchedWith(db: Executor, ownerUserId: string, cultureIds: string[]) {
  if (cultureIds.length === 0) return [];
  return db
    .select({ batch: batches, pitch: batchPitches, strainName: cultures.strainName })
    .from(batchPitches)
    .innerJoin(batches, eq(batches.id, batchPitches.batchId))
    .innerJoin(cultures, eq(cultures.id, batchPitches.cultureId))
    .where(and(eq(batches.ownerUserId, ownerUserId), inArray(batchPitches.cultureId, cultureIds)))
    .orderBy(asc(batchPitches.generation), asc(batches.brewedAt));
}

/** Batches of one owner pitched with a culture of this strain name (case-insensitive). */
export async function batchesPitchedWithStrain(db: Executor, ownerUserId: string, strain: string) {
  return db
    .select({ batch: batches, pitch: batchPitches, strainName: cultures.strainName })
    .from(batchPitches)
    .innerJoin(batches, eq(batches.id, batchPitches.batchId))
    .innerJoin(cultures, eq(cultures.id, batchPitches.cultureId))
    .where(and(eq(batches.ownerUserId, ownerUserId), sql`lower(${cultures.strainName}) = lower(${strain})`))
    .orderBy(asc(batchPitches.generation), asc(batches.brewedAt));
}
