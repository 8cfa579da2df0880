/**
 * Starter growth.
 *
 * Stirred (default): K. Troester, "Estimating yeast growth", braukaiser.com (2012) [PUB] — growth as
 * billion new cells per gram of extract, set by the inoculation rate I in billion cells per gram
 * of extract. Coefficients [MEM], consistent with Woodland Brewing Research "Side by side starters"
 * (2013) ≈ 1.35 B per g [PUB]:
 *   I < 1.4        → 1.4 B/g
 *   1.4 ≤ I ≤ 3.5  → 2.33 − 0.67·I B/g (never below 0)
 *   I > 3.5        → 0
 * Shaken: 0.75 × stirred, the middle of the 0.5–1.0 range practitioners report [CP].
 * Still: 0.36 × stirred, fitted to White & Zainasheff, Yeast (2010) fig. 5.5 (unstirred, 100 B into
 * 0.5–4 L) [PUB-2] at 9 °P; reproduces its totals within 6%.
 * Cap: at most 100-fold growth in one step [CP].
 * Density check: above 200 million cells per mL, the top of wort propagation yields (Escarpment Labs,
 * "Best Practices – Yeast Propagation": 100–200 M/mL [PUB]), a warning is raised. It is not a hard
 * cap, because Troester's own stirred figures reach about 245 M/mL (100 B into 1 L at 10 °P).
 */
import { extractGrams } from './gravity.js';

export type Agitation = 'stir' | 'shake' | 'still';
export const AGITATIONS = ['stir', 'shake', 'still'] as const satisfies readonly Agitation[];

export const AGITATION_FACTORS: Readonly<Record<Agitation, { factor: number; source: string }>> = {
  stir: {
    factor: 1,
    source: 'K. Troester, "Estimating yeast growth", braukaiser.com (2012) [PUB]; coefficients [MEM]',
  },
  shake: { factor: 0.75, source: 'middle of the 0.5–1.0 × stirred range practitioners report [CP]' },
  still: {
    factor: 0.36,
    source: 'fitted to White & Zainasheff, Yeast (2010) fig. 5.5, unstirred starters [PUB-2]',
  },
};

/** Density above which growStarter warns, cells per mL of starter (Escarpment Labs [PUB]). */
export const MAX_STARTER_CELLS_PER_ML = 200e6;

/**
 * Most growth credited to one step, as a multiple of the viable cells pitched [CP]. At very low
 * inoculation the per-gram model promises hundreds-fold growth; real results are held back by
 * viability and lag, so the figure is capped (reference §6c).
 */
export const MAX_GROWTH_FACTOR_PER_STEP = 100;

/** Below this viable density a tiny start may not take hold [CP]: half the ~1 M/mL bottle-conditioning dose. */
export const MIN_INOCULATION_CELLS_PER_ML = 0.5e6;

/** Hours to finish a starter at or above 10 M cells/mL, about 20–24 °C [CP]. */
export const BASE_HOURS: Readonly<Record<Agitation, number>> = { stir: 24, shake: 36, still: 48 };

/** Inoculation density above which the base hours apply (Wyeast "Propagation": ~10 M/mL, 10-fold step [PUB]). */
export const LAG_REFERENCE_CELLS_PER_ML = 10e6;

/** Troester's stirred-starter growth: billion new cells per gram of extract at I billion cells per gram. */
export function troesterGrowthPerGram(inoculationBillionPerGram: number): number {
  const i = inoculationBillionPerGram;
  if (i < 1.4) return 1.4;
  if (i <= 3.5) return Math.max(0, 2.33 - 0.67 * i);
  return 0;
}

/**
 * Hours until a starter is done: the base time for the agitation, lengthened at low inoculation by
 * one base period per tenfold below 10 M cells/mL [CP]. E.g. still at 1 M/mL → 96 h, in line with
 * a practitioner's four days for bottle dregs [CP].
 */
export function starterHours(agitation: Agitation, inoculationCellsPerMl: number): number {
  const base = BASE_HOURS[agitation];
  if (!(inoculationCellsPerMl > 0)) return Infinity;
  if (inoculationCellsPerMl >= LAG_REFERENCE_CELLS_PER_ML) return base;
  return base * (1 + Math.log10(LAG_REFERENCE_CELLS_PER_ML / inoculationCellsPerMl));
}

/** Viable cells at the end of a starter (no allocation; used by the planner). */
export function grownViableCells(
  viableCells: number,
  volumeL: number,
  extractG: number,
  agitationFactor: number,
): number {
  if (extractG <= 0 || volumeL <= 0) return viableCells;
  const perGram = troesterGrowthPerGram(viableCells / 1e9 / extractG) * agitationFactor;
  const grown = viableCells + perGram * extractG * 1e9;
  const cap = viableCells * MAX_GROWTH_FACTOR_PER_STEP;
  return grown < cap ? grown : cap;
}

export interface GrowStarterInput {
  /** cells pitched into the starter (live and dead) */
  startCells: number;
  /** fraction of startCells alive, 0–1 */
  viability: number;
  volumeL: number;
  plato: number;
  agitation: Agitation;
}

export interface GrowStarterResult {
  /** viable cells at the end (dead cells pitched are not counted) */
  endCells: number;
  /** cells grown */
  newCells: number;
  /** viable cells pitched per gram of extract, in billions (Troester's I) */
  inoculationRate: number;
  /** viable cells pitched per mL of starter */
  inoculationCellsPerMl: number;
  extractGrams: number;
  /** live and dead cells at the end */
  totalCells: number;
  /** endCells / totalCells */
  endViability: number;
  hours: number;
  model: string;
  warnings: string[];
}

export function growStarter(input: GrowStarterInput): GrowStarterResult {
  const { startCells, viability, volumeL, plato, agitation } = input;
  if (!(startCells >= 0)) throw new RangeError('startCells must be ≥ 0');
  if (!(viability >= 0 && viability <= 1)) throw new RangeError('viability must be between 0 and 1');
  if (!(volumeL > 0)) throw new RangeError('volumeL must be > 0');
  if (!(plato > 0)) throw new RangeError('plato must be > 0');
  const factor = AGITATION_FACTORS[agitation]?.factor;
  if (factor === undefined) throw new RangeError(`unknown agitation: ${String(agitation)}`);

  const viable = startCells * viability;
  const grams = extractGrams({ volumeL, plato });
  const inoculationRate = viable / 1e9 / grams;
  const inoculationCellsPerMl = viable / (volumeL * 1000);
  const endCells = grownViableCells(viable, volumeL, grams, factor);
  const newCells = endCells - viable;
  const totalCells = startCells + newCells;
  const warnings: string[] = [];

  if (viable === 0) warnings.push('No viable cells: nothing will grow.');
  if (inoculationRate > 3.5) {
    warnings.push('More than 3.5 billion cells per gram of extract: expect little or no growth; use more wort.');
  }
  if (viable > 0 && endCells > MAX_STARTER_CELLS_PER_ML * volumeL * 1000 && endCells > viable) {
    warnings.push('Above 200 million cells/mL, more than wort propagation usually yields: treat as optimistic.');
  }
  if (viable > 0 && inoculationCellsPerMl < MIN_INOCULATION_CELLS_PER_ML) {
    warnings.push('Fewer than 0.5 million viable cells per mL: the culture may not take hold; use less wort.');
  }
  if (viable > 0 && endCells >= viable * MAX_GROWTH_FACTOR_PER_STEP) {
    warnings.push('Growth capped at 100-fold for one step: the model would promise more, but tiny starts lag.');
  } else if (viable > 0 && endCells / viable > 50) {
    warnings.push('More than 50-fold growth is outside the data behind this model: expect fewer cells and a long lag.');
  }
  if (plato < 4 || plato > 15) {
    warnings.push('Starter gravity outside about 1.016–1.061 (4–15 °P): the growth model was not fitted there.');
  }
  if (agitation !== 'stir') {
    warnings.push(`The ${agitation === 'shake' ? 'shaken' : 'still'} figure is an estimate scaled from stirred data.`);
  }
  return {
    endCells,
    newCells,
    inoculationRate,
    inoculationCellsPerMl,
    extractGrams: grams,
    totalCells,
    endViability: totalCells > 0 ? endCells / totalCells : 0,
    hours: starterHours(agitation, inoculationCellsPerMl),
    model: AGITATION_FACTORS[agitation].source,
    warnings,
  };
}
