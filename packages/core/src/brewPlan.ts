/**
 * Brew-day planning: one pure function that the browser runs as a person types and the API runs when
 * it saves or reads a plan, so the two can never disagree (docs/yeast-math.md §11).
 *
 * It composes the published models: targetPitchCells (§3), projectViability (§4), planStepUp and
 * growStarter's growth rule (§6–7), dmeForStarter/lmeForStarter (§8) and the schedule rules
 * (schedule.ts). What is new here is bookkeeping: carrying a low–high range through the ladder,
 * the verdict bands, the water figure and the growth correction.
 */
import { extractGrams } from './gravity.js';
import { AGITATION_FACTORS, MIN_INOCULATION_CELLS_PER_ML, grownViableCells, type Agitation } from './growth.js';
import { PITCH_RATE_PRESETS, targetPitchCells, type PitchRatePresetKey } from './pitch.js';
import { DEFAULT_FIRST_STEP_PLATO, planStepUp, type PlanStep, type StepUpPlan } from './planner.js';
import { MS_PER_HOUR, scheduleBackward, scheduleForward, type ScheduledStep } from './schedule.js';
import { projectViability, type CultureForm } from './viability.js';
import { lmeForStarter } from './wort.js';

// ---------------------------------------------------------------- small models

/** A low–central–high count of viable cells. */
export interface CellRange {
  cells: number;
  low: number;
  high: number;
}

/** Verdict bands around the target [CP: pitch rates are rough; within −10% / +20% is treated as on target]. */
export const VERDICT_BANDS = { under: 0.9, over: 1.2 } as const;

export type VerdictKind = 'under' | 'on_target' | 'over';
export interface PitchVerdict {
  kind: VerdictKind;
  /** cells / target */
  ratio: number;
  /** how far from the target, percent (positive) */
  percentOff: number;
  text: string;
}

export function pitchVerdict({ cells, targetCells }: { cells: number; targetCells: number }): PitchVerdict {
  if (!(targetCells > 0)) throw new RangeError('targetCells must be > 0');
  const ratio = cells / targetCells;
  const percentOff = Math.abs(ratio - 1) * 100;
  if (ratio < VERDICT_BANDS.under) {
    return { kind: 'under', ratio, percentOff, text: `Under-pitched by ${Math.round(percentOff)}%` };
  }
  if (ratio > VERDICT_BANDS.over) {
    return { kind: 'over', ratio, percentOff, text: `Over-pitched by ${Math.round(percentOff)}%` };
  }
  return { kind: 'on_target', ratio, percentOff, text: 'On target' };
}

/**
 * Water to make up a starter: the wort's mass less the extract's, taking water as 1 g/mL
 * (mass balance [CALC]). It is the water to dissolve the extract in before topping up; boil-off is
 * extra.
 */
export function starterWaterMl({
  volumeL,
  sg,
  extractGrams: grams,
}: {
  volumeL: number;
  sg: number;
  extractGrams: number;
}) {
  if (!(volumeL > 0) || !(sg >= 1) || !(grams >= 0)) throw new RangeError('invalid starter volume, gravity or extract');
  return Math.max(0, volumeL * sg * 1000 - grams);
}

/** Most a single step's ratio can weigh in the correction, either way [CP]. */
export const GROWTH_CORRECTION_CLAMP = { min: 0.25, max: 4 } as const;
/** The correction uses the latest this-many measured steps. */
export const GROWTH_CORRECTION_WINDOW = 10;

export interface GrowthRecord {
  /** viable cells pitched into the step */
  startCells: number;
  /** viable cells the model predicted at the end */
  predictedCells: number;
  /** viable cells counted at the end */
  measuredCells: number;
}

export interface GrowthCorrection {
  /** multiply the model's new cells by this */
  ratio: number;
  /** steps it rests on */
  steps: number;
  /** each step's measured ÷ predicted new cells, oldest first */
  perStep: number[];
}

/**
 * A person's growth correction: for each measured step, measured new cells ÷ predicted new cells,
 * each clamped to 0.25–4; the correction is their geometric mean over the latest 10 steps [CALC].
 * With no measured steps it is 1 (the published model unchanged).
 */
export function growthCorrectionRatio(records: GrowthRecord[]): GrowthCorrection {
  const perStep: number[] = [];
  for (const r of records.slice(-GROWTH_CORRECTION_WINDOW)) {
    const predictedNew = r.predictedCells - r.startCells;
    if (!(predictedNew > 0)) continue;
    const measuredNew = r.measuredCells - r.startCells;
    const ratio = Math.min(
      GROWTH_CORRECTION_CLAMP.max,
      Math.max(GROWTH_CORRECTION_CLAMP.min, measuredNew / predictedNew),
    );
    perStep.push(ratio);
  }
  if (perStep.length === 0) return { ratio: 1, steps: 0, perStep };
  const logMean = perStep.reduce((s, r) => s + Math.log(r), 0) / perStep.length;
  return { ratio: Math.exp(logMean), steps: perStep.length, perStep };
}

/** The fields of a culture needed to say how many of its cells are alive at some instant. */
export interface CultureCellsInput {
  form: CultureForm;
  madeAt: Date;
  storageTempC: number;
  /** the latest stain count, which anchors the projection */
  measuredAt?: Date | null;
  measuredViability?: number | null;
  /** live and dead cells, with the range of the estimate or the count's 95% interval */
  cells: CellRange;
}

/**
 * Viable cells of a culture at `at`: cells × projected viability, the projection anchored at the
 * latest stain when there is one (§4–5).
 */
export function cultureViableCellsAt(c: CultureCellsInput, at: Date) {
  const measured = c.measuredAt != null && c.measuredViability != null;
  const p = projectViability({
    form: c.form,
    madeOrHarvestedAt: measured ? c.measuredAt! : c.madeAt,
    at,
    storageTempC: c.storageTempC,
    ...(measured ? { startViability: c.measuredViability! } : {}),
  });
  return {
    viability: p.viability,
    cells: c.cells.cells * p.viability,
    low: c.cells.low * p.viability,
    high: c.cells.high * p.viability,
    outOfRange: p.outOfRange,
    ...(p.note ? { note: p.note } : {}),
  };
}

/** Several cultures pitched together: their viable cells add up. */
export function blendViableCells(cultures: CultureCellsInput[], at: Date): CellRange {
  return cultures.reduce(
    (sum, c) => {
      const v = cultureViableCellsAt(c, at);
      return { cells: sum.cells + v.cells, low: sum.low + v.low, high: sum.high + v.high };
    },
    { cells: 0, low: 0, high: 0 },
  );
}

/** Grow a viable-cell count through a ladder of steps with the §6 rule (the planner's own). */
export function ladderCells(
  startViable: number,
  steps: readonly { volumeL: number; plato: number }[],
  agitation: Agitation,
  growthCorrection = 1,
): number[] {
  const factor = AGITATION_FACTORS[agitation].factor * growthCorrection;
  const out: number[] = [];
  let cells = startViable;
  for (const s of steps) {
    cells = grownViableCells(cells, s.volumeL, extractGrams({ volumeL: s.volumeL, plato: s.plato }), factor);
    out.push(cells);
  }
  return out;
}

// ---------------------------------------------------------------- the plan

export type PlanTarget =
  | { kind: 'batch'; volumeL: number; plato: number; rate: number | PitchRatePresetKey }
  | { kind: 'cells'; cells: number };

export interface PlanEquipment {
  /** working volumes, litres */
  vesselsL: number[];
  agitation: Agitation;
  /** gravity of the steps after the first, °P */
  starterPlato: number;
  maxStepFactor: number;
  coldCrashHours: number;
}

/** A step already started (and perhaps finished), as the plan recorded it. */
export interface ExecutedStep {
  volumeL: number;
  plato: number;
  hours: number;
  /** viable cells pitched in, with the range carried so far */
  start: CellRange;
  /** viable cells the model predicted at the end, from `start.cells` */
  expectedCells: number;
  startedAt: Date;
  completedAt?: Date | null;
  /** a count at the end: viable cells with the count's 95% interval */
  measured?: CellRange | null;
}

export interface BrewPlanInput {
  now: Date;
  timeZone: string;
  /** when the wort will be ready for yeast; without it the plan runs forwards from now */
  brewAt?: Date | null;
  target: PlanTarget;
  cultures: CultureCellsInput[];
  equipment: PlanEquipment;
  /** the person's growth correction, 1 unless they opted in */
  growthCorrection?: number;
  executed?: ExecutedStep[];
}

export interface PlannedStep extends PlanStep {
  lmeGrams: number;
  waterMl: number;
  /** viable cells at the end of the step if the start was at the low / high end of its range */
  range: { low: number; high: number };
  startCells: CellRange;
  startAt: Date;
  endAt: Date;
}

export interface BrewPlan {
  targetCells: number;
  /** million cells per mL per °P, for a batch target */
  rate: number | null;
  rateSource: string | null;
  /** the cultures' viable cells now and on brew day */
  cultureNow: CellRange;
  cultureOnBrewDay: CellRange | null;
  cultureNotes: string[];
  /** the brew-day culture (without a starter) already reaches the target */
  noStarterNeeded: boolean;
  /** what the remaining steps start from */
  startCells: CellRange;
  /** planStepUp's answer for the remaining steps */
  stepUp: StepUpPlan;
  steps: PlannedStep[];
  final: CellRange;
  verdict: PitchVerdict;
  verdictLow: PitchVerdict;
  verdictHigh: PitchVerdict;
  schedule: {
    brewAt: Date | null;
    coldCrashStartAt: Date;
    readyAt: Date;
    firstStartAt: Date | null;
    fitsInTime: boolean;
    /** how much earlier the first step would have had to start, hours */
    hoursShort: number;
  };
  /** a plan with fewer steps that does fit before brew day, when the full one does not */
  fitsInTimeAlternative: { steps: number; finalCells: number; fractionOfTarget: number; totalHours: number } | null;
  /** the largest first vessel a tiny start can go into (0.5 M/mL floor), when the smallest is too big */
  maxFirstVesselMl: number | null;
  growthCorrection: number;
  warnings: string[];
}

function targetOf(t: PlanTarget): { cells: number; rate: number | null; source: string | null } {
  if (t.kind === 'cells') {
    if (!(t.cells > 0)) throw new RangeError('target cells must be > 0');
    return { cells: t.cells, rate: null, source: null };
  }
  const rate = typeof t.rate === 'number' ? t.rate : PITCH_RATE_PRESETS[t.rate].rate;
  const source = typeof t.rate === 'number' ? 'your own rate' : PITCH_RATE_PRESETS[t.rate].source;
  const cells = targetPitchCells({ volumeL: t.volumeL, plato: t.plato, rate });
  if (!(cells > 0)) throw new RangeError('the batch needs a volume, a gravity and a rate above 0');
  return { cells, rate, source };
}

export function computeBrewPlan(input: BrewPlanInput): BrewPlan {
  const { now, timeZone, equipment: eq } = input;
  const brewAt = input.brewAt ?? null;
  const correction = input.growthCorrection ?? 1;
  const executed = input.executed ?? [];
  const target = targetOf(input.target);
  const warnings: string[] = [];
  const cultureNotes: string[] = [];

  for (const c of input.cultures) {
    const v = cultureViableCellsAt(c, brewAt ?? now);
    if (v.note) cultureNotes.push(v.note);
  }
  const cultureNow = blendViableCells(input.cultures, now);
  const cultureOnBrewDay = brewAt ? blendViableCells(input.cultures, brewAt) : null;
  const pitchable = cultureOnBrewDay ?? cultureNow;

  // Where the remaining ladder starts: the cultures now, or the end of the last executed step.
  let start: CellRange = cultureNow;
  let earliest = now;
  let firstPlato: number | undefined;
  let minVolume = 0;
  for (const s of executed) {
    const [low] = ladderCells(s.start.low, [s], eq.agitation, correction);
    const [high] = ladderCells(s.start.high, [s], eq.agitation, correction);
    start = s.measured ?? { cells: s.expectedCells, low: low!, high: high! };
    const expectedEnd = new Date(s.startedAt.getTime() + s.hours * MS_PER_HOUR);
    earliest = s.completedAt ?? (expectedEnd > now ? expectedEnd : now);
    firstPlato = eq.starterPlato; // the culture is awake: no low-gravity first feed again
    minVolume = Math.max(minVolume, s.volumeL);
  }
  const vessels = eq.vesselsL.filter((v) => v >= minVolume - 1e-9);

  const noStarterNeeded = executed.length === 0 && pitchable.cells >= target.cells;
  const planFrom = (maxSteps?: number) =>
    planStepUp({
      startCells: start.cells,
      viability: 1,
      targetCells: target.cells,
      agitation: eq.agitation,
      vessels,
      maxStepFactor: eq.maxStepFactor,
      starterPlato: eq.starterPlato,
      growthCorrection: correction,
      ...(firstPlato !== undefined ? { firstStepPlato: firstPlato } : {}),
      ...(maxSteps !== undefined ? { maxSteps } : {}),
    });
  const emptyPlan: StepUpPlan = {
    steps: [],
    finalCells: pitchable.cells,
    feasible: true,
    fractionOfTarget: pitchable.cells / target.cells,
    totalDmeGrams: 0,
    totalHours: 0,
  };
  const stepUp = noStarterNeeded ? emptyPlan : planFrom();

  const lows = ladderCells(start.low, stepUp.steps, eq.agitation, correction);
  const highs = ladderCells(start.high, stepUp.steps, eq.agitation, correction);
  const hours = stepUp.steps.map((s) => s.hours);

  let times: ScheduledStep[];
  let coldCrashStartAt: Date;
  let readyAt: Date;
  let firstStartAt: Date | null;
  let fitsInTime = true;
  let hoursShort = 0;
  if (brewAt) {
    const back = scheduleBackward({ brewAt, coldCrashHours: eq.coldCrashHours, stepHours: hours, timeZone });
    times = back.steps;
    coldCrashStartAt = back.coldCrashStartAt;
    readyAt = brewAt;
    firstStartAt = times.length ? back.firstStartAt : null;
    const mustStartBy = times.length ? back.firstStartAt : coldCrashStartAt;
    const needsCrash = times.length > 0 || executed.length > 0;
    if (needsCrash && mustStartBy.getTime() < earliest.getTime() - 60_000) {
      fitsInTime = false;
      hoursShort = (earliest.getTime() - mustStartBy.getTime()) / MS_PER_HOUR;
      const fwd = scheduleForward({ from: earliest, stepHours: hours, coldCrashHours: eq.coldCrashHours, timeZone });
      times = fwd.steps;
      coldCrashStartAt = fwd.coldCrashStartAt;
      readyAt = fwd.readyAt;
      firstStartAt = times[0]?.startAt ?? null;
    }
  } else {
    const fwd = scheduleForward({ from: earliest, stepHours: hours, coldCrashHours: eq.coldCrashHours, timeZone });
    times = fwd.steps;
    coldCrashStartAt = fwd.coldCrashStartAt;
    readyAt = fwd.readyAt;
    firstStartAt = times[0]?.startAt ?? null;
  }

  let fitsInTimeAlternative: BrewPlan['fitsInTimeAlternative'] = null;
  if (brewAt && !fitsInTime) {
    const available = (brewAt.getTime() - eq.coldCrashHours * MS_PER_HOUR - earliest.getTime()) / MS_PER_HOUR;
    for (let k = stepUp.steps.length - 1; k >= 1 && available > 0; k--) {
      const alt = planFrom(k);
      if (alt.steps.length > 0 && alt.totalHours <= available) {
        if (!fitsInTimeAlternative || alt.finalCells > fitsInTimeAlternative.finalCells) {
          fitsInTimeAlternative = {
            steps: alt.steps.length,
            finalCells: alt.finalCells,
            fractionOfTarget: alt.fractionOfTarget,
            totalHours: alt.totalHours,
          };
        }
      }
    }
  }

  const steps: PlannedStep[] = stepUp.steps.map((s, i) => {
    const prev =
      i === 0 ? start : { cells: stepUp.steps[i - 1]!.expectedCells, low: lows[i - 1]!, high: highs[i - 1]! };
    return {
      ...s,
      lmeGrams: lmeForStarter({ volumeL: s.volumeL, plato: s.plato }),
      waterMl: starterWaterMl({ volumeL: s.volumeL, sg: s.sg, extractGrams: s.dmeGrams }),
      range: { low: lows[i]!, high: highs[i]! },
      startCells: prev,
      startAt: times[i]!.startAt,
      endAt: times[i]!.endAt,
    };
  });

  const final: CellRange = noStarterNeeded
    ? pitchable
    : steps.length
      ? { cells: stepUp.finalCells, low: steps[steps.length - 1]!.range.low, high: steps[steps.length - 1]!.range.high }
      : start;

  let maxFirstVesselMl: number | null = null;
  const smallest = Math.min(...vessels);
  if (
    !noStarterNeeded &&
    executed.length === 0 &&
    start.cells > 0 &&
    start.cells / (smallest * 1000) < MIN_INOCULATION_CELLS_PER_ML
  ) {
    maxFirstVesselMl = Math.floor(start.cells / MIN_INOCULATION_CELLS_PER_ML);
  }
  if (stepUp.steps[0] && stepUp.steps[0].plato === DEFAULT_FIRST_STEP_PLATO && executed.length === 0) {
    warnings.push(
      'A small start gets a low-gravity first feed (about SG 1.022) at room temperature (about 24 °C); it can take days, not hours.',
    );
  }
  if (eq.agitation !== 'stir') {
    warnings.push(
      `Growth without a stir plate (${eq.agitation === 'shake' ? 'shaken' : 'left still'}) is an estimate scaled from stirred data.`,
    );
  }
  if (correction !== 1) {
    warnings.push(`Growth is multiplied by your correction of ${correction.toFixed(2)} (from your measured steps).`);
  }

  return {
    targetCells: target.cells,
    rate: target.rate,
    rateSource: target.source,
    cultureNow,
    cultureOnBrewDay,
    cultureNotes,
    noStarterNeeded,
    startCells: start,
    stepUp,
    steps,
    final,
    verdict: pitchVerdict({ cells: final.cells, targetCells: target.cells }),
    verdictLow: pitchVerdict({ cells: final.low, targetCells: target.cells }),
    verdictHigh: pitchVerdict({ cells: final.high, targetCells: target.cells }),
    schedule: { brewAt, coldCrashStartAt, readyAt, firstStartAt, fitsInTime, hoursShort },
    fitsInTimeAlternative,
    maxFirstVesselMl,
    growthCorrection: correction,
    warnings,
  };
}
