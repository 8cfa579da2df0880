import convert from 'convert-units';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import * as gravity from './gravity.js';
import * as u from './units.js';

const rel = (a: number, b: number) => (b === 0 ? Math.abs(a) : Math.abs(a - b) / Math.abs(b));
const amount = fc.double({ min: 0.001, max: 1e5, noNaN: true });

describe('units against convert-units', () => {
  // source: convert-units 2.3.4 (reference library, tests only). Its fluid-ounce ratio has 9 significant
  // figures (allow 1e-7); its pound is 453.592 g, 6 figures, against the exact 453.59237 (allow 1e-6)
  const pairs: Array<[string, (x: number) => number, string, string, number?]> = [
    ['L → gal', u.usGallonsFromLitres, 'l', 'gal'],
    ['gal → L', u.litresFromUsGallons, 'gal', 'l'],
    ['L → qt', u.usQuartsFromLitres, 'l', 'qt'],
    ['qt → L', u.litresFromUsQuarts, 'qt', 'l'],
    ['L → fl oz', u.usFlOzFromLitres, 'l', 'fl-oz'],
    ['fl oz → L', u.litresFromUsFlOz, 'fl-oz', 'l'],
    ['L → mL', u.millilitresFromLitres, 'l', 'ml'],
    ['g → oz', u.ouncesFromGrams, 'g', 'oz', 1e-6],
    ['oz → g', u.gramsFromOunces, 'oz', 'g', 1e-6],
    ['g → lb', u.poundsFromGrams, 'g', 'lb', 1e-6],
    ['lb → g', u.gramsFromPounds, 'lb', 'g', 1e-6],
  ];
  it.each(pairs)('%s', (_name, fn, from, to, tolerance = 1e-7) => {
    fc.assert(
      fc.property(amount, (x) => {
        expect(rel(fn(x), convert(x).from(from).to(to))).toBeLessThan(tolerance);
      }),
      { numRuns: 50 },
    );
  });

  it('°C ↔ °F', () => {
    fc.assert(
      fc.property(fc.double({ min: -200, max: 120, noNaN: true }), (c) => {
        expect(Math.abs(u.fahrenheitFromCelsius(c) - convert(c).from('C').to('F'))).toBeLessThan(1e-9);
        expect(Math.abs(u.celsiusFromFahrenheit(u.fahrenheitFromCelsius(c)) - c)).toBeLessThan(1e-9);
      }),
      { numRuns: 100 },
    );
  });
});

describe('fixed points', () => {
  it('5 US gal is 18.927 L', () => {
    expect(u.litresFromUsGallons(5)).toBeCloseTo(18.92706, 5); // source: reference §3 (18,927.06 mL) [CALC]
  });
  it('water boils at 212 °F and 75 °F is about 24 °C', () => {
    expect(u.celsiusFromFahrenheit(212)).toBeCloseTo(100, 10); // common practice
    expect(u.celsiusFromFahrenheit(75)).toBeCloseTo(23.9, 1); // source: issue 3, dregs example 24 °C (75 °F) [CP]
  });
  it('re-exports the gravity converters', () => {
    expect(u.platoFromSg).toBe(gravity.platoFromSg); // common practice: one implementation
    expect(u.sgFromPlato).toBe(gravity.sgFromPlato); // common practice: one implementation
  });
});
