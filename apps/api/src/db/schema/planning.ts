import {
  pgTable,
  text,
  timestamp,
  pgEnum,
  integer,
  real,
  doublePrecision,
  jsonb,
  index,
  boolean,
  primaryKey,
  uniqueIndex,
  check,
} from 'drizzle-orm/pg-core';
import { sql } from 'drizzle-orm';
import type { CountResultData, EquipmentVessel, PlanEquipmentData } from '@barmkeep/schemas';
import { users } from './users';
import { cultures } from './cultures';

export const agitationWithoutStir = pgEnum('agitation_without_stir', ['shake', 'still']);
export const planPurpose = pgEnum('plan_purpose', ['batch', 'grow']);
export const planStatus = pgEnum('plan_status', ['planned', 'in_progress', 'pitched', 'cancelled']);

/** A person's starter kit and planning preferences (one row per account, created on first save). */
export const brewingEquipment = pgTable(
  'brewing_equipment',
  {
    userId: text('user_id')
      .primaryKey()
      .references(() => users.id, { onDelete: 'cascade' }),
    /** flasks and jars with their working volumes */
    vessels: jsonb('vessels').$type<EquipmentVessel[]>().notNull(),
    stirPlate: boolean('stir_plate').notNull().default(false),
    /** how the starter is kept moving without a stir plate */
    withoutStirPlate: agitationWithoutStir('without_stir_plate').notNull().default('shake'),
    /** gravity of the steps after the first, °P */
    starterPlato: real('starter_plato').notNull(),
    maxStepFactor: real('max_step_factor').notNull().default(10),
    coldCrashHours: integer('cold_crash_hours').notNull().default(24),
    /** use the measured/predicted growth ratio in new plans */
    growthCorrectionOptIn: boolean('growth_correction_opt_in').notNull().default(false),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    check('brewing_equipment_step_factor', sql`${t.maxStepFactor} >= 1 and ${t.maxStepFactor} <= 50`),
    check('brewing_equipment_cold_crash', sql`${t.coldCrashHours} >= 0 and ${t.coldCrashHours} <= 240`),
  ],
);

/**
 * A starter plan. Only its inputs are stored: the ladder, times and verdict are recomputed by core's
 * computeBrewPlan every time the API reads it, from these inputs and the executed steps below.
 */
export const starterPlans = pgTable(
  'starter_plans',
  {
    id: text('id').primaryKey(),
    ownerUserId: text('owner_user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    name: text('name').notNull(),
    purpose: planPurpose('purpose').notNull(),
    cultureIds: text('culture_ids').array().notNull(),
    batchVolumeL: doublePrecision('batch_volume_l'),
    ogPlato: doublePrecision('og_plato'),
    /** a PITCH_RATE_PRESETS key or 'custom' */
    beerType: text('beer_type'),
    customRate: doublePrecision('custom_rate'),
    /** viable cells wanted, for a "grow" plan */
    targetCells: doublePrecision('target_cells'),
    brewAt: timestamp('brew_at', { withTimezone: true }),
    /** the equipment the plan was made with (vessels may be added for this plan) */
    equipment: jsonb('equipment').$type<PlanEquipmentData>().notNull(),
    /** the growth correction in force when the plan was made (1 = none) */
    growthCorrection: doublePrecision('growth_correction').notNull().default(1),
    status: planStatus('status').notNull().default('planned'),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('starter_plans_owner_idx').on(t.ownerUserId, t.createdAt)],
);

/** A step the person actually started: frozen with what the plan said at that moment, then its result. */
export const starterPlanSteps = pgTable(
  'starter_plan_steps',
  {
    id: text('id').primaryKey(),
    planId: text('plan_id')
      .notNull()
      .references(() => starterPlans.id, { onDelete: 'cascade' }),
    position: integer('position').notNull(),
    volumeL: doublePrecision('volume_l').notNull(),
    plato: doublePrecision('plato').notNull(),
    dmeGrams: doublePrecision('dme_grams').notNull(),
    hours: doublePrecision('hours').notNull(),
    startCells: doublePrecision('start_cells').notNull(),
    startLow: doublePrecision('start_low').notNull(),
    startHigh: doublePrecision('start_high').notNull(),
    expectedCells: doublePrecision('expected_cells').notNull(),
    startedAt: timestamp('started_at', { withTimezone: true }).notNull(),
    completedAt: timestamp('completed_at', { withTimezone: true }),
    measuredCells: doublePrecision('measured_cells'),
    measuredLow: doublePrecision('measured_low'),
    measuredHigh: doublePrecision('measured_high'),
    count: jsonb('count').$type<CountResultData>(),
    notes: text('notes').notNull().default(''),
  },
  (t) => [uniqueIndex('starter_plan_steps_position_idx').on(t.planId, t.position)],
);

/** A brew: what went in, what came out. ABV and attenuation are derived by core, never stored. */
export const batches = pgTable(
  'batches',
  {
    id: text('id').primaryKey(),
    ownerUserId: text('owner_user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    planId: text('plan_id').references(() => starterPlans.id, { onDelete: 'set null' }),
    name: text('name').notNull(),
    brewedAt: timestamp('brewed_at', { withTimezone: true }).notNull(),
    volumeL: doublePrecision('volume_l').notNull(),
    ogSg: doublePrecision('og_sg').notNull(),
    fgSg: doublePrecision('fg_sg'),
    fermentationTempC: doublePrecision('fermentation_temp_c'),
    /** hours from pitch to visible activity */
    lagHours: doublePrecision('lag_hours'),
    notes: text('notes').notNull().default(''),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('batches_owner_idx').on(t.ownerUserId, t.brewedAt)],
);

export const batchPitches = pgTable(
  'batch_pitches',
  {
    batchId: text('batch_id')
      .notNull()
      .references(() => batches.id, { onDelete: 'cascade' }),
    cultureId: text('culture_id')
      .notNull()
      .references(() => cultures.id, { onDelete: 'cascade' }),
    /** viable cells pitched, when known */
    cellsPitched: doublePrecision('cells_pitched'),
    /** the culture's generation when it was pitched */
    generation: integer('generation').notNull(),
  },
  (t) => [primaryKey({ columns: [t.batchId, t.cultureId] }), index('batch_pitches_culture_idx').on(t.cultureId)],
);

/** Slurry cropped from a batch, kept as a new culture one generation on. */
export const batchHarvests = pgTable(
  'batch_harvests',
  {
    batchId: text('batch_id')
      .notNull()
      .references(() => batches.id, { onDelete: 'cascade' }),
    cultureId: text('culture_id')
      .notNull()
      .references(() => cultures.id, { onDelete: 'cascade' }),
    parentCultureId: text('parent_culture_id')
      .notNull()
      .references(() => cultures.id, { onDelete: 'cascade' }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [primaryKey({ columns: [t.batchId, t.cultureId] })],
);

export type BrewingEquipmentRow = typeof brewingEquipment.$inferSelect;
export type StarterPlanRow = typeof starterPlans.$inferSelect;
export type StarterPlanStepRow = typeof starterPlanSteps.$inferSelect;
export type BatchRow = typeof batches.$inferSelect;
export type BatchPitchRow = typeof batchPitches.$inferSelect;
