/**
 * Hemocytometer counts and viability stains.
 *
 * Chamber: improved Neubauer, depth 0.1 mm; the central 1 mm² holds 25 medium squares of
 * 0.2 × 0.2 mm, so one medium square holds 4×10⁻⁶ mL and one 1 mm² large square 1×10⁻⁴ mL.
 * Source: Gustavus Adolphus College cell-biology lab manual, ex. 1-6 [PUB]; ASBC MOA Yeast-4 [PUB].
 */
import { poissonInterval95, wilsonInterval95 } from './stats.js';

export const COUNTING_SOURCE =
  'Improved Neubauer geometry: Gustavus Adolphus College lab manual ex. 1-6 [PUB]; ASBC MOA Yeast-4 [PUB]; Poisson counting statistics [CP]';

/** Volume of one counting square, in mL. */
export const SQUARE_VOLUME_ML = {
  /** one of the 25 medium squares of the central 1 mm² (0.2 × 0.2 × 0.1 mm) */
  medium: 4e-6,
  /** one 1 mm × 1 mm large square (1 × 1 × 0.1 mm) */
  large: 1e-4,
} as const;

/** Cells per medium square that keep the count reliable (Gustavus lab manual [PUB]). */
export const CELLS_PER_SQUARE_WINDOW = { min: 10, max: 100 } as const;

export interface HemocytometerInput {
  /** total cells counted over all squares */
  cellsCounted: number;
  /** number of squares counted */
  squaresCounted: number;
  /** total dilution factor, including the stain (1 part sample + 1 part stain doubles it) */
  dilution: number;
  /** volume of one square in mL; default one medium square, 4×10⁻⁶ mL */
  squareVolumeMl?: number;
}

export interface HemocytometerResult {
  cellsPerMl: number;
  /** exact Poisson 95% interval on the count, scaled to cells/mL */
  ci95: [number, number];
  /** relative half-width of the 95% interval, e.g. 0.14 for ±14% */
  relativeHalfWidth95: number;
  warnings: string[];
}

/** cells/mL = (cells counted / squares counted) / volume of one square × dilution. */
export function hemocytometerCount(input: HemocytometerInput): HemocytometerResult {
  const { cellsCounted, squaresCounted, dilution } = input;
  const squareVolumeMl = input.squareVolumeMl ?? SQUARE_VOLUME_ML.medium;
  if (!Number.isInteger(cellsCounted) || cellsCounted < 0) {
    throw new RangeError('cellsCounted must be a non-negative integer');
  }
  if (!Number.isInteger(squaresCounted) || squaresCounted < 1) {
    throw new RangeError('squaresCounted must be a positive integer');
  }
  if (!(dilution >= 1)) throw new RangeError('dilution must be ≥ 1');
  if (!(squareVolumeMl > 0)) throw new RangeError('squareVolumeMl must be > 0');

  const scale = dilution / (squaresCounted * squareVolumeMl);
  const [lo, hi] = poissonInterval95(cellsCounted);
  const warnings: string[] = [];
  const perSquare = cellsCounted / squaresCounted;
  if (squareVolumeMl === SQUARE_VOLUME_ML.medium) {
    if (perSquare < CELLS_PER_SQUARE_WINDOW.min) {
      warnings.push(`Only ${perSquare.toFixed(1)} cells per square: use less dilution (aim for 10–100).`);
    } else if (perSquare > CELLS_PER_SQUARE_WINDOW.max) {
      warnings.push(`${perSquare.toFixed(0)} cells per square: dilute further (aim for 10–100).`);
    }
  }
  if (cellsCounted < 200) {
    warnings.push('Fewer than 200 cells counted: the 95% interval is wider than ±14%.');
  }
  return {
    cellsPerMl: cellsCounted * scale,
    ci95: [lo * scale, hi * scale],
    relativeHalfWidth95: cellsCounted > 0 ? (hi - lo) / 2 / cellsCounted : Infinity,
    warnings,
  };
}

export interface StainInput {
  /** unstained (live) cells */
  live: number;
  /** stained (dead) cells */
  dead: number;
}

export interface StainResult {
  /** live / (live + dead), 0–1 */
  viability: number;
  /** Wilson score 95% interval */
  ci95: [number, number];
  warnings: string[];
}

/**
 * Viability from a methylene blue or methylene violet stain: unstained / (stained + unstained).
 * Methylene blue overestimates viability in old yeast (Gilliland 1959 [PUB]); below about 90% treat
 * the figure as an upper bound [CP].
 */
export function viabilityFromStain({ live, dead }: StainInput): StainResult {
  if (!Number.isInteger(live) || !Number.isInteger(dead) || live < 0 || dead < 0) {
    throw new RangeError('live and dead must be non-negative integers');
  }
  const n = live + dead;
  if (n === 0) throw new RangeError('no cells counted');
  const viability = live / n;
  const warnings: string[] = [];
  if (viability < 0.9) {
    warnings.push('Below about 90% methylene blue tends to overstate viability; treat it as an upper bound.');
  }
  if (n < 100) warnings.push('Fewer than 100 cells classified: the interval is wide.');
  return { viability, ci95: wilsonInterval95(live, n), warnings };
}
