import { describe, expect, it } from 'vitest';
import * as core from './index.js';

describe('public API', () => {
  it('exports the names other packages code against', () => {
    // source: issue 3, "Public functions (keep these names and shapes)"
    for (const name of [
      'platoFromSg',
      'sgFromPlato',
      'hemocytometerCount',
      'viabilityFromStain',
      'targetPitchCells',
      'projectViability',
      'maxStorageDays',
      'estimateCells',
      'growStarter',
      'planStepUp',
      'dmeForStarter',
      'lmeForStarter',
      'abv',
      'apparentAttenuation',
      'realAttenuation',
      'litresFromUsGallons',
      'celsiusFromFahrenheit',
    ]) {
      expect(typeof (core as Record<string, unknown>)[name]).toBe('function');
    }
    expect(Object.keys(core.PITCH_RATE_PRESETS).sort()).toEqual(['ale', 'highGravityAle', 'highGravityLager', 'lager']);
  });
  it('lists the culture forms in order', () => {
    // source: issue 3 brief, CULTURE_FORMS
    expect(core.CULTURE_FORMS).toEqual([
      'liquid_pack',
      'dry_pack',
      'slurry_washed',
      'slurry_unwashed',
      'bottle_dregs',
      'slant',
      'plate',
      'frozen_glycerol',
    ]);
  });
});
