/**
 * When a projected viability falls to a threshold: the inverse of the decay models in
 * viability.ts, so reminders can say "drops below 50% on Thursday" without stepping through days.
 */
import { deathRatePerDay, VIABILITY_MODELS, type CultureForm } from './viability.js';

const MS_PER_DAY = 86_400_000;

export interface ViabilityCrossingInput {
  form: CultureForm;
  /** the instant the projection starts from (made/harvested, or the latest stain count) */
  anchorAt: Date;
  storageTempC: number;
  /** viability at the anchor, 0–1; default per form */
  startViability?: number;
  /** the fraction alive to warn at, strictly between 0 and 1 */
  threshold: number;
  liquidModel?: 'exponential' | 'linear';
}

export interface ViabilityCrossing {
  /** first instant the projection is at or below the threshold; null if it never gets there */
  at: Date | null;
  /** the projection already starts at or below the threshold */
  alreadyBelow: boolean;
}

/**
 * Solves v0 · exp(−k(T) · d) = threshold for d (d = ln(v0 / threshold) / k(T)), or for the linear
 * liquid-pack rule v0 · (1 − 0.007 · d) = threshold [CALC from the models in viability.ts].
 */
export function viabilityCrossingAt(input: ViabilityCrossingInput): ViabilityCrossing {
  const { form, anchorAt, storageTempC, threshold } = input;
  const m = VIABILITY_MODELS[form];
  if (!m) throw new RangeError(`unknown culture form: ${String(form)}`);
  if (!(threshold > 0 && threshold < 1)) throw new RangeError('threshold must be between 0 and 1');
  if (!Number.isFinite(storageTempC)) throw new RangeError('storageTempC must be a finite number');
  const anchorMs = anchorAt.getTime();
  if (!Number.isFinite(anchorMs)) throw new RangeError('invalid date');
  const v0 = input.startViability ?? m.startViability;
  if (!(v0 >= 0 && v0 <= 1)) throw new RangeError('startViability must be between 0 and 1');
  if (v0 <= threshold) return { at: new Date(anchorMs), alreadyBelow: true };

  let days: number;
  if (form === 'liquid_pack' && input.liquidModel === 'linear') {
    days = (1 - threshold / v0) / 0.007;
  } else {
    const k = deathRatePerDay(m, storageTempC);
    if (!(k > 0)) return { at: null, alreadyBelow: false };
    days = Math.log(v0 / threshold) / k;
  }
  return { at: new Date(anchorMs + days * MS_PER_DAY), alreadyBelow: false };
}
