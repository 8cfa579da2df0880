import { describe, expect, it } from 'vitest';
import { estimateCells } from './estimate.js';
import { CULTURE_FORMS } from './viability.js';

const DAY = 86_400_000;
const made = new Date('2026-05-10T08:00:00Z');

describe('estimateCells', () => {
  it('dry yeast: 11.5 g → 115 B, 11 g → 110 B at 10 B/g', () => {
    expect(estimateCells({ form: 'dry_pack', grams: 11.5 }).cells).toBeCloseTo(115e9, -7); // source: reference §4 check [CALC]
    expect(estimateCells({ form: 'dry_pack', grams: 11 }).cells).toBeCloseTo(110e9, -7); // source: BYO "Making Dried Yeast" (B. Patterson), 11 g ≈ 110 B [PUB-2]
  });
  it('dry yeast range covers the 5 B/g minimum and the optimistic 20 B/g', () => {
    const e = estimateCells({ form: 'dry_pack', grams: 10 });
    expect(e.low).toBeLessThanOrEqual(10 * 5e9); // source: Lallemand Brewing, minimum 5 B viable cells/g [PUB]
    expect(e.high).toBeGreaterThanOrEqual(10 * 18e9); // source: Van Den Berg & Van Landschoot, Cerevisia 28(3) 2003, up to 18 B/g [PUB-2]
  });
  it('234 B of ale pitch is about 17 g of dry yeast at 14 B viable per gram', () => {
    expect(estimateCells({ form: 'dry_pack', grams: 16.7, cellsPerGram: 14e9 }).cells / 1e9).toBeCloseTo(234, 0); // source: Madison Beer Review (2012) [PUB]
  });
  it('slurry: 150 mL at 1.2 B/mL and 90% viability → 162 B viable', () => {
    const e = estimateCells({ form: 'slurry_unwashed', volumeMl: 150 });
    expect(e.cells).toBeCloseTo(150 * 1.2e9, -7); // source: Wyeast via spontaneousfunk.blogspot.com, 1.2 B/mL at 40–60% solids [PUB-2]
    expect(e.viableCells).toBeCloseTo(162e9, -7); // source: reference §4 slurry check [CALC]
  });
  it('a quart jar of slurry spans Woodland’s 0.3–2 ×10¹² and contains the 1 ×10¹² rule', () => {
    const e = estimateCells({ form: 'slurry_unwashed', volumeMl: 946 });
    expect(e.low).toBeLessThanOrEqual(0.3e12); // source: Woodland Brewing Research, "Yeast Storage" [PUB]
    expect(e.high).toBeGreaterThanOrEqual(1.8e12); // source: Woodland Brewing Research [PUB]
    expect(e.low).toBeLessThan(1e12); // source: Woodland Brewing Research, ~1 ×10¹² without a microscope [PUB]
    expect(e.high).toBeGreaterThan(1e12);
  });
  it('a liquid pack is about 100 B, with a range down to a 59 B QC lot', () => {
    const e = estimateCells({ form: 'liquid_pack' });
    expect(e.cells).toBe(100e9); // common practice: about 100 B per pack
    expect(e.low).toBeLessThanOrEqual(59e9); // source: White Labs QC sheet example on HomebrewTalk [PUB-2]
  });
  it('a two-month-old pack holds about 64 B live cells', () => {
    const e = estimateCells({
      form: 'liquid_pack',
      madeOrHarvestedAt: made,
      at: new Date(made.getTime() + 60.88 * DAY),
    });
    expect(e.viableCells / 1e9).toBeCloseTo(64, 0); // source: reference §5a exponential 20%/month [CALC]
    expect(e.basis).toMatch(/projected/);
  });
  it('bottle dregs: deliberately wide, default tens of millions viable', () => {
    const e = estimateCells({ form: 'bottle_dregs', bottles: 1 });
    expect(e.low).toBeLessThanOrEqual(1e7); // source: reference §4, 10⁷–10⁹ per bottle [CP]; Woodland, a commercial beer at 7×10⁶ viable [PUB]
    expect(e.high).toBeGreaterThanOrEqual(2e9); // source: Woodland Brewing Research, homebrew bottles up to 2×10⁹ [PUB]
    expect(e.viableCells).toBeGreaterThanOrEqual(50e6); // source: reference §4, default 50–100 ×10⁶ viable [CP]
    expect(e.viableCells).toBeLessThanOrEqual(100e6); // source: reference §4 [CP]
    expect(e.high / e.low).toBeGreaterThanOrEqual(100);
  });
  it('every form gives an ordered range and a basis', () => {
    const inputs = {
      liquid_pack: { form: 'liquid_pack' },
      dry_pack: { form: 'dry_pack', grams: 11 },
      slurry_washed: { form: 'slurry_washed', volumeMl: 100 },
      slurry_unwashed: { form: 'slurry_unwashed', volumeMl: 100 },
      bottle_dregs: { form: 'bottle_dregs', bottles: 3 },
      slant: { form: 'slant' },
      plate: { form: 'plate', loops: 2 },
      frozen_glycerol: { form: 'frozen_glycerol', volumeMl: 1.5 },
    } as const;
    for (const form of CULTURE_FORMS) {
      const e = estimateCells(inputs[form]);
      expect(e.low).toBeLessThanOrEqual(e.cells); // common practice: a range brackets its estimate
      expect(e.high).toBeGreaterThanOrEqual(e.cells);
      expect(e.basis.length).toBeGreaterThan(10);
      expect(e.viability).toBeGreaterThan(0);
      expect(e.viability).toBeLessThanOrEqual(1);
    }
  });
  it('rejects nonsense', () => {
    expect(() => estimateCells({ form: 'dry_pack', grams: 0 })).toThrow(RangeError); // common practice
    expect(() => estimateCells({ form: 'slurry_washed', volumeMl: 10, yeastFraction: 1.5 })).toThrow(RangeError); // common practice
  });
});
