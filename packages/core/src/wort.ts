/**
 * Starter wort from malt extract. Extract yield is in PPG (gravity points per pound per US gallon);
 * 1 PPG = 8.3454 points per kg per litre (J. Palmer, How to Brew, ch. 3.4 [PUB]).
 * Volumes are final (made-up) volumes.
 */
import { gravityPoints, sgFromPlato } from './gravity.js';

/** Points per kg per litre for 1 PPG (Palmer, How to Brew [PUB]). */
export const POINTS_KG_L_PER_PPG = 8.3454;

export const EXTRACT_YIELDS = {
  /** dry malt extract: 42 PPG, Zymurgy Jan/Feb 2003 "Expect You're Extracting" [PUB]; Palmer 40–43 [PUB] */
  dme: { ppg: 42, source: 'Zymurgy Jan/Feb 2003 [PUB]; Palmer, How to Brew 40–43 PPG [PUB]' },
  /** liquid malt extract: 36 PPG, same sources (Palmer 34–38) */
  lme: { ppg: 36, source: 'Zymurgy Jan/Feb 2003 [PUB]; Palmer, How to Brew 34–38 PPG [PUB]' },
} as const;

export interface ExtractInput {
  volumeL: number;
  plato: number;
  /** override the extract's yield in PPG */
  ppg?: number;
}

function gramsFor({ volumeL, plato, ppg }: Required<ExtractInput>): number {
  if (!(volumeL >= 0) || !(plato >= 0) || !(ppg > 0)) {
    throw new RangeError('volumeL and plato must be ≥ 0 and ppg > 0');
  }
  const points = gravityPoints(sgFromPlato(plato));
  return ((points * volumeL) / (ppg * POINTS_KG_L_PER_PPG)) * 1000;
}

/** Grams of dry malt extract for a starter of `volumeL` (final volume) at `plato`. */
export function dmeForStarter({ volumeL, plato, ppg = EXTRACT_YIELDS.dme.ppg }: ExtractInput): number {
  return gramsFor({ volumeL, plato, ppg });
}

/** Grams of liquid malt extract for a starter of `volumeL` (final volume) at `plato`. */
export function lmeForStarter({ volumeL, plato, ppg = EXTRACT_YIELDS.lme.ppg }: ExtractInput): number {
  return gramsFor({ volumeL, plato, ppg });
}

/** SG of wort made from `grams` of extract made up to `volumeL`. */
export function sgFromExtract({
  grams,
  volumeL,
  ppg = EXTRACT_YIELDS.dme.ppg,
}: {
  grams: number;
  volumeL: number;
  ppg?: number;
}): number {
  if (!(volumeL > 0) || !(grams >= 0) || !(ppg > 0)) throw new RangeError('invalid extract input');
  return 1 + ((grams / 1000) * ppg * POINTS_KG_L_PER_PPG) / volumeL / 1000;
}
