import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { extractGrams, gravityPoints, platoFromSg, sgFromPlato, sgFromPlatoClosedForm } from './gravity.js';

describe('platoFromSg (ASBC cubic)', () => {
  // source: reference §1a check values, ASBC cubic [CALC], tolerance ±0.01 °P
  const cubicTable: Array<[number, number]> = [
    [1.02, 5.081],
    [1.03, 7.558],
    [1.04, 9.994],
    [1.048, 11.912],
    [1.05, 12.388],
    [1.06, 14.741],
    [1.08, 19.331],
    [1.1, 23.769],
  ];
  it.each(cubicTable)('SG %s → %s °P', (sg, plato) => {
    expect(Math.abs(platoFromSg(sg) - plato)).toBeLessThan(0.01); // source: reference §1a [CALC]
  });

  it('agrees with Buhl’s one-parameter fit to the ASBC tables', () => {
    // source: J. Buhl, "Physical Equations Relating Extract and Relative Density", OSF Preprints v1.7 (2024) [PUB];
    // the reference allows ±0.1 °P between the two up to SG 1.100
    for (const sg of [1.0, 1.01, 1.02, 1.03, 1.04, 1.05, 1.06, 1.07, 1.08, 1.09, 1.1]) {
      const buhl = 260.4 - 260.4 / sg;
      expect(Math.abs(platoFromSg(sg) - buhl)).toBeLessThan(0.1);
    }
  });

  it('matches the usual ASBC table points 10 °P ↔ 1.0400 and 12 °P ↔ 1.0484', () => {
    expect(Math.abs(sgFromPlato(10) - 1.04)).toBeLessThan(1e-4); // source: ASBC table value [MEM] (reference §1b)
    expect(Math.abs(sgFromPlato(12) - 1.0484)).toBeLessThan(1e-4); // source: ASBC table value [MEM] (reference §1b)
  });

  it('is near zero at SG 1.000', () => {
    expect(Math.abs(platoFromSg(1.0))).toBeLessThan(0.005); // source: reference §1a, cubic gives −0.003 at 1.000 [CALC]
  });

  it('rejects non-numbers', () => {
    expect(() => platoFromSg(Number.NaN)).toThrow(RangeError); // common practice: fail loudly on bad input
  });
});

describe('sgFromPlato (Newton inverse of the cubic)', () => {
  // source: reference §1b check values of the closed form 1 + P/(258.6 − 0.88P) [CALC]; the Newton inverse of the
  // cubic differs from the closed form by < 6.2e-5 (reference §1b round trip), so allow 1e-4
  const table: Array<[number, number]> = [
    [5, 1.01967],
    [10, 1.04003],
    [12, 1.04838],
    [15, 1.06112],
    [20, 1.08298],
    [25, 1.10566],
  ];
  it.each(table)('%s °P → SG %s', (plato, sg) => {
    expect(Math.abs(sgFromPlato(plato) - sg)).toBeLessThan(1e-4); // source: reference §1b [CALC]
    expect(Math.abs(sgFromPlatoClosedForm(plato) - sg)).toBeLessThan(5e-5); // source: reference §1b [CALC], ±0.00005
  });

  it('round-trips with the cubic to 1e-6 across 0–30 °P and SG 1.000–1.130', () => {
    // source: issue 3 requirement (round trip exact to 1e-6); range from reference §1a
    fc.assert(
      fc.property(fc.double({ min: 0, max: 30, noNaN: true }), (plato) => {
        expect(Math.abs(platoFromSg(sgFromPlato(plato)) - plato)).toBeLessThan(1e-6);
      }),
    );
    fc.assert(
      fc.property(fc.double({ min: 1.0, max: 1.13, noNaN: true }), (sg) => {
        expect(Math.abs(sgFromPlato(platoFromSg(sg)) - sg)).toBeLessThan(1e-6);
      }),
    );
  });

  it('is strictly increasing', () => {
    // common practice: denser wort always carries more extract
    fc.assert(
      fc.property(fc.double({ min: 0, max: 30, noNaN: true }), fc.double({ min: 0, max: 30, noNaN: true }), (a, b) => {
        fc.pre(Math.abs(a - b) > 1e-6);
        const [lo, hi] = a < b ? [a, b] : [b, a];
        expect(sgFromPlato(lo)).toBeLessThan(sgFromPlato(hi));
        expect(platoFromSg(1 + lo / 250)).toBeLessThan(platoFromSg(1 + hi / 250));
      }),
    );
  });
});

describe('extract and points', () => {
  it('1 L of 10 °P wort holds about 104 g of extract', () => {
    expect(extractGrams({ volumeL: 1, plato: 10 })).toBeCloseTo(104.0, 0); // source: reference §6a check table [CALC]
  });
  it('scales with volume and is zero for no wort', () => {
    expect(extractGrams({ volumeL: 2, plato: 10 })).toBeCloseTo(2 * extractGrams({ volumeL: 1, plato: 10 }), 9); // common practice: extract is per litre
    expect(extractGrams({ volumeL: 0, plato: 10 })).toBe(0); // common practice
  });
  it('1.048 is 48 points', () => {
    expect(gravityPoints(1.048)).toBeCloseTo(48, 9); // common practice: gravity points
  });
});
