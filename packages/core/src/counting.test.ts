import fc from 'fast-check';
import jStat from 'jstat';
import { describe, expect, it } from 'vitest';
import { hemocytometerCount, SQUARE_VOLUME_ML, viabilityFromStain } from './counting.js';
import { poissonInterval95, wilsonInterval95, Z_95 } from './stats.js';

const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

describe('hemocytometerCount', () => {
  it('200 cells in 5 medium squares at 1:100 → 1.0×10⁹ cells/mL', () => {
    const r = hemocytometerCount({ cellsCounted: 200, squaresCounted: 5, dilution: 100 });
    expect(rel(r.cellsPerMl, 1e9)).toBeLessThan(1e-12); // source: reference §2b check value [CALC]
  });

  it('450 cells in 4 large squares at 1:10 → 1.125×10⁷ cells/mL', () => {
    const r = hemocytometerCount({
      cellsCounted: 450,
      squaresCounted: 4,
      dilution: 10,
      squareVolumeMl: SQUARE_VOLUME_ML.large,
    });
    expect(rel(r.cellsPerMl, 1.125e7)).toBeLessThan(1e-12); // source: Amrita Virtual Lab "Hemocytometer" quiz [PUB]
  });

  it('1 g slurry to 100 mL, 1:1 stain, 150 cells in 5 squares → 1.5×10⁹ cells/mL', () => {
    const r = hemocytometerCount({ cellsCounted: 150, squaresCounted: 5, dilution: 200 });
    expect(rel(r.cellsPerMl, 1.5e9)).toBeLessThan(1e-12); // source: reference §2b worked example [CALC]
  });

  it('a medium square is 0.2 × 0.2 × 0.1 mm', () => {
    expect(rel(SQUARE_VOLUME_ML.medium, 0.2 * 0.2 * 0.1 * 1e-3)).toBeLessThan(1e-12); // source: Gustavus Adolphus lab manual ex. 1-6 [PUB]
  });

  it('the 95% interval on 200 cells is about ±14%', () => {
    const r = hemocytometerCount({ cellsCounted: 200, squaresCounted: 5, dilution: 100 });
    expect(Math.abs(r.relativeHalfWidth95 - 0.141)).toBeLessThan(0.01); // source: meaderylab.com "Cell Counting Error" ±14.1% [PUB]
    expect(r.ci95[0]).toBeLessThan(r.cellsPerMl);
    expect(r.ci95[1]).toBeGreaterThan(r.cellsPerMl);
  });

  it('warns outside 10–100 cells per square', () => {
    const few = hemocytometerCount({ cellsCounted: 20, squaresCounted: 5, dilution: 10 });
    expect(few.warnings.join(' ')).toMatch(/less dilution/); // source: Gustavus Adolphus lab manual, 10–100 cells per square [PUB]
    const many = hemocytometerCount({ cellsCounted: 1000, squaresCounted: 5, dilution: 10 });
    expect(many.warnings.join(' ')).toMatch(/dilute further/); // source: Gustavus Adolphus lab manual [PUB]
  });

  it('rejects impossible counts', () => {
    expect(() => hemocytometerCount({ cellsCounted: -1, squaresCounted: 5, dilution: 1 })).toThrow(RangeError); // common practice
    expect(() => hemocytometerCount({ cellsCounted: 10, squaresCounted: 0, dilution: 1 })).toThrow(RangeError); // common practice
    expect(() => hemocytometerCount({ cellsCounted: 10, squaresCounted: 5, dilution: 0.5 })).toThrow(RangeError); // common practice
  });
});

describe('Poisson interval vs jstat', () => {
  it('matches the chi-square form of the exact interval', () => {
    // source: exact (Garwood) Poisson interval, standard statistics [CP]; reference values from jstat
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 3000 }), (n) => {
        const [lo, hi] = poissonInterval95(n);
        const refLo = n === 0 ? 0 : jStat.chisquare.inv(0.025, 2 * n) / 2;
        const refHi = jStat.chisquare.inv(0.975, 2 * n + 2) / 2;
        if (n > 0) expect(rel(lo, refLo)).toBeLessThan(1e-6);
        else expect(lo).toBe(0);
        expect(rel(hi, refHi)).toBeLessThan(1e-6);
      }),
      { numRuns: 200 },
    );
  });

  it('has 2.5% of the Poisson mass on each side', () => {
    // source: definition of a two-sided 95% interval [CP]; Poisson cdf from jstat
    // jstat's Poisson cdf overflows above about 150, so stay below
    for (const n of [1, 5, 30, 100]) {
      const [lo, hi] = poissonInterval95(n);
      expect(1 - jStat.poisson.cdf(n - 1, lo)).toBeCloseTo(0.025, 6);
      expect(jStat.poisson.cdf(n, hi)).toBeCloseTo(0.025, 6);
    }
  });
});

describe('viabilityFromStain', () => {
  it('120 unstained of 150 → 80%', () => {
    expect(viabilityFromStain({ live: 120, dead: 30 }).viability).toBeCloseTo(0.8, 12); // source: Amrita Virtual Lab quiz [PUB]
  });

  it('Z_95 is the normal 97.5% quantile', () => {
    expect(Z_95).toBeCloseTo(jStat.normal.inv(0.975, 0, 1), 10); // source: jstat reference library
  });

  it('the Wilson endpoints are where the score statistic equals z (checked with jstat)', () => {
    // source: E. B. Wilson (1927) score interval [MEM]; z from jstat
    const z = jStat.normal.inv(0.975, 0, 1);
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 2000 }), fc.double({ min: 0, max: 1, noNaN: true }), (n, f) => {
        const live = Math.round(f * n);
        const { viability, ci95 } = viabilityFromStain({ live, dead: n - live });
        const [lo, hi] = ci95;
        expect(lo).toBeLessThanOrEqual(viability + 1e-12);
        expect(hi).toBeGreaterThanOrEqual(viability - 1e-12);
        if (live > 0) expect((viability - lo) / Math.sqrt((lo * (1 - lo)) / n)).toBeCloseTo(z, 6);
        if (live < n) expect((hi - viability) / Math.sqrt((hi * (1 - hi)) / n)).toBeCloseTo(z, 6);
      }),
      { numRuns: 300 },
    );
  });

  it('Wilson lies close to the Clopper–Pearson interval from jstat for large counts', () => {
    // source: both intervals target 95% coverage [CP]; Clopper–Pearson via jstat beta quantiles
    const [lo, hi] = wilsonInterval95(120, 150);
    const cpLo = jStat.beta.inv(0.025, 120, 31);
    const cpHi = jStat.beta.inv(0.975, 121, 30);
    expect(Math.abs(lo - cpLo)).toBeLessThan(0.01);
    expect(Math.abs(hi - cpHi)).toBeLessThan(0.01);
  });

  it('flags low viability as an upper bound', () => {
    expect(viabilityFromStain({ live: 70, dead: 30 }).warnings.join(' ')).toMatch(/upper bound/); // source: Gilliland, J. Inst. Brew. 65:424 (1959) [PUB]; 90% threshold [CP]
  });

  it('rejects an empty count', () => {
    expect(() => viabilityFromStain({ live: 0, dead: 0 })).toThrow(RangeError); // common practice
  });
});
