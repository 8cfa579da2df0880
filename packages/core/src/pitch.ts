/**
 * Pitch rates: cells needed = rate (cells/mL/°P) × wort volume (mL) × original gravity (°P).
 * Rates are given in million cells per mL per °P.
 */
import { platoFromSg } from './gravity.js';

export interface PitchRatePreset {
  /** million cells per mL per °P */
  rate: number;
  label: string;
  source: string;
}

export const PITCH_RATE_PRESETS = {
  ale: {
    rate: 0.75,
    label: 'Ale',
    source: 'George Fix, Principles of Brewing Science, 2nd ed. (1999) [PUB-2]',
  },
  lager: {
    rate: 1.5,
    label: 'Lager',
    source: 'George Fix, Principles of Brewing Science, 2nd ed. (1999) [PUB-2]',
  },
  highGravityAle: {
    rate: 1.0,
    label: 'High-gravity ale (OG above 1.060)',
    source: 'common practice [CP]',
  },
  highGravityLager: {
    rate: 2.0,
    label: 'High-gravity lager (OG above 1.060)',
    source: 'common practice [CP]',
  },
} as const satisfies Record<string, PitchRatePreset>;

export type PitchRatePresetKey = keyof typeof PITCH_RATE_PRESETS;

/** Range of rates used across styles, million cells/mL/°P [CP]. */
export const PITCH_RATE_RANGE = { min: 0.35, max: 2.0 } as const;

/** OG above which the high-gravity presets apply (SG 1.060) [CP]. */
export const HIGH_GRAVITY_PLATO = platoFromSg(1.06);

export interface TargetPitchInput {
  volumeL: number;
  /** original gravity in °P */
  plato: number;
  /** million cells per mL per °P, or the key of a preset */
  rate: number | PitchRatePresetKey;
}

function rateValue(rate: number | PitchRatePresetKey): number {
  return typeof rate === 'number' ? rate : PITCH_RATE_PRESETS[rate].rate;
}

/** Number of (viable) cells to pitch. */
export function targetPitchCells({ volumeL, plato, rate }: TargetPitchInput): number {
  const r = rateValue(rate);
  if (!(volumeL >= 0) || !(plato >= 0) || !(r >= 0)) {
    throw new RangeError('volumeL, plato and rate must be non-negative numbers');
  }
  return r * 1e6 * volumeL * 1000 * plato;
}

/** The rate a pitch of `cells` gives, in million cells/mL/°P. */
export function pitchRateOf({ cells, volumeL, plato }: { cells: number; volumeL: number; plato: number }): number {
  if (!(volumeL > 0) || !(plato > 0)) throw new RangeError('volumeL and plato must be > 0');
  return cells / (1e6 * volumeL * 1000 * plato);
}

/** The preset for a beer: lager or ale, high gravity above SG 1.060 [CP]. */
export function pitchRatePresetFor({ lager, plato }: { lager: boolean; plato: number }): PitchRatePresetKey {
  const high = plato > HIGH_GRAVITY_PLATO;
  if (lager) return high ? 'highGravityLager' : 'lager';
  return high ? 'highGravityAle' : 'ale';
}
