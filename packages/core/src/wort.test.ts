import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { platoFromSg } from './gravity.js';
import { gramsFromPounds, litresFromUsGallons } from './units.js';
import { dmeForStarter, lmeForStarter, sgFromExtract } from './wort.js';

describe('malt extract for starters', () => {
  it('100 g DME made up to 1 L → about 1.035–1.036', () => {
    const sg = sgFromExtract({ grams: 100, volumeL: 1 });
    expect(Math.abs(sg - 1.035)).toBeLessThan(0.0005); // source: reference §7, 42 PPG → 1.035 [CALC]
    expect(Math.abs(sg - 1.036)).toBeLessThanOrEqual(0.002); // source: reference §7 check value 1.036 ± 0.002 [CALC]
  });

  it('the 10:1 rule: about 100 g DME per litre for a 1.036 starter', () => {
    const g = dmeForStarter({ volumeL: 1, plato: platoFromSg(1.036) });
    expect(Math.abs(g - 100) / 100).toBeLessThan(0.05); // source: J. Zainasheff, "Fourteen Essential Questions About Yeast Starters" [PUB-2]
  });

  it('Palmer: 5 gal at 1.040 needs 5 lb DME at 40 PPG, or 5.55 lb LME at 36', () => {
    const volumeL = litresFromUsGallons(5);
    const plato = platoFromSg(1.04);
    expect(Math.abs(dmeForStarter({ volumeL, plato, ppg: 40 }) / gramsFromPounds(5) - 1)).toBeLessThan(0.002); // source: J. Palmer, How to Brew ch. 3.4 [PUB]
    expect(Math.abs(lmeForStarter({ volumeL, plato }) / gramsFromPounds(5.55) - 1)).toBeLessThan(0.002); // source: J. Palmer, How to Brew ch. 3.4 [PUB]
  });

  it('a dregs ladder: 2.5 g in 50 mL ≈ 1.020, 15 g in 200 mL ≈ 1.030, 100 g in 1 L ≈ 1.040', () => {
    // common practice: homebrew-forum stepping example (reference §7); forum figures are rounded, allow ±0.005
    expect(Math.abs(sgFromExtract({ grams: 2.5, volumeL: 0.05 }) - 1.02)).toBeLessThan(0.005);
    expect(Math.abs(sgFromExtract({ grams: 15, volumeL: 0.2 }) - 1.03)).toBeLessThan(0.005);
    expect(Math.abs(sgFromExtract({ grams: 100, volumeL: 1 }) - 1.04)).toBeLessThan(0.006);
  });

  it('is the inverse of sgFromExtract', () => {
    // common practice: grams and gravity from the same PPG figure
    fc.assert(
      fc.property(
        fc.double({ min: 0.01, max: 20, noNaN: true }),
        fc.double({ min: 1, max: 25, noNaN: true }),
        (volumeL, plato) => {
          const grams = dmeForStarter({ volumeL, plato });
          expect(platoFromSg(sgFromExtract({ grams, volumeL }))).toBeCloseTo(plato, 6);
        },
      ),
    );
  });

  it('LME needs more grams than DME', () => {
    expect(lmeForStarter({ volumeL: 1, plato: 9 })).toBeGreaterThan(dmeForStarter({ volumeL: 1, plato: 9 })); // source: Palmer, LME 36 vs DME 42 PPG [PUB]
  });
});
