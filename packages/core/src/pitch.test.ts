import { describe, expect, it } from 'vitest';
import { platoFromSg } from './gravity.js';
import { PITCH_RATE_PRESETS, pitchRateOf, pitchRatePresetFor, targetPitchCells } from './pitch.js';
import { litresFromUsGallons } from './units.js';

const fiveGal = litresFromUsGallons(5);
const og1048 = platoFromSg(1.048);

describe('targetPitchCells', () => {
  it('5 US gal of 1.048 ale at 0.75 → about 169 billion cells', () => {
    const cells = targetPitchCells({ volumeL: fiveGal, plato: og1048, rate: 'ale' });
    expect(Math.abs(cells - 169.1e9)).toBeLessThan(0.5e9); // source: reference §3 check table [CALC]; the classic ≈170 B example [CP]
  });

  it('lager is twice ale at the same gravity', () => {
    const ale = targetPitchCells({ volumeL: fiveGal, plato: og1048, rate: PITCH_RATE_PRESETS.ale.rate });
    const lager = targetPitchCells({ volumeL: fiveGal, plato: og1048, rate: PITCH_RATE_PRESETS.lager.rate });
    expect(lager / ale).toBeCloseTo(2, 12); // source: George Fix, Principles of Brewing Science (1999) 0.75 vs 1.5 [PUB-2]
    expect(Math.abs(lager - 338.2e9)).toBeLessThan(0.5e9); // source: reference §3 check table [CALC]
  });

  it('the 1.0 and 2.0 rates give 225.5 B and 450.9 B for the same wort', () => {
    expect(Math.abs(targetPitchCells({ volumeL: fiveGal, plato: og1048, rate: 1 }) - 225.5e9)).toBeLessThan(0.5e9); // source: reference §3 [CALC]
    expect(Math.abs(targetPitchCells({ volumeL: fiveGal, plato: og1048, rate: 2 }) - 450.9e9)).toBeLessThan(0.5e9); // source: reference §3 [CALC]
  });

  it('5.5 gal of 15 °P ale at 0.75 → 234 billion', () => {
    const cells = targetPitchCells({ volumeL: litresFromUsGallons(5.5), plato: 15, rate: 0.75 });
    expect(Math.abs(cells - 234.2e9)).toBeLessThan(0.5e9); // source: Madison Beer Review, "Five Gallons At A Time: Yeast Pitching Rates" (2012) [PUB]
  });

  it('round-trips with pitchRateOf', () => {
    const cells = targetPitchCells({ volumeL: 20, plato: 12, rate: 0.75 });
    expect(pitchRateOf({ cells, volumeL: 20, plato: 12 })).toBeCloseTo(0.75, 12); // source: the pitch-rate definition, reference §3 [PUB-2]
  });

  it('rejects negative inputs', () => {
    expect(() => targetPitchCells({ volumeL: -1, plato: 12, rate: 0.75 })).toThrow(RangeError); // common practice
  });
});

describe('presets', () => {
  it('carry the published values and a source', () => {
    expect(PITCH_RATE_PRESETS.ale.rate).toBe(0.75); // source: George Fix (1999) [PUB-2]
    expect(PITCH_RATE_PRESETS.lager.rate).toBe(1.5); // source: George Fix (1999) [PUB-2]
    expect(PITCH_RATE_PRESETS.highGravityAle.rate).toBe(1.0); // common practice (reference §3)
    expect(PITCH_RATE_PRESETS.highGravityLager.rate).toBe(2.0); // common practice (reference §3)
    for (const p of Object.values(PITCH_RATE_PRESETS)) expect(p.source).toMatch(/\[(PUB|PUB-2|CP|MEM)\]/); // common practice: every figure tagged
  });

  it('high gravity starts above 1.060', () => {
    expect(pitchRatePresetFor({ lager: false, plato: platoFromSg(1.05) })).toBe('ale'); // common practice (reference §3)
    expect(pitchRatePresetFor({ lager: false, plato: platoFromSg(1.07) })).toBe('highGravityAle'); // common practice
    expect(pitchRatePresetFor({ lager: true, plato: platoFromSg(1.05) })).toBe('lager'); // common practice
    expect(pitchRatePresetFor({ lager: true, plato: platoFromSg(1.07) })).toBe('highGravityLager'); // common practice
  });
});
