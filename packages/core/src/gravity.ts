/**
 * Specific gravity (SG, 20 °C/20 °C) and degrees Plato (°P, g extract per 100 g wort).
 *
 * Source: the cubic widely attributed to ASBC as a fit to the ASBC table
 * "Extract in wort and beer" [MEM]/[CP]. Valid range SG 1.000–1.130 (about 0–30 °P).
 */

export const GRAVITY_SOURCE =
  'ASBC polynomial, widely attributed to the ASBC table "Extract in wort and beer" [MEM]/[CP]';

/** Valid range of the cubic, in SG and in °P. */
export const SG_RANGE = { min: 1.0, max: 1.13 } as const;
export const PLATO_RANGE = { min: 0, max: 30 } as const;

const A0 = -616.868;
const A1 = 1111.14;
const A2 = -630.272;
const A3 = 135.997;

function assertFinite(name: string, value: number): void {
  if (!Number.isFinite(value)) throw new RangeError(`${name} must be a finite number, got ${value}`);
}

/** °P from SG by the ASBC cubic. Returns −0.003 at SG 1.000 (the fit's offset). */
export function platoFromSg(sg: number): number {
  assertFinite('sg', sg);
  return A0 + sg * (A1 + sg * (A2 + sg * A3));
}

function dPlatoDSg(sg: number): number {
  return A1 + sg * (2 * A2 + sg * 3 * A3);
}

/**
 * SG from °P: Newton iteration on the same cubic, started from the closed form
 * `1 + P / (258.6 − 0.88·P)`, so `platoFromSg(sgFromPlato(p))` returns p to well under 1e-6.
 */
export function sgFromPlato(plato: number): number {
  assertFinite('plato', plato);
  let sg = sgFromPlatoClosedForm(plato);
  for (let i = 0; i < 20; i++) {
    const step = (platoFromSg(sg) - plato) / dPlatoDSg(sg);
    sg -= step;
    if (Math.abs(step) < 1e-13) break;
  }
  return sg;
}

/**
 * The common closed form `SG = 1 + P / (258.6 − (P/258.2)·227.1)` [CP] (origin of the constants not
 * located). Used only to start the Newton iteration; it differs from the cubic's inverse by < 1e-4 SG.
 */
export function sgFromPlatoClosedForm(plato: number): number {
  assertFinite('plato', plato);
  return 1 + plato / (258.6 - (plato / 258.2) * 227.1);
}

/** Gravity points: (SG − 1) × 1000, e.g. 1.048 → 48. */
export function gravityPoints(sg: number): number {
  assertFinite('sg', sg);
  return (sg - 1) * 1000;
}

/**
 * Grams of extract dissolved in a volume of wort: `°P × SG × 10 × litres`
 * (°P is % w/w; SG × 1000 g per litre). Source: K. Troester, "Estimating yeast growth",
 * braukaiser.com (2012) [PUB].
 */
export function extractGrams({ volumeL, plato }: { volumeL: number; plato: number }): number {
  assertFinite('volumeL', volumeL);
  assertFinite('plato', plato);
  if (volumeL <= 0 || plato <= 0) return 0;
  return plato * sgFromPlato(plato) * 10 * volumeL;
}
