/**
 * Batch-log arithmetic: alcohol and attenuation from original and final gravity (SG).
 * Results are in percent.
 */
import { platoFromSg } from './gravity.js';

export type AbvFormula = 'balling' | 'simple' | 'hall';

export const ABV_SOURCES: Record<AbvFormula, string> = {
  balling: 'Balling-based real-extract formula, ASBC/de Clerck style [MEM]',
  simple: '(OG − FG) × 131.25 [CP]',
  hall: 'M. L. Hall, "Brew by the Numbers", Zymurgy Summer 1995 [MEM]',
};

function check(og: number, fg: number): void {
  if (!Number.isFinite(og) || !Number.isFinite(fg) || og < 1 || fg <= 0.98 || fg > og) {
    throw new RangeError('og and fg must be SG values with og ≥ fg and og ≥ 1');
  }
}

/** Real extract (°P) from original and apparent extract (°P): RE = 0.1808·OE + 0.8192·AE [MEM]. */
export function realExtractPlato({ og, fg }: { og: number; fg: number }): number {
  check(og, fg);
  return 0.1808 * platoFromSg(og) + 0.8192 * platoFromSg(fg);
}

/** Alcohol by weight, percent, by the Balling formula [MEM]. */
export function abw({ og, fg }: { og: number; fg: number }): number {
  const oe = platoFromSg(og);
  const re = realExtractPlato({ og, fg });
  return (oe - re) / (2.0665 - 0.010665 * oe);
}

/** Alcohol by volume, percent. Default the Balling formula; `simple` and `hall` on request. */
export function abv({ og, fg, formula = 'balling' }: { og: number; fg: number; formula?: AbvFormula }): number {
  check(og, fg);
  switch (formula) {
    case 'simple':
      return (og - fg) * 131.25;
    case 'hall':
      return ((76.08 * (og - fg)) / (1.775 - og)) * (fg / 0.794);
    case 'balling':
      return (abw({ og, fg }) * fg) / 0.7907;
  }
}

/** Apparent attenuation, percent, in gravity points: (OG − FG)/(OG − 1) (Palmer, How to Brew [PUB]). */
export function apparentAttenuation({ og, fg }: { og: number; fg: number }): number {
  check(og, fg);
  if (og === 1) return 0;
  return ((og - fg) / (og - 1)) * 100;
}

/** Apparent attenuation, percent, in °P: (OE − AE)/OE (Braukaiser wiki "Understanding Attenuation" [PUB]). */
export function apparentAttenuationPlato({ og, fg }: { og: number; fg: number }): number {
  check(og, fg);
  const oe = platoFromSg(og);
  if (oe <= 0) return 0;
  return ((oe - platoFromSg(fg)) / oe) * 100;
}

/** Real attenuation, percent: (OE − RE)/OE with the Balling real extract [MEM]. */
export function realAttenuation({ og, fg }: { og: number; fg: number }): number {
  check(og, fg);
  const oe = platoFromSg(og);
  if (oe <= 0) return 0;
  return ((oe - realExtractPlato({ og, fg })) / oe) * 100;
}
