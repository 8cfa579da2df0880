import { describe, expect, it } from 'vitest';
import { viabilityCrossingAt } from './crossing';
import { CULTURE_FORMS, projectViability } from './viability';

const anchor = new Date('2025-03-01T12:00:00Z');
const MS_PER_DAY = 86_400_000;

describe('viabilityCrossingAt', () => {
  // Source: the inverse of the decay models in viability.ts [CALC]; checked by projecting back.
  it.each(CULTURE_FORMS.filter((f) => f !== 'frozen_glycerol'))(
    '%s: the projection at the crossing equals the threshold',
    (form) => {
      const storageTempC = 4;
      const c = viabilityCrossingAt({ form, anchorAt: anchor, storageTempC, threshold: 0.5, startViability: 0.9 });
      expect(c.alreadyBelow).toBe(false);
      expect(c.at).not.toBeNull();
      const p = projectViability({ form, madeOrHarvestedAt: anchor, at: c.at!, storageTempC, startViability: 0.9 });
      expect(p.viability).toBeCloseTo(0.5, 9);
      const before = projectViability({
        form,
        madeOrHarvestedAt: anchor,
        at: new Date(c.at!.getTime() - MS_PER_DAY),
        storageTempC,
        startViability: 0.9,
      });
      expect(before.viability).toBeGreaterThan(0.5);
    },
  );

  // Source: slurry under beer, 2%/week at 2 °C (SLURRY_UNWASHED_MODEL [CP]); Q10 = 2 doubles the rate at 12 °C [MEM].
  it('slurry kept warmer crosses sooner: 10 °C warmer halves the days', () => {
    const cold = viabilityCrossingAt({ form: 'slurry_unwashed', anchorAt: anchor, storageTempC: 2, threshold: 0.5 });
    const warm = viabilityCrossingAt({ form: 'slurry_unwashed', anchorAt: anchor, storageTempC: 12, threshold: 0.5 });
    const coldDays = (cold.at!.getTime() - anchor.getTime()) / MS_PER_DAY;
    const warmDays = (warm.at!.getTime() - anchor.getTime()) / MS_PER_DAY;
    expect(warmDays).toBeCloseTo(coldDays / 2, 6);
    // 0.9 · 0.98^(d/7) = 0.5 → d = 7 · ln(0.5/0.9) / ln(0.98) ≈ 203.7 days [CALC]
    expect(coldDays).toBeCloseTo((7 * Math.log(0.5 / 0.9)) / Math.log(0.98), 6);
  });

  // Source: the linear liquid-pack rule, 0.7%/day of the start [CP]: 50% of a fresh pack at ≈ 71.4 days [CALC].
  it('linear liquid rule', () => {
    const c = viabilityCrossingAt({
      form: 'liquid_pack',
      anchorAt: anchor,
      storageTempC: 4,
      threshold: 0.5,
      liquidModel: 'linear',
    });
    expect((c.at!.getTime() - anchor.getTime()) / MS_PER_DAY).toBeCloseTo(0.5 / 0.007, 6);
  });

  it('a culture that starts at or below the threshold crosses at its anchor', () => {
    // bottle dregs default to 30% alive [CP]
    const c = viabilityCrossingAt({ form: 'bottle_dregs', anchorAt: anchor, storageTempC: 4, threshold: 0.5 });
    expect(c).toEqual({ at: anchor, alreadyBelow: true });
  });

  it('refuses a threshold outside (0, 1)', () => {
    expect(() => viabilityCrossingAt({ form: 'slant', anchorAt: anchor, storageTempC: 4, threshold: 1 })).toThrow(
      RangeError,
    );
    expect(() => viabilityCrossingAt({ form: 'slant', anchorAt: anchor, storageTempC: 4, threshold: 0 })).toThrow(
      RangeError,
    );
  });
});
