/**
 * Cells in a culture that was not counted. Each estimate gives a central figure, a low–high range
 * and the basis in words. `cells`, `low` and `high` are all cells (live and dead); `viability` is
 * the fraction expected alive (projected from the dates when they are given) and `viableCells` the
 * product.
 */
import { projectViability, VIABILITY_MODELS, type CultureForm } from './viability.js';

export const LIQUID_PACK_CELLS = {
  standard: {
    cells: 100e9,
    low: 59e9,
    high: 150e9,
    source: 'about 100 billion per pack [CP]; a QC sheet at 59 billion [PUB-2]; up to about 150 billion [CP]',
  },
  small: { cells: 30e9, low: 25e9, high: 35e9, source: 'smaller "propagator" pack 25–35 billion [PUB-2]' },
} as const;

/** Dry yeast, cells per gram: default 10 B (BYO/B. Patterson [PUB-2]), 5 B minimum (Lallemand [PUB]), 20 B optimistic [PUB-2]. */
export const DRY_CELLS_PER_GRAM = { cells: 10e9, low: 5e9, high: 20e9 } as const;

/**
 * Slurry: cells per mL of the yeast part. 1.2 B/mL for slurry of 40–60% solids (Wyeast, quoted
 * [PUB-2]) → 2.4 B/mL of yeast solids [CALC]. Range 0.6–4 B/mL of yeast solids, i.e. 0.3–2 B/mL of
 * a half-yeast slurry: a quart jar holds 0.3–2 ×10¹² cells (Woodland Brewing Research, "Yeast
 * Storage" [PUB]).
 */
export const SLURRY_YEAST_CELLS_PER_ML = { cells: 2.4e9, low: 0.6e9, high: 4e9 } as const;

/** Default fraction of a slurry that is yeast (the rest trub and hop matter) [CP]. */
export const SLURRY_YEAST_FRACTION = { slurry_washed: 0.75, slurry_unwashed: 0.5 } as const;

/** Bottle dregs, total cells per bottle: 1e7–2e9, central 2.5e8 (Woodland Brewing Research [PUB]). */
export const DREGS_CELLS_PER_BOTTLE = { cells: 2.5e8, low: 1e7, high: 2e9 } as const;

/** A loopful or colony picked from a slant or plate: 1e7, range 1e6–1e8 [MEM]. */
export const LOOP_CELLS = { cells: 1e7, low: 1e6, high: 1e8 } as const;

interface Dated {
  /** when made (packs) or harvested/frozen; with `at`, viability is projected */
  madeOrHarvestedAt?: Date;
  at?: Date;
  /** default 4 °C (frozen stock −20 °C) */
  storageTempC?: number;
}

export type EstimateCellsInput =
  | ({ form: 'liquid_pack'; packs?: number; packSize?: 'standard' | 'small'; cellsPerPack?: number } & Dated)
  | ({ form: 'dry_pack'; grams: number; cellsPerGram?: number } & Dated)
  | ({
      form: 'slurry_washed' | 'slurry_unwashed';
      volumeMl: number;
      /** fraction of the slurry volume that is yeast, 0–1 */
      yeastFraction?: number;
      /** cells per mL of the yeast part */
      densityCellsPerMl?: number;
    } & Dated)
  | ({ form: 'bottle_dregs'; bottles: number } & Dated)
  | ({ form: 'slant' | 'plate'; loops?: number } & Dated)
  | ({
      form: 'frozen_glycerol';
      /** volume of the vial contents */
      volumeMl: number;
      /** fraction of the contents that is settled slurry (the rest glycerol solution); default 0.5 */
      slurryFraction?: number;
    } & Dated);

export interface CellEstimate {
  cells: number;
  low: number;
  high: number;
  basis: string;
  viability: number;
  viableCells: number;
  /** set when a viability projection was out of its model's range */
  outOfRange: boolean;
  note?: string;
}

function positive(name: string, v: number): void {
  if (!(v > 0) || !Number.isFinite(v)) throw new RangeError(`${name} must be a positive number`);
}

export function estimateCells(input: EstimateCellsInput): CellEstimate {
  let cells: number;
  let low: number;
  let high: number;
  let basis: string;
  switch (input.form) {
    case 'liquid_pack': {
      const packs = input.packs ?? 1;
      positive('packs', packs);
      const size = LIQUID_PACK_CELLS[input.packSize ?? 'standard'];
      const per = input.cellsPerPack ?? size.cells;
      cells = packs * per;
      low = input.cellsPerPack !== undefined ? cells : packs * size.low;
      high = input.cellsPerPack !== undefined ? cells : packs * size.high;
      basis = `${packs} pack(s) × ${(per / 1e9).toFixed(0)} billion cells at manufacture; ${size.source}`;
      break;
    }
    case 'dry_pack': {
      positive('grams', input.grams);
      const per = input.cellsPerGram ?? DRY_CELLS_PER_GRAM.cells;
      cells = input.grams * per;
      low = input.cellsPerGram !== undefined ? cells : input.grams * DRY_CELLS_PER_GRAM.low;
      high = input.cellsPerGram !== undefined ? cells : input.grams * DRY_CELLS_PER_GRAM.high;
      basis = `${input.grams} g × ${(per / 1e9).toFixed(1)} billion viable cells per gram (BYO/Patterson [PUB-2]; range 5–20)`;
      break;
    }
    case 'slurry_washed':
    case 'slurry_unwashed': {
      positive('volumeMl', input.volumeMl);
      const fraction = input.yeastFraction ?? SLURRY_YEAST_FRACTION[input.form];
      if (!(fraction > 0 && fraction <= 1)) throw new RangeError('yeastFraction must be in (0, 1]');
      const yeastMl = input.volumeMl * fraction;
      const density = input.densityCellsPerMl ?? SLURRY_YEAST_CELLS_PER_ML.cells;
      cells = yeastMl * density;
      low = input.densityCellsPerMl !== undefined ? cells : yeastMl * SLURRY_YEAST_CELLS_PER_ML.low;
      high = input.densityCellsPerMl !== undefined ? cells : yeastMl * SLURRY_YEAST_CELLS_PER_ML.high;
      basis = `${input.volumeMl} mL × ${Math.round(fraction * 100)}% yeast × ${(density / 1e9).toFixed(1)} billion cells/mL of yeast (Wyeast via [PUB-2])`;
      break;
    }
    case 'bottle_dregs': {
      positive('bottles', input.bottles);
      cells = input.bottles * DREGS_CELLS_PER_BOTTLE.cells;
      low = input.bottles * DREGS_CELLS_PER_BOTTLE.low;
      high = input.bottles * DREGS_CELLS_PER_BOTTLE.high;
      basis = `${input.bottles} bottle(s); dregs hold 10 million to 2 billion cells each, often far fewer alive (Woodland Brewing Research [PUB]); deliberately wide`;
      break;
    }
    case 'slant':
    case 'plate': {
      const loops = input.loops ?? 1;
      positive('loops', loops);
      cells = loops * LOOP_CELLS.cells;
      low = loops * LOOP_CELLS.low;
      high = loops * LOOP_CELLS.high;
      basis = `${loops} loopful(s) or colonies at about 10 million cells each [MEM]`;
      break;
    }
    case 'frozen_glycerol': {
      positive('volumeMl', input.volumeMl);
      const fraction = input.slurryFraction ?? 0.5;
      if (!(fraction > 0 && fraction <= 1)) throw new RangeError('slurryFraction must be in (0, 1]');
      const slurryMl = input.volumeMl * fraction;
      // slurry of 50% solids: 1.2 B/mL (Wyeast via [PUB-2])
      cells = slurryMl * 0.5 * SLURRY_YEAST_CELLS_PER_ML.cells;
      low = slurryMl * 0.5 * SLURRY_YEAST_CELLS_PER_ML.low;
      high = slurryMl * 0.5 * SLURRY_YEAST_CELLS_PER_ML.high;
      basis = `${input.volumeMl} mL vial, ${Math.round(fraction * 100)}% slurry at about 1.2 billion cells/mL (Wyeast via [PUB-2])`;
      break;
    }
  }

  const form: CultureForm = input.form;
  const model = VIABILITY_MODELS[form];
  let viability = model.startViability;
  let outOfRange = false;
  let note: string | undefined;
  if (input.madeOrHarvestedAt && input.at) {
    const p = projectViability({
      form,
      madeOrHarvestedAt: input.madeOrHarvestedAt,
      at: input.at,
      storageTempC: input.storageTempC ?? (form === 'frozen_glycerol' ? -20 : 4),
    });
    viability = p.viability;
    outOfRange = p.outOfRange;
    note = p.note;
    basis += `; viability projected: ${p.model}`;
  } else {
    basis += `; viability assumed ${Math.round(viability * 100)}% (${model.startSource})`;
  }
  return {
    cells,
    low,
    high,
    basis,
    viability,
    viableCells: cells * viability,
    outOfRange,
    ...(note ? { note } : {}),
  };
}
