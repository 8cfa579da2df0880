/**
 * Step-up planner: which starter volumes, in which order, reach a pitch target.
 *
 * Rules (see docs/yeast-math.md):
 * - Every step is fresh wort of one of the listed vessel (working) volumes; the whole previous step
 *   (or its decanted yeast) is pitched into it. Volumes never shrink from step to step.
 * - A step is at most `maxStepFactor` × the previous step's volume (default 10×: Wyeast
 *   "Propagation" [PUB]).
 * - A step must start at or above 0.5 million viable cells/mL [CP]; this is what makes a tiny start
 *   begin in a small vessel.
 * - A small start (under 1 billion viable cells) gets low-gravity wort in its first step, SG 1.022
 *   (BrewingTechniques 2(3) 1994: 1.020 for small starter tubes [PUB]; app default 1.020–1.025 [CP]).
 *   Later steps use SG 1.036 (100 g DME per litre final volume, the "10:1 rule" [PUB-2]).
 * - Among plans that reach the target the planner picks the fewest steps, then the least dry malt
 *   extract, then the smallest final volume.
 */
import { extractGrams, platoFromSg, sgFromPlato } from './gravity.js';
import {
  AGITATION_FACTORS,
  MIN_INOCULATION_CELLS_PER_ML,
  grownViableCells,
  starterHours,
  type Agitation,
} from './growth.js';
import { dmeForStarter } from './wort.js';

export const DEFAULT_STARTER_PLATO = platoFromSg(1.036);
export const DEFAULT_FIRST_STEP_PLATO = platoFromSg(1.022);
/** Starts smaller than this (viable cells) get the low-gravity first step [CP]. */
export const LOW_GRAVITY_FIRST_STEP_BELOW_CELLS = 1e9;
export const DEFAULT_MAX_STEP_FACTOR = 10;
export const DEFAULT_MAX_STEPS = 6;

export interface PlanStepUpInput {
  startCells: number;
  /** fraction of startCells alive, 0–1 */
  viability: number;
  /** viable cells wanted at pitch */
  targetCells: number;
  agitation: Agitation;
  /** working volumes available, litres */
  vessels: number[];
  /** largest volume increase from one step to the next; default 10 */
  maxStepFactor?: number;
  /** gravity of every step after the first (and the first for large starts); default 1.036 */
  starterPlato?: number;
  /** gravity of the first step; default 1.022 for starts under 1 billion viable cells */
  firstStepPlato?: number;
  /** the last step must be at least this many litres; default 0 */
  minFinalVolume?: number;
  /** most steps to consider; default 6 */
  maxSteps?: number;
  /** viable cells per mL a step must start with; default 0.5 million */
  minInoculationCellsPerMl?: number;
  /**
   * Multiplies the new cells each step grows (a person's measured/predicted ratio, see
   * growthCorrectionRatio); default 1, which leaves the model as published.
   */
  growthCorrection?: number;
}

export interface PlanStep {
  volumeL: number;
  dmeGrams: number;
  plato: number;
  sg: number;
  /** viable cells at the end of the step */
  expectedCells: number;
  /** viable cells pitched per gram of extract, billions */
  inoculationRate: number;
  inoculationCellsPerMl: number;
  hours: number;
}

export interface StepUpPlan {
  steps: PlanStep[];
  /** viable cells at the end of the plan */
  finalCells: number;
  feasible: boolean;
  reason?: string;
  /** finalCells / targetCells */
  fractionOfTarget: number;
  totalDmeGrams: number;
  totalHours: number;
}

interface Candidate {
  volumeL: number;
  /** [first-step wort, later wort] */
  extractG: [number, number];
  dmeG: [number, number];
}

export function planStepUp(input: PlanStepUpInput): StepUpPlan {
  const {
    startCells,
    viability,
    targetCells,
    agitation,
    vessels,
    maxStepFactor = DEFAULT_MAX_STEP_FACTOR,
    starterPlato = DEFAULT_STARTER_PLATO,
    minFinalVolume = 0,
    maxSteps = DEFAULT_MAX_STEPS,
    minInoculationCellsPerMl = MIN_INOCULATION_CELLS_PER_ML,
    growthCorrection = 1,
  } = input;
  if (!(startCells >= 0)) throw new RangeError('startCells must be ≥ 0');
  if (!(viability >= 0 && viability <= 1)) throw new RangeError('viability must be between 0 and 1');
  if (!(targetCells >= 0)) throw new RangeError('targetCells must be ≥ 0');
  if (!(maxStepFactor >= 1)) throw new RangeError('maxStepFactor must be ≥ 1');
  if (!(starterPlato > 0)) throw new RangeError('starterPlato must be > 0');
  if (!Number.isInteger(maxSteps) || maxSteps < 1) throw new RangeError('maxSteps must be a positive integer');
  const agitationFactor = AGITATION_FACTORS[agitation]?.factor;
  if (agitationFactor === undefined) throw new RangeError(`unknown agitation: ${String(agitation)}`);
  if (!(growthCorrection > 0) || !Number.isFinite(growthCorrection)) {
    throw new RangeError('growthCorrection must be a positive number');
  }
  const factor = agitationFactor * growthCorrection;

  const viableStart = startCells * viability;
  const firstPlato =
    input.firstStepPlato ??
    (viableStart < LOW_GRAVITY_FIRST_STEP_BELOW_CELLS ? DEFAULT_FIRST_STEP_PLATO : starterPlato);
  if (!(firstPlato > 0)) throw new RangeError('firstStepPlato must be > 0');
  const platos: [number, number] = [firstPlato, starterPlato];

  const empty = (feasible: boolean, reason?: string): StepUpPlan => ({
    steps: [],
    finalCells: viableStart,
    feasible,
    ...(reason ? { reason } : {}),
    fractionOfTarget: targetCells > 0 ? viableStart / targetCells : Infinity,
    totalDmeGrams: 0,
    totalHours: 0,
  });

  if (viableStart >= targetCells) return empty(true);
  if (viableStart <= 0) return empty(false, 'No viable cells to start from.');

  const volumes = [...new Set(vessels.filter((v) => Number.isFinite(v) && v > 0))].sort((a, b) => a - b);
  if (volumes.length === 0) return empty(false, 'No vessel volumes given.');

  const cands: Candidate[] = volumes.map((volumeL) => ({
    volumeL,
    extractG: [extractGrams({ volumeL, plato: platos[0] }), extractGrams({ volumeL, plato: platos[1] })],
    dmeG: [dmeForStarter({ volumeL, plato: platos[0] }), dmeForStarter({ volumeL, plato: platos[1] })],
  }));

  const smallest = cands[0]!;
  if (viableStart / (smallest.volumeL * 1000) < minInoculationCellsPerMl) {
    const maxMl = viableStart / minInoculationCellsPerMl;
    return empty(
      false,
      `Too few viable cells for the smallest vessel: ${smallest.volumeL * 1000} mL needs at least ` +
        `${fmt(minInoculationCellsPerMl * smallest.volumeL * 1000)} viable cells; use a vessel of at most ` +
        `${Math.floor(maxMl)} mL or start from more yeast.`,
    );
  }

  const n = cands.length;
  const path = new Int32Array(maxSteps);
  const bestPath = new Int32Array(maxSteps);
  let bestDepth = 0;
  let bestGrams = Infinity;
  let bestFinalVolume = Infinity;
  let found = false;
  // best effort, when nothing reaches the target
  const effortPath = new Int32Array(maxSteps);
  let effortDepth = 0;
  let effortCells = viableStart;
  let effortGrams = Infinity;

  const search = (depth: number, k: number, prev: number, cells: number, grams: number): void => {
    const prevVolume = prev < 0 ? 0 : cands[prev]!.volumeL;
    const start = prev < 0 ? 0 : prev;
    const w = depth === 0 ? 0 : 1;
    for (let i = start; i < n; i++) {
      const c = cands[i]!;
      if (prev >= 0 && c.volumeL > prevVolume * maxStepFactor * (1 + 1e-9)) break;
      if (cells / (c.volumeL * 1000) < minInoculationCellsPerMl) break;
      const g = grams + c.dmeG[w];
      // extract only adds up along a path, so a dearer prefix cannot beat the best plan
      if (found && g > bestGrams) continue;
      const next = grownViableCells(cells, c.volumeL, c.extractG[w], factor);
      path[depth] = i;
      if (next > effortCells || (next === effortCells && g < effortGrams)) {
        effortCells = next;
        effortGrams = g;
        effortDepth = depth + 1;
        effortPath.set(path.subarray(0, depth + 1));
      }
      if (depth + 1 === k) {
        if (next >= targetCells && c.volumeL >= minFinalVolume) {
          if (!found || g < bestGrams || (g === bestGrams && c.volumeL < bestFinalVolume)) {
            found = true;
            bestGrams = g;
            bestFinalVolume = c.volumeL;
            bestDepth = k;
            bestPath.set(path.subarray(0, k));
          }
        }
      } else {
        search(depth + 1, k, i, next, g);
      }
    }
  };

  for (let k = 1; k <= maxSteps && !found; k++) search(0, k, -1, viableStart, 0);

  const build = (idx: Int32Array, depth: number): PlanStep[] => {
    const steps: PlanStep[] = [];
    let cells = viableStart;
    for (let d = 0; d < depth; d++) {
      const c = cands[idx[d]!]!;
      const w = d === 0 ? 0 : 1;
      const plato = platos[w];
      const inoculationCellsPerMl = cells / (c.volumeL * 1000);
      const inoculationRate = cells / 1e9 / c.extractG[w];
      const end = grownViableCells(cells, c.volumeL, c.extractG[w], factor);
      steps.push({
        volumeL: c.volumeL,
        dmeGrams: c.dmeG[w],
        plato,
        sg: sgFromPlato(plato),
        expectedCells: end,
        inoculationRate,
        inoculationCellsPerMl,
        hours: starterHours(agitation, inoculationCellsPerMl),
      });
      cells = end;
    }
    return steps;
  };

  const finish = (steps: PlanStep[], feasible: boolean, reason?: string): StepUpPlan => {
    const finalCells = steps.length > 0 ? steps[steps.length - 1]!.expectedCells : viableStart;
    return {
      steps,
      finalCells,
      feasible,
      ...(reason ? { reason } : {}),
      fractionOfTarget: finalCells / targetCells,
      totalDmeGrams: steps.reduce((s, x) => s + x.dmeGrams, 0),
      totalHours: steps.reduce((s, x) => s + x.hours, 0),
    };
  };

  if (found) return finish(build(bestPath, bestDepth), true);
  const steps = build(effortPath, effortDepth);
  const reached = steps.length > 0 ? steps[steps.length - 1]!.expectedCells : viableStart;
  const minFinalNote =
    minFinalVolume > 0 && volumes[volumes.length - 1]! < minFinalVolume
      ? ` No vessel holds the ${minFinalVolume} L asked for as the final volume.`
      : '';
  return finish(
    steps,
    false,
    `Cannot reach ${fmt(targetCells)} cells within ${maxSteps} steps with these vessels ` +
      `(at most ${maxStepFactor}× per step); the best plan reaches ${fmt(reached)} ` +
      `(${Math.round((reached / targetCells) * 100)}% of target).${minFinalNote}`,
  );
}

function fmt(cells: number): string {
  if (cells >= 1e9) return `${(cells / 1e9).toPrecision(3)} billion`;
  return `${(cells / 1e6).toPrecision(3)} million`;
}
