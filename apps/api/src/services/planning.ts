/**
 * Brew-day planning: equipment, starter plans and their step log. Every number comes from core's
 * computeBrewPlan; a saved plan stores only its inputs and what really happened, and is recomputed
 * on every read so the browser and the API can never disagree.
 */
import {
  computeBrewPlan,
  growthCorrectionRatio,
  hemocytometerCount,
  viabilityFromStain,
  SQUARE_VOLUME_ML,
  type BrewPlan,
  type CultureCellsInput,
  type ExecutedStep,
  type PlanTarget,
} from '@barmkeep/core';
import {
  DEFAULT_EQUIPMENT,
  IN_USE_STATES,
  cultureCellsInputOf,
  planEquipmentOf,
  type BrewPlanDto,
  type CountResultData,
  type CultureDetailDto,
  type EquipmentData,
  type EquipmentDto,
  type GrowthCorrectionDto,
  type PlanCreateData,
  type PlanCultureDto,
  type PlanDto,
  type PlanStepCompleteInput,
  type PlanSummaryDto,
} from '@barmkeep/schemas';
import type { z } from 'zod';
import type { PlanStepCompleteSchema } from '@barmkeep/schemas';
import type { BrewingEquipmentRow, StarterPlanRow, StarterPlanStepRow } from '../db/schema';
import {
  batchIdsOfPlan,
  culturesByIds,
  findEquipment,
  findPlan,
  findPlanForUpdate,
  insertPlan,
  insertStep,
  listPlansOf,
  measuredStepsOf,
  stepsOfPlan,
  updatePlanRow,
  updateStep,
  upsertEquipment,
} from '../db/queries/planning';
import { AppError, conflict, notFound, validationFailed } from '../lib/errors';
import { newId } from '../lib/ids';
import { canView, type Actor } from './cultureAccess';
import { getCultureDetail } from './cultures';
import { inTransaction, type ServiceContext } from './context';

export interface PlanActor extends Actor {
  timeZone: string;
}

// ---------------------------------------------------------------- equipment

function equipmentData(row: BrewingEquipmentRow | undefined): EquipmentData {
  if (!row) return DEFAULT_EQUIPMENT;
  return {
    vessels: row.vessels,
    stirPlate: row.stirPlate,
    withoutStirPlate: row.withoutStirPlate,
    starterPlato: row.starterPlato,
    maxStepFactor: row.maxStepFactor,
    coldCrashHours: row.coldCrashHours,
    growthCorrectionOptIn: row.growthCorrectionOptIn,
  };
}

export async function growthCorrectionOf(
  ctx: ServiceContext,
  userId: string,
  optedIn: boolean,
): Promise<GrowthCorrectionDto> {
  const rows = await measuredStepsOf(ctx.db, userId);
  const g = growthCorrectionRatio(
    rows.map((r) => ({ startCells: r.startCells, predictedCells: r.expectedCells, measuredCells: r.measuredCells! })),
  );
  return { ...g, optedIn, applied: optedIn && g.steps > 0 ? g.ratio : 1 };
}

export async function getEquipment(ctx: ServiceContext, actor: Actor): Promise<EquipmentDto> {
  const row = await findEquipment(ctx.db, actor.id);
  const data = equipmentData(row);
  return {
    ...data,
    saved: !!row,
    growthCorrection: await growthCorrectionOf(ctx, actor.id, data.growthCorrectionOptIn),
  };
}

export async function saveEquipment(ctx: ServiceContext, actor: Actor, input: EquipmentData): Promise<EquipmentDto> {
  const volumes = input.vessels.map((v) => v.volumeMl);
  if (new Set(volumes).size !== volumes.length) {
    throw validationFailed({ 'body.vessels': ['Two vessels have the same volume; list each size once'] });
  }
  await upsertEquipment(ctx.db, actor.id, {
    ...input,
    vessels: [...input.vessels].sort((a, b) => a.volumeMl - b.volumeMl),
  });
  return getEquipment(ctx, actor);
}

// ---------------------------------------------------------------- computing a plan

interface PlanInputs {
  purpose: 'batch' | 'grow';
  batchVolumeL: number | null;
  ogPlato: number | null;
  beerType: string | null;
  customRate: number | null;
  targetCells: number | null;
}

function targetOf(p: PlanInputs): PlanTarget {
  if (p.purpose === 'grow') return { kind: 'cells', cells: p.targetCells! };
  const rate =
    p.beerType === 'custom' ? p.customRate! : (p.beerType as 'ale' | 'lager' | 'highGravityAle' | 'highGravityLager');
  return { kind: 'batch', volumeL: p.batchVolumeL!, plato: p.ogPlato!, rate };
}

function executedOf(steps: StarterPlanStepRow[]): ExecutedStep[] {
  return steps.map((s) => ({
    volumeL: s.volumeL,
    plato: s.plato,
    hours: s.hours,
    start: { cells: s.startCells, low: s.startLow, high: s.startHigh },
    expectedCells: s.expectedCells,
    startedAt: s.startedAt,
    completedAt: s.completedAt,
    measured: s.measuredCells != null ? { cells: s.measuredCells, low: s.measuredLow!, high: s.measuredHigh! } : null,
  }));
}

/** Load the plan's cultures through the culture library (which decides who may see them). */
async function loadCultures(ctx: ServiceContext, actor: Actor, ids: string[], field?: string) {
  const details: (CultureDetailDto | null)[] = [];
  for (const id of ids) {
    try {
      details.push(await getCultureDetail(ctx, actor, id));
    } catch (err) {
      if (err instanceof AppError && err.status === 404) {
        if (field) throw validationFailed({ [field]: ['No culture of yours has this id'] });
        details.push(null);
      } else throw err;
    }
  }
  return details;
}

function cellsInputs(details: (CultureDetailDto | null)[], field?: string): CultureCellsInput[] {
  const out: CultureCellsInput[] = [];
  for (const d of details) {
    if (!d) continue;
    const r = cultureCellsInputOf(d);
    if ('missing' in r) {
      if (field) throw validationFailed({ [field]: [`${d.strainName}: ${r.missing}`] });
      continue;
    }
    out.push(r.input);
  }
  return out;
}

function toWire(plan: BrewPlan): BrewPlanDto {
  return JSON.parse(JSON.stringify(plan)) as BrewPlanDto;
}

function compute(
  ctx: ServiceContext,
  actor: PlanActor,
  p: PlanInputs & { brewAt: Date | null; equipment: StarterPlanRow['equipment']; growthCorrection: number },
  cultures: CultureCellsInput[],
  executed: ExecutedStep[],
): BrewPlan {
  try {
    return computeBrewPlan({
      now: ctx.now(),
      timeZone: actor.timeZone,
      brewAt: p.brewAt,
      target: targetOf(p),
      cultures,
      equipment: p.equipment,
      growthCorrection: p.growthCorrection,
      executed,
    });
  } catch (err) {
    if (err instanceof RangeError) throw validationFailed({ body: [err.message] });
    throw err;
  }
}

async function draftOf(ctx: ServiceContext, actor: PlanActor, input: PlanCreateData) {
  const details = await loadCultures(ctx, actor, input.cultureIds, 'body.cultureIds');
  for (const d of details) {
    if (d && !IN_USE_STATES.includes(d.state)) {
      throw validationFailed({
        'body.cultureIds': [`${d.strainName} is ${d.state.replace('_', ' ')}; choose a culture you still keep`],
      });
    }
  }
  const cultures = cellsInputs(details, 'body.cultureIds');
  const eq = await getEquipment(ctx, actor);
  const equipment = planEquipmentOf(eq, input.extraVesselsMl);
  const inputs = {
    purpose: input.purpose,
    batchVolumeL: input.purpose === 'batch' ? (input.batchVolumeL ?? null) : null,
    ogPlato: input.purpose === 'batch' ? (input.ogPlato ?? null) : null,
    beerType: input.purpose === 'batch' ? (input.beerType ?? null) : null,
    customRate: input.purpose === 'batch' && input.beerType === 'custom' ? (input.customRate ?? null) : null,
    targetCells: input.purpose === 'grow' ? (input.targetCells ?? null) : null,
    brewAt: input.brewAt ?? null,
    equipment,
    growthCorrection: eq.growthCorrection.applied,
  };
  return { inputs, details, computed: compute(ctx, actor, inputs, cultures, []) };
}

/** The pitch recommendation and ladder for a plan that is not saved (what the planner page shows). */
export async function previewPlan(ctx: ServiceContext, actor: PlanActor, input: PlanCreateData) {
  const { computed } = await draftOf(ctx, actor, input);
  return { computed: toWire(computed), computedAt: ctx.now().toISOString() };
}

export async function createPlan(ctx: ServiceContext, actor: PlanActor, input: PlanCreateData): Promise<PlanDto> {
  const { inputs } = await draftOf(ctx, actor, input);
  const row = await insertPlan(ctx.db, {
    id: newId(),
    ownerUserId: actor.id,
    name: input.name,
    cultureIds: input.cultureIds,
    ...inputs,
  });
  return getPlan(ctx, actor, row.id);
}

/** Someone else's plan is indistinguishable from one that does not exist. */
function assertOwnPlan(actor: Actor, row: StarterPlanRow | undefined): StarterPlanRow {
  if (!row || row.ownerUserId !== actor.id) throw notFound('This plan');
  return row;
}

function presentStep(s: StarterPlanStepRow) {
  return {
    id: s.id,
    position: s.position,
    volumeL: s.volumeL,
    plato: s.plato,
    dmeGrams: s.dmeGrams,
    hours: s.hours,
    start: { cells: s.startCells, low: s.startLow, high: s.startHigh },
    expectedCells: s.expectedCells,
    startedAt: s.startedAt.toISOString(),
    completedAt: s.completedAt?.toISOString() ?? null,
    measured: s.measuredCells != null ? { cells: s.measuredCells, low: s.measuredLow!, high: s.measuredHigh! } : null,
    count: s.count ?? null,
    notes: s.notes,
  };
}

async function planState(ctx: ServiceContext, actor: PlanActor, row: StarterPlanRow) {
  const steps = await stepsOfPlan(ctx.db, row.id);
  const details = await loadCultures(ctx, actor, row.cultureIds);
  const computed = compute(ctx, actor, row, cellsInputs(details), executedOf(steps));
  return { steps, details, computed };
}

export async function getPlan(ctx: ServiceContext, actor: PlanActor, id: string): Promise<PlanDto> {
  const row = assertOwnPlan(actor, await findPlan(ctx.db, id));
  const { steps, details, computed } = await planState(ctx, actor, row);
  const rows = await culturesByIds(ctx.db, row.cultureIds);
  const byId = new Map(rows.map((r) => [r.id, r]));
  const cultures: PlanCultureDto[] = row.cultureIds.map((cid, i) => {
    const r = byId.get(cid);
    const visible = !!r && canView(actor, r) && !!details[i];
    return {
      id: cid,
      strainName: visible ? r!.strainName : 'Culture no longer available',
      form: visible ? r!.form : '',
      generation: visible ? r!.generation : 0,
      state: visible ? r!.state : '',
      available: visible,
    };
  });
  return {
    id: row.id,
    name: row.name,
    purpose: row.purpose,
    status: row.status,
    cultureIds: row.cultureIds,
    cultures,
    batchVolumeL: row.batchVolumeL,
    ogPlato: row.ogPlato,
    beerType: row.beerType as PlanDto['beerType'],
    customRate: row.customRate,
    targetCells: row.targetCells,
    brewAt: row.brewAt?.toISOString() ?? null,
    equipment: row.equipment,
    growthCorrection: row.growthCorrection,
    timeZone: actor.timeZone,
    executed: steps.map(presentStep),
    computed: toWire(computed),
    computedAt: ctx.now().toISOString(),
    batchIds: await batchIdsOfPlan(ctx.db, row.id),
    createdAt: row.createdAt.toISOString(),
  };
}

export async function listPlans(ctx: ServiceContext, actor: Actor): Promise<PlanSummaryDto[]> {
  const rows = await listPlansOf(ctx.db, actor.id);
  const ids = [...new Set(rows.flatMap((r) => r.plan.cultureIds))];
  const names = new Map(
    (await culturesByIds(ctx.db, ids)).filter((c) => canView(actor, c)).map((c) => [c.id, c.strainName]),
  );
  return rows.map(({ plan, stepsDone }) => ({
    id: plan.id,
    name: plan.name,
    purpose: plan.purpose,
    status: plan.status,
    brewAt: plan.brewAt?.toISOString() ?? null,
    strainNames: plan.cultureIds.map((c) => names.get(c)).filter((n): n is string => !!n),
    stepsDone,
    createdAt: plan.createdAt.toISOString(),
  }));
}

// ---------------------------------------------------------------- step log

function assertOpen(row: StarterPlanRow) {
  if (row.status === 'cancelled') throw conflict('plan_cancelled', 'This plan was cancelled');
  if (row.status === 'pitched') throw conflict('plan_pitched', 'This plan was already pitched into a batch');
}

/** Start the next step of the plan as it stands now; its planned numbers are frozen in the log. */
export async function startNextStep(ctx: ServiceContext, actor: PlanActor, id: string): Promise<PlanDto> {
  await inTransaction(ctx, async (tx) => {
    // the plan's row lock serializes starts: a second request waits here, then sees the open step
    const row = assertOwnPlan(actor, await findPlanForUpdate(tx.db, id));
    assertOpen(row);
    const { steps, computed } = await planState(tx, actor, row);
    const open = steps.find((s) => !s.completedAt);
    if (open) throw conflict('step_in_progress', `Step ${open.position} is still under way; complete it first`);
    const next = computed.steps[0];
    if (!next) {
      throw conflict(
        'no_step_left',
        computed.noStarterNeeded ? 'No starter is needed for this plan' : 'Every step of this plan is done',
      );
    }
    await insertStep(tx.db, {
      id: newId(),
      planId: row.id,
      position: steps.length + 1,
      volumeL: next.volumeL,
      plato: next.plato,
      dmeGrams: next.dmeGrams,
      hours: next.hours,
      startCells: next.startCells.cells,
      startLow: next.startCells.low,
      startHigh: next.startCells.high,
      expectedCells: next.expectedCells,
      startedAt: tx.now(),
    });
    await updatePlanRow(tx.db, row.id, { status: 'in_progress' });
  });
  return getPlan(ctx, actor, id);
}

/**
 * A count of a finished starter, as viable cells in the whole step: cells/mL × volume × stained
 * viability (without a stain the count is taken as all alive, docs/yeast-math.md §11). The range is
 * the count's Poisson 95% interval times the stain's Wilson interval.
 */
function measuredFromCount(count: NonNullable<z.output<typeof PlanStepCompleteSchema>['count']>, volumeL: number) {
  let c;
  try {
    c = hemocytometerCount({
      cellsCounted: count.cellsCounted,
      squaresCounted: count.squaresCounted,
      dilution: count.dilution,
      squareVolumeMl: SQUARE_VOLUME_ML[count.squareSize],
    });
  } catch (err) {
    if (err instanceof RangeError) throw validationFailed({ 'body.count': [err.message] });
    throw err;
  }
  const stain =
    count.live !== undefined && count.dead !== undefined
      ? viabilityFromStain({ live: count.live, dead: count.dead })
      : null;
  const v = stain?.viability ?? 1;
  const [vLo, vHi] = stain?.ci95 ?? [1, 1];
  const ml = volumeL * 1000;
  const result: CountResultData = {
    ...count,
    cellsPerMl: c.cellsPerMl,
    ci95: c.ci95,
    viability: stain?.viability ?? null,
    viabilityCi95: stain?.ci95 ?? null,
  };
  return { measured: { cells: c.cellsPerMl * ml * v, low: c.ci95[0] * ml * vLo, high: c.ci95[1] * ml * vHi }, result };
}

export async function completeStep(
  ctx: ServiceContext,
  actor: PlanActor,
  id: string,
  stepId: string,
  input: z.output<typeof PlanStepCompleteSchema> | PlanStepCompleteInput,
): Promise<PlanDto> {
  await ctx.db.transaction(async (tx) => {
    const row = assertOwnPlan(actor, await findPlanForUpdate(tx, id));
    assertOpen(row);
    const steps = await stepsOfPlan(tx, row.id);
    const step = steps.find((s) => s.id === stepId);
    if (!step) throw notFound('This step');
    if (step.completedAt) throw conflict('step_completed', 'This step is already complete');
    const m = input.count ? measuredFromCount(input.count as never, step.volumeL) : null;
    await updateStep(tx, step.id, {
      completedAt: ctx.now(),
      notes: input.notes ?? '',
      ...(m
        ? {
            measuredCells: m.measured.cells,
            measuredLow: m.measured.low,
            measuredHigh: m.measured.high,
            count: m.result,
          }
        : {}),
    });
  });
  return getPlan(ctx, actor, id);
}

export async function setPlanStatus(
  ctx: ServiceContext,
  actor: PlanActor,
  id: string,
  status: 'planned' | 'cancelled',
) {
  const row = assertOwnPlan(actor, await findPlan(ctx.db, id));
  if (row.status === 'pitched') throw conflict('plan_pitched', 'This plan was already pitched into a batch');
  await updatePlanRow(ctx.db, id, { status });
  return getPlan(ctx, actor, id);
}

/** For batches: the plan, if it is the person's. */
export async function ownPlan(ctx: ServiceContext, actor: Actor, id: string) {
  const row = await findPlan(ctx.db, id);
  if (!row || row.ownerUserId !== actor.id) throw validationFailed({ 'body.planId': ['No plan of yours has this id'] });
  return row;
}

export async function markPlanPitched(ctx: ServiceContext, id: string) {
  await updatePlanRow(ctx.db, id, { status: 'pitched' });
}
