import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  CULTURE_FORMS,
  dryPackViability,
  generationAdvice,
  liquidPackViability,
  liquidPackViabilityLinear,
  maxStorageDays,
  projectViability,
  slurryUnwashedViability,
  VIABILITY_MODELS,
  type CultureForm,
} from './viability.js';

const DAY = 86_400_000;
const made = new Date('2026-03-01T12:00:00Z');
const after = (days: number) => new Date(made.getTime() + days * DAY);
const MONTH = 30.44;

describe('liquid pack', () => {
  it('exponential 20%/month: 64.0% at 2 months, 26.2% at 6 months', () => {
    expect(liquidPackViability(2 * MONTH, 4).viability).toBeCloseTo(0.64, 3); // source: reference §5a check values [CALC]
    expect(liquidPackViability(6 * MONTH, 4).viability).toBeCloseTo(0.262, 3); // source: reference §5a check values [CALC]
  });
  it('lands in the makers’ 75–85% after 30 days', () => {
    const v = projectViability({
      form: 'liquid_pack',
      madeOrHarvestedAt: made,
      at: after(30),
      storageTempC: 4,
    }).viability;
    expect(v).toBeGreaterThanOrEqual(0.75); // source: White Labs FAQ "75–85% after 30 days" [PUB-2]
    expect(v).toBeLessThanOrEqual(0.85); // source: White Labs FAQ [PUB-2]
  });
  it('still has live yeast at 6–12 months', () => {
    expect(liquidPackViability(365, 4).viability).toBeGreaterThan(0); // source: White Labs FAQ, live yeast at 6–12 months [PUB-2]
  });
  it('the linear rule: 100 B → 58 B after 60 days, none by 143 days', () => {
    expect(liquidPackViabilityLinear(60, 4).viability * 100e9).toBeCloseTo(58e9, -8); // source: reference §5a [CALC]
    expect(liquidPackViabilityLinear(143, 4).viability).toBeLessThan(0.002); // source: reference §5a, zero at about 143 days [CP]
    expect(
      projectViability({
        form: 'liquid_pack',
        madeOrHarvestedAt: made,
        at: after(60),
        storageTempC: 4,
        liquidModel: 'linear',
      }).model,
    ).toMatch(/linear/); // common practice: the named alternative is selectable
  });
  it('flags warm storage and great age', () => {
    const warm = liquidPackViability(10, 22);
    expect(warm.outOfRange).toBe(true); // source: model range 0–8 °C (refrigerated, White Labs FAQ [PUB-2])
    expect(warm.note).toMatch(/outside/);
    expect(warm.viability).toBeLessThan(liquidPackViability(10, 4).viability); // common practice: warm yeast dies faster
    expect(liquidPackViability(400, 4).outOfRange).toBe(true); // source: model range 365 days [PUB-2]
  });
});

describe('dry pack', () => {
  it('4%/year cold: 92.2% after 2 years; 20%/year warm: 64%', () => {
    expect(dryPackViability(2 * 365.25, 4).viability).toBeCloseTo(0.9216, 3); // source: reference §5b check [CALC]
    expect(dryPackViability(2 * 365.25, 20).viability).toBeCloseTo(0.64, 3); // source: reference §5b check [CALC]
  });
  it('flags 40 °C storage', () => {
    expect(dryPackViability(30, 40).outOfRange).toBe(true); // source: model range −20–25 °C; 90%/month loss at 40 °C (K-State via dairyherd.com) [PUB-2]
  });
});

describe('slurry', () => {
  it('starts about 90% and stays well above half for a month at 2 °C', () => {
    const p = slurryUnwashedViability(30, 2);
    expect(p.startViability).toBe(0.9); // source: Woodland Brewing Research, "Yeast Storage", ~90% [PUB]
    expect(p.viability).toBeGreaterThan(0.75); // source: Woodland Brewing Research, little drop over a month [PUB]
  });
  it('washed slurry under water loses faster than slurry under beer', () => {
    const w = projectViability({ form: 'slurry_washed', madeOrHarvestedAt: made, at: after(21), storageTempC: 2 });
    const u = projectViability({ form: 'slurry_unwashed', madeOrHarvestedAt: made, at: after(21), storageTempC: 2 });
    expect(w.viability).toBeLessThan(u.viability); // source: C. White, storage under beer [PUB]; rates [CP]
  });
});

describe('frozen glycerol stock', () => {
  it('hardly changes in a year at −80 °C but fades at −20 °C', () => {
    const deep = projectViability({
      form: 'frozen_glycerol',
      madeOrHarvestedAt: made,
      at: after(365),
      storageTempC: -80,
    });
    const home = projectViability({
      form: 'frozen_glycerol',
      madeOrHarvestedAt: made,
      at: after(365),
      storageTempC: -20,
    });
    expect(deep.viability / deep.startViability).toBeGreaterThan(0.97); // source: Grosshans lab, indefinite at ≤ −60 °C [PUB]
    expect(home.viability / home.startViability).toBeLessThan(0.7); // source: Folia Microbiol. 54:230 (2009), −20 °C is poor [PUB]
  });
  it('is out of range when not frozen', () => {
    expect(
      projectViability({ form: 'frozen_glycerol', madeOrHarvestedAt: made, at: after(5), storageTempC: 4 }).outOfRange,
    ).toBe(true); // source: model range ≤ −15 °C [CP]
  });
});

describe('projectViability, every form', () => {
  it('a date before making is flagged', () => {
    const p = projectViability({ form: 'slant', madeOrHarvestedAt: made, at: after(-3), storageTempC: 4 });
    expect(p.outOfRange).toBe(true); // common practice: time runs forward
    expect(p.viability).toBe(p.startViability);
  });
  it('every model has a tagged source and a valid range', () => {
    for (const form of CULTURE_FORMS) {
      const m = VIABILITY_MODELS[form];
      expect(m.source).toMatch(/\[(PUB|PUB-2|CP|MEM)\]/); // common practice: every model tagged
      expect(m.validTempC[0]).toBeLessThan(m.validTempC[1]);
    }
  });
  it('falls with time, stays in 0–1, and warmer is never better', () => {
    // common practice: viability only falls in storage, faster when warm (reference §5)
    fc.assert(
      fc.property(
        fc.constantFrom<CultureForm>(...CULTURE_FORMS),
        fc.double({ min: 0, max: 4000, noNaN: true }),
        fc.double({ min: 0, max: 4000, noNaN: true }),
        fc.double({ min: -200, max: 45, noNaN: true }),
        fc.double({ min: 0, max: 10, noNaN: true }),
        fc.option(fc.double({ min: 0, max: 1, noNaN: true }), { nil: undefined }),
        (form, d1, d2, tempC, warmer, startViability) => {
          const [a, b] = d1 <= d2 ? [d1, d2] : [d2, d1];
          const base = {
            form,
            madeOrHarvestedAt: made,
            storageTempC: tempC,
            ...(startViability === undefined ? {} : { startViability }),
          };
          const va = projectViability({ ...base, at: after(a) }).viability;
          const vb = projectViability({ ...base, at: after(b) }).viability;
          const vw = projectViability({ ...base, storageTempC: tempC + warmer, at: after(b) }).viability;
          for (const v of [va, vb, vw]) {
            expect(v).toBeGreaterThanOrEqual(0);
            expect(v).toBeLessThanOrEqual(1);
          }
          expect(vb).toBeLessThanOrEqual(va);
          expect(vw).toBeLessThanOrEqual(vb);
        },
      ),
      { numRuns: 500 },
    );
  });
  it('rejects a start viability above 1', () => {
    expect(() =>
      projectViability({ form: 'plate', madeOrHarvestedAt: made, at: after(1), storageTempC: 4, startViability: 1.2 }),
    ).toThrow(RangeError); // common practice: a fraction
  });
});

describe('maxStorageDays', () => {
  it('gives the published limits at their temperatures', () => {
    expect(maxStorageDays('liquid_pack', 4).days).toBe(120); // source: 4-month shelf life, White Labs FAQ [PUB-2]; Escarpment Labs [PUB]
    expect(maxStorageDays('dry_pack', 10).days).toBe(730); // source: 2 years below 10 °C, BYO "Making Dried Yeast" [PUB-2]
    expect(maxStorageDays('slurry_unwashed', 2).days).toBe(30); // source: Escarpment Labs, starter after a month [PUB]
    expect(maxStorageDays('slant', 4).days).toBe(183); // source: Russell & Stewart, J. Am. Soc. Brew. Chem. 39:19 (1981) [PUB]
    expect(maxStorageDays('plate', 4).days).toBe(14); // source: OpenWetWare, refrigerated plates 1–2 weeks [PUB]
    expect(maxStorageDays('frozen_glycerol', -80).days).toBeGreaterThanOrEqual(365 * 2); // source: Grosshans lab, indefinite at ≤ −60 °C [PUB]
    expect(maxStorageDays('frozen_glycerol', -20).days).toBeLessThanOrEqual(365); // common practice: −20 °C stocks 6–12 months
  });
  it('a thawed stock must be re-cultured now', () => {
    const r = maxStorageDays('frozen_glycerol', 4);
    expect(r.days).toBe(0); // common practice
    expect(r.outOfRange).toBe(true);
  });
  it('warmer never allows longer storage', () => {
    // common practice: warm storage shortens every limit
    fc.assert(
      fc.property(
        fc.constantFrom<CultureForm>(...CULTURE_FORMS),
        fc.double({ min: -100, max: 40, noNaN: true }),
        fc.double({ min: 0, max: 20, noNaN: true }),
        (form, t, dt) => {
          const cold = maxStorageDays(form, t);
          expect(cold.days).toBeGreaterThanOrEqual(0);
          expect(cold.source).toMatch(/\[(PUB|PUB-2|CP|MEM)\]/);
          expect(maxStorageDays(form, t + dt).days).toBeLessThanOrEqual(cold.days);
        },
      ),
    );
  });
});

describe('generationAdvice', () => {
  it('warns after 5 generations and stops after 10', () => {
    expect(generationAdvice(5).level).toBe('ok'); // common practice: homebrew default (reference §5e)
    expect(generationAdvice(6).level).toBe('warn'); // common practice
    expect(generationAdvice(11).level).toBe('stop'); // common practice
  });
});
