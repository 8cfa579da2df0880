import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { abv, abw, apparentAttenuation, apparentAttenuationPlato, realAttenuation } from './batch.js';

describe('abv', () => {
  // source: reference §8a check table [CALC]; simple 131.25 [CP], Hall (Zymurgy 1995) [MEM], Balling [MEM]
  const table: Array<[number, number, number, number, number]> = [
    [1.05, 1.01, 5.25, 5.34, 5.32],
    [1.048, 1.012, 4.73, 4.8, 4.78],
    [1.072, 1.013, 7.74, 8.15, 7.92],
    [1.09, 1.02, 9.19, 9.99, 9.49],
    [1.04, 1.01, 3.94, 3.95, 3.97],
  ];
  it.each(table)('%s → %s', (og, fg, simple, hall, balling) => {
    expect(Math.abs(abv({ og, fg, formula: 'simple' }) - simple)).toBeLessThanOrEqual(0.011); // source: reference §8a [CALC]
    expect(Math.abs(abv({ og, fg, formula: 'hall' }) - hall)).toBeLessThanOrEqual(0.011); // source: reference §8a [CALC]
    expect(Math.abs(abv({ og, fg, formula: 'balling' }) - balling)).toBeLessThanOrEqual(0.011); // source: reference §8a [CALC]
    expect(abv({ og, fg })).toBe(abv({ og, fg, formula: 'balling' })); // default formula, documented in docs/yeast-math.md
  });
  it('1.050 → 1.010 is 4.16% by weight', () => {
    expect(Math.abs(abw({ og: 1.05, fg: 1.01 }) - 4.16)).toBeLessThan(0.01); // source: reference §8a [CALC]
  });
  it('no drop, no alcohol; rejects FG above OG', () => {
    expect(abv({ og: 1.05, fg: 1.05 })).toBeCloseTo(0, 12); // common practice
    expect(() => abv({ og: 1.01, fg: 1.05 })).toThrow(RangeError); // common practice
  });
});

describe('attenuation', () => {
  it('1.040 → 1.010 is 75% apparent', () => {
    expect(apparentAttenuation({ og: 1.04, fg: 1.01 })).toBeCloseTo(75, 9); // source: J. Palmer, How to Brew [PUB]
  });
  it('1.050 → 1.010: 80.0% in points, 79.3% in °P, 65.0% real', () => {
    expect(apparentAttenuation({ og: 1.05, fg: 1.01 })).toBeCloseTo(80, 9); // source: reference §8b [CALC]
    expect(Math.abs(apparentAttenuationPlato({ og: 1.05, fg: 1.01 }) - 79.3)).toBeLessThan(0.05); // source: reference §8b [CALC]
    expect(Math.abs(realAttenuation({ og: 1.05, fg: 1.01 }) - 65.0)).toBeLessThan(0.05); // source: reference §8b [CALC]
  });
  it('real attenuation is 0.8192 × apparent (°P)', () => {
    // source: reference §8b, RA = 0.8192 × AA(°P) with the Balling real extract [CALC]
    fc.assert(
      fc.property(
        fc.double({ min: 1.02, max: 1.12, noNaN: true }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        (og, f) => {
          const fg = 1 + (og - 1) * f;
          expect(realAttenuation({ og, fg })).toBeCloseTo(0.8192 * apparentAttenuationPlato({ og, fg }), 9);
        },
      ),
    );
  });
});
