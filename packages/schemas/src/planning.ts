import { z } from 'zod';
import { platoFromSg, type BrewPlan, type CultureCellsInput, type PitchRatePresetKey } from '@barmkeep/core';
import { limits } from './limits';
import { CountDataSchema, dateTimeField, type CultureDetailDto } from './cultures';

/** Limits for brew-day planning, shared by the API and the forms. */
export const planningLimits = {
  nameMax: 120,
  vesselLabelMax: 40,
  vesselsMax: 12,
  vesselMinMl: 5,
  vesselMaxMl: 25_000,
  batchMaxL: 2_000,
  ogMinPlato: 1,
  ogMaxPlato: 35,
  starterMinPlato: 4,
  starterMaxPlato: 15,
  stepFactorMin: 2,
  stepFactorMax: 20,
  coldCrashMaxHours: 96,
  customRateMin: 0.1,
  customRateMax: 3,
  targetMinCells: 1e8,
  targetMaxCells: 1e13,
  culturesMax: 5,
  /** how far ahead a brew date may be */
  brewAheadMaxDays: 366,
  lagMaxHours: 400,
  cellsPitchedMax: 1e14,
  fermentTempMinC: -5,
  fermentTempMaxC: 45,
  futureSkewMs: 5 * 60_000,
} as const;

export const BEER_TYPES = ['ale', 'lager', 'highGravityAle', 'highGravityLager', 'custom'] as const;
export type BeerType = (typeof BEER_TYPES)[number];
export type PresetBeerType = Exclude<BeerType, 'custom'> & PitchRatePresetKey;

const MS_PER_DAY = 86_400_000;
const id = z.string().trim().min(1).max(64);
const nameField = (what: string) =>
  z
    .string({ error: `Enter ${what}` })
    .trim()
    .min(1, `Enter ${what}`)
    .max(planningLimits.nameMax, `At most ${planningLimits.nameMax} characters`);
const notesField = z.string().trim().max(limits.notesMax, `At most ${limits.notesMax} characters`).default('');
const num = (what: string, min: number, max: number, unit = '') =>
  z
    .number({ error: `Enter ${what} as a number` })
    .refine(Number.isFinite, `Enter ${what} as a number`)
    .refine((v) => v >= min, `${cap(what)} must be at least ${min}${unit}`)
    .refine((v) => v <= max, `${cap(what)} above ${max}${unit} is not possible here`);
function cap(s: string) {
  return s[0]!.toUpperCase() + s.slice(1);
}

// ---------------------------------------------------------------- equipment

export const EquipmentVesselSchema = z.object({
  label: z
    .string()
    .trim()
    .max(planningLimits.vesselLabelMax, `At most ${planningLimits.vesselLabelMax} characters`)
    .default(''),
  volumeMl: num('the working volume (mL)', planningLimits.vesselMinMl, planningLimits.vesselMaxMl, ' mL'),
});
export type EquipmentVessel = z.output<typeof EquipmentVesselSchema>;

export const EquipmentUpdateSchema = z.object({
  vessels: z
    .array(EquipmentVesselSchema)
    .min(1, 'Add at least one flask or jar')
    .max(planningLimits.vesselsMax, `At most ${planningLimits.vesselsMax} vessels`),
  stirPlate: z.boolean(),
  withoutStirPlate: z.enum(['shake', 'still']),
  starterPlato: num('the starter gravity (°P)', planningLimits.starterMinPlato, planningLimits.starterMaxPlato, ' °P'),
  maxStepFactor: num('the largest step', planningLimits.stepFactorMin, planningLimits.stepFactorMax, '×'),
  coldCrashHours: z
    .number({ error: 'Enter the chill time in hours' })
    .int('Whole hours')
    .min(0, 'At least 0 hours')
    .max(planningLimits.coldCrashMaxHours, `At most ${planningLimits.coldCrashMaxHours} hours`),
  growthCorrectionOptIn: z.boolean(),
});
export type EquipmentUpdateInput = z.input<typeof EquipmentUpdateSchema>;
export type EquipmentData = z.output<typeof EquipmentUpdateSchema>;

/** Equipment before the person has saved any: a common home kit [CP]. */
export const DEFAULT_EQUIPMENT: EquipmentData = {
  vessels: [
    { label: 'Small jar', volumeMl: 50 },
    { label: 'Jam jar', volumeMl: 250 },
    { label: 'Pint jar', volumeMl: 500 },
    { label: '1 L flask', volumeMl: 1000 },
    { label: '2 L flask', volumeMl: 2000 },
  ],
  stirPlate: false,
  withoutStirPlate: 'shake',
  starterPlato: Math.round(platoFromSg(1.036) * 100) / 100,
  maxStepFactor: 10,
  coldCrashHours: 24,
  growthCorrectionOptIn: false,
};

/** What a plan runs with: the account's equipment, turned into core's terms. */
export interface PlanEquipmentData {
  vesselsL: number[];
  agitation: 'stir' | 'shake' | 'still';
  starterPlato: number;
  maxStepFactor: number;
  coldCrashHours: number;
}

export function planEquipmentOf(e: EquipmentData, extraVesselsMl: number[] = []): PlanEquipmentData {
  const ml = [...e.vessels.map((v) => v.volumeMl), ...extraVesselsMl];
  return {
    vesselsL: [...new Set(ml)].sort((a, b) => a - b).map((v) => v / 1000),
    agitation: e.stirPlate ? 'stir' : e.withoutStirPlate,
    starterPlato: e.starterPlato,
    maxStepFactor: e.maxStepFactor,
    coldCrashHours: e.coldCrashHours,
  };
}

export interface GrowthCorrectionDto {
  ratio: number;
  steps: number;
  perStep: number[];
  optedIn: boolean;
  /** the ratio new plans use: the measured one if opted in, else 1 */
  applied: number;
}

export interface EquipmentDto extends EquipmentData {
  saved: boolean;
  growthCorrection: GrowthCorrectionDto;
}

// ---------------------------------------------------------------- plans

const planObject = z.object({
  name: nameField('a name for the plan'),
  purpose: z.enum(['batch', 'grow'], { error: 'Say whether this is for a batch or to grow the culture' }),
  cultureIds: z
    .array(id)
    .min(1, 'Choose a culture')
    .max(planningLimits.culturesMax, `At most ${planningLimits.culturesMax} cultures in one blend`),
  batchVolumeL: num('the batch volume (L)', 0.1, planningLimits.batchMaxL, ' L').optional(),
  ogPlato: num('the original gravity (°P)', planningLimits.ogMinPlato, planningLimits.ogMaxPlato, ' °P').optional(),
  beerType: z.enum(BEER_TYPES, { error: 'Choose the kind of beer' }).optional(),
  customRate: num(
    'the pitch rate',
    planningLimits.customRateMin,
    planningLimits.customRateMax,
    ' million cells/mL/°P',
  ).optional(),
  targetCells: num('the cells wanted', planningLimits.targetMinCells, planningLimits.targetMaxCells).optional(),
  brewAt: dateTimeField.optional(),
  /** vessels added for this plan only (e.g. a smaller first jar), mL */
  extraVesselsMl: z
    .array(num('the working volume (mL)', planningLimits.vesselMinMl, planningLimits.vesselMaxMl, ' mL'))
    .max(4, 'At most 4 extra vessels')
    .default([]),
});
export type PlanCreateInput = z.input<typeof planObject>;
export type PlanCreateData = z.output<typeof planObject>;

export function planCreateIssues(v: PlanCreateData, now: Date): { path: string[]; message: string }[] {
  const issues: { path: string[]; message: string }[] = [];
  if (v.purpose === 'batch') {
    if (v.batchVolumeL === undefined) issues.push({ path: ['batchVolumeL'], message: 'Enter the batch volume' });
    if (v.ogPlato === undefined) issues.push({ path: ['ogPlato'], message: 'Enter the original gravity' });
    if (v.beerType === undefined) issues.push({ path: ['beerType'], message: 'Choose the kind of beer' });
    if (v.beerType === 'custom' && v.customRate === undefined) {
      issues.push({ path: ['customRate'], message: 'Enter your pitch rate' });
    }
    if (!v.brewAt) issues.push({ path: ['brewAt'], message: 'Enter the brew date' });
  } else if (v.targetCells === undefined) {
    issues.push({ path: ['targetCells'], message: 'Enter how many cells you want to grow' });
  }
  if (v.brewAt) {
    if (v.brewAt.getTime() < now.getTime() - planningLimits.futureSkewMs) {
      issues.push({ path: ['brewAt'], message: 'The brew date is in the past' });
    } else if (v.brewAt.getTime() > now.getTime() + planningLimits.brewAheadMaxDays * MS_PER_DAY) {
      issues.push({ path: ['brewAt'], message: 'Plan at most a year ahead' });
    }
  }
  if (new Set(v.cultureIds).size !== v.cultureIds.length) {
    issues.push({ path: ['cultureIds'], message: 'The same culture is listed twice' });
  }
  return issues;
}

export function makePlanCreateSchema(now: () => Date = () => new Date()) {
  return planObject.superRefine((v, ctx) => {
    for (const issue of planCreateIssues(v, now())) ctx.addIssue({ code: 'custom', ...issue });
  });
}
export const PlanCreateSchema = makePlanCreateSchema();

export const PlanIdParamsSchema = z.object({ id });
export const PlanStepParamsSchema = z.object({ id, stepId: id });

export const PlanStepCompleteSchema = z.object({
  /** a hemocytometer count of the finished starter (optional) */
  count: CountDataSchema.optional(),
  notes: notesField,
});
export type PlanStepCompleteInput = z.input<typeof PlanStepCompleteSchema>;

export const PlanStatusSchema = z.object({ status: z.enum(['planned', 'cancelled']) });

export interface CountResultData {
  cellsCounted: number;
  squaresCounted: number;
  dilution: number;
  squareSize: 'medium' | 'large';
  live?: number;
  dead?: number;
  cellsPerMl: number;
  ci95: [number, number];
  viability: number | null;
  viabilityCi95: [number, number] | null;
}

/** Dates become ISO strings on the wire. */
export type Wire<T> = T extends Date
  ? string
  : T extends (infer U)[]
    ? Wire<U>[]
    : T extends object
      ? { [K in keyof T]: Wire<T[K]> }
      : T;

export type BrewPlanDto = Wire<BrewPlan>;

export interface PlanStepLogDto {
  id: string;
  position: number;
  volumeL: number;
  plato: number;
  dmeGrams: number;
  hours: number;
  start: { cells: number; low: number; high: number };
  expectedCells: number;
  startedAt: string;
  completedAt: string | null;
  measured: { cells: number; low: number; high: number } | null;
  count: CountResultData | null;
  notes: string;
}

export interface PlanCultureDto {
  id: string;
  strainName: string;
  form: string;
  generation: number;
  state: string;
  /** null when the culture is no longer visible to this person */
  available: boolean;
}

export interface PlanDto {
  id: string;
  name: string;
  purpose: 'batch' | 'grow';
  status: 'planned' | 'in_progress' | 'pitched' | 'cancelled';
  cultureIds: string[];
  cultures: PlanCultureDto[];
  batchVolumeL: number | null;
  ogPlato: number | null;
  beerType: BeerType | null;
  customRate: number | null;
  targetCells: number | null;
  brewAt: string | null;
  equipment: PlanEquipmentData;
  growthCorrection: number;
  timeZone: string;
  executed: PlanStepLogDto[];
  /** recomputed by the API with core's computeBrewPlan on every read */
  computed: BrewPlanDto;
  computedAt: string;
  batchIds: string[];
  createdAt: string;
}

export interface PlanSummaryDto {
  id: string;
  name: string;
  purpose: 'batch' | 'grow';
  status: PlanDto['status'];
  brewAt: string | null;
  strainNames: string[];
  stepsDone: number;
  createdAt: string;
}

// ---------------------------------------------------------------- batches

const sgField = (what: string) => num(what, 0.99, 1.2);

const batchObject = z.object({
  name: nameField('a name for the batch'),
  brewedAt: dateTimeField,
  volumeL: num('the batch volume (L)', 0.1, planningLimits.batchMaxL, ' L'),
  ogSg: sgField('the original gravity (SG)').refine((v) => v >= 1, 'The original gravity must be at least 1.000'),
  fgSg: sgField('the final gravity (SG)').optional(),
  fermentationTempC: num(
    'the fermentation temperature',
    planningLimits.fermentTempMinC,
    planningLimits.fermentTempMaxC,
    ' °C',
  ).optional(),
  lagHours: num('the lag time', 0, planningLimits.lagMaxHours, ' h').optional(),
  notes: notesField,
  planId: id.optional(),
  pitches: z
    .array(
      z.object({ cultureId: id, cellsPitched: num('the cells pitched', 0, planningLimits.cellsPitchedMax).optional() }),
    )
    .min(1, 'Choose the culture you pitched')
    .max(planningLimits.culturesMax, `At most ${planningLimits.culturesMax} cultures`),
  /** the whole culture went in (it is then marked pitched) */
  usedUp: z.boolean().default(true),
});

export function makeBatchCreateSchema(now: () => Date = () => new Date()) {
  return batchObject.superRefine((v, ctx) => {
    if (v.fgSg !== undefined && v.fgSg > v.ogSg) {
      ctx.addIssue({ code: 'custom', path: ['fgSg'], message: 'The final gravity is above the original gravity' });
    }
    if (v.brewedAt.getTime() > now().getTime() + planningLimits.futureSkewMs) {
      ctx.addIssue({
        code: 'custom',
        path: ['brewedAt'],
        message: 'Record a batch once it is brewed: this date is in the future',
      });
    }
    if (new Set(v.pitches.map((p) => p.cultureId)).size !== v.pitches.length) {
      ctx.addIssue({ code: 'custom', path: ['pitches'], message: 'The same culture is listed twice' });
    }
  });
}
export const BatchCreateSchema = makeBatchCreateSchema();
export type BatchCreateInput = z.input<typeof BatchCreateSchema>;
export type BatchCreateData = z.output<typeof BatchCreateSchema>;

export const BatchUpdateSchema = z
  .object({
    name: nameField('a name for the batch'),
    fgSg: sgField('the final gravity (SG)').nullable(),
    fermentationTempC: num(
      'the fermentation temperature',
      planningLimits.fermentTempMinC,
      planningLimits.fermentTempMaxC,
      ' °C',
    ).nullable(),
    lagHours: num('the lag time', 0, planningLimits.lagMaxHours, ' h').nullable(),
    notes: z.string().trim().max(limits.notesMax),
  })
  .partial()
  .refine((v) => Object.keys(v).length > 0, 'Nothing to change');
export type BatchUpdateInput = z.input<typeof BatchUpdateSchema>;

export const BatchIdParamsSchema = z.object({ id });

export const BatchHarvestSchema = z.object({
  parentCultureId: id,
  form: z.enum(['slurry_unwashed', 'slurry_washed']).default('slurry_unwashed'),
  volumeMl: num('the slurry volume (mL)', 1, 20_000, ' mL'),
  storageTempC: num('the storage temperature', -5, 30, ' °C'),
  locationLabel: z.string().trim().max(80, 'At most 80 characters').default(''),
  notes: notesField,
});
export type BatchHarvestInput = z.input<typeof BatchHarvestSchema>;

export const GenerationChartQuerySchema = z
  .object({ cultureId: id.optional(), strain: z.string().trim().min(1).max(120).optional() })
  .refine((v) => v.cultureId || v.strain, 'Give a culture or a strain name');

export interface BatchDerivedDto {
  abv: number | null;
  apparentAttenuation: number | null;
  realAttenuation: number | null;
  ogPlato: number;
  /** million cells per mL per °P actually pitched, when the cells are known */
  pitchRate: number | null;
}

export interface BatchDto {
  id: string;
  name: string;
  brewedAt: string;
  volumeL: number;
  ogSg: number;
  fgSg: number | null;
  fermentationTempC: number | null;
  lagHours: number | null;
  notes: string;
  planId: string | null;
  pitches: { cultureId: string; strainName: string; generation: number; cellsPitched: number | null }[];
  harvests: { cultureId: string; parentCultureId: string; strainName: string; generation: number }[];
  derived: BatchDerivedDto;
  createdAt: string;
}

export interface GenerationPointDto {
  batchId: string;
  batchName: string;
  brewedAt: string;
  cultureId: string;
  strainName: string;
  generation: number;
  apparentAttenuation: number | null;
  lagHours: number | null;
}

/**
 * The fields of a culture (as the API presents it) that core's computeBrewPlan needs, or the reason
 * it cannot be used. Browser and API both call this, so they plan from the same numbers.
 */
export function cultureCellsInputOf(
  c: Pick<CultureDetailDto, 'form' | 'madeAt' | 'storageTempC' | 'health'>,
): { input: CultureCellsInput } | { missing: string } {
  const cells = c.health.cells;
  if (!cells) return { missing: c.health.cellsMissing ?? 'This culture has no cell figure yet.' };
  const m = c.health.measured;
  return {
    input: {
      form: c.form,
      madeAt: new Date(c.madeAt),
      storageTempC: c.storageTempC,
      measuredAt: m?.at && m.viability != null ? new Date(m.at) : null,
      measuredViability: m?.viability ?? null,
      cells: { cells: cells.total, low: cells.low, high: cells.high },
    },
  };
}
