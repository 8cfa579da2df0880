import { describe, expect, it } from 'vitest';
import { TZDate } from '@date-fns/tz';
import {
  blendViableCells,
  computeBrewPlan,
  cultureViableCellsAt,
  growthCorrectionRatio,
  ladderCells,
  pitchVerdict,
  starterWaterMl,
  type BrewPlanInput,
  type CultureCellsInput,
} from './brewPlan.js';
import { planStepUp } from './planner.js';
import { platoFromSg } from './gravity.js';
import { targetPitchCells } from './pitch.js';
import { lmeForStarter } from './wort.js';

const tz = 'Europe/London';
const now = new Date('2026-03-20T09:00:00Z');
const dregs: CultureCellsInput = {
  form: 'bottle_dregs',
  madeAt: now,
  storageTempC: 4,
  cells: { cells: 2 * 2.5e8, low: 2 * 1e7, high: 2 * 2e9 },
};
const equipment = {
  vesselsL: [0.05, 0.25, 0.5, 1, 2, 4],
  agitation: 'stir' as const,
  starterPlato: platoFromSg(1.036),
  maxStepFactor: 10,
  coldCrashHours: 24,
};
const lager = (over: Partial<BrewPlanInput> = {}): BrewPlanInput => ({
  now,
  timeZone: tz,
  brewAt: new TZDate(2026, 3, 4, 10, 0, 0, tz),
  target: { kind: 'batch', volumeL: 20, plato: platoFromSg(1.048), rate: 'lager' },
  cultures: [dregs],
  equipment,
  ...over,
});

describe('small models', () => {
  it('verdict bands', () => {
    // common practice: within −10% / +20% is on target (docs/yeast-math.md §11)
    expect(pitchVerdict({ cells: 80, targetCells: 100 })).toMatchObject({
      kind: 'under',
      text: 'Under-pitched by 20%',
    });
    expect(pitchVerdict({ cells: 95, targetCells: 100 }).kind).toBe('on_target');
    expect(pitchVerdict({ cells: 150, targetCells: 100 })).toMatchObject({ kind: 'over', text: 'Over-pitched by 50%' });
  });
  it('water for 1 L at SG 1.036 with 103 g DME is about 933 mL', () => {
    // source: mass balance [CALC], docs/yeast-math.md §11
    expect(starterWaterMl({ volumeL: 1, sg: 1.036, extractGrams: 102.7 })).toBeCloseTo(933.3, 1);
  });
  it('growth correction is the geometric mean of measured/predicted new cells, clamped', () => {
    // source: docs/yeast-math.md §11 [CALC]
    const r = growthCorrectionRatio([
      { startCells: 10, predictedCells: 110, measuredCells: 60 }, // 0.5
      { startCells: 10, predictedCells: 110, measuredCells: 210 }, // 2
    ]);
    expect(r.ratio).toBeCloseTo(1, 12);
    expect(growthCorrectionRatio([]).ratio).toBe(1);
    expect(growthCorrectionRatio([{ startCells: 10, predictedCells: 20, measuredCells: 5 }]).perStep[0]).toBe(0.25);
  });
  it('viable cells of a culture decay with its form model; a blend adds', () => {
    // source: docs/yeast-math.md §4 worked example, dregs 30% at harvest, 10%/week at 4 °C
    const week = new Date(now.getTime() + 7 * 86_400_000);
    expect(cultureViableCellsAt(dregs, now).cells).toBeCloseTo(1.5e8, -3);
    expect(cultureViableCellsAt(dregs, week).viability).toBeCloseTo(0.27, 6);
    expect(blendViableCells([dregs, dregs], now).cells).toBeCloseTo(3e8, -3);
  });
  it('the ladder reproduces the planner’s own expected cells', () => {
    // source: docs/yeast-math.md §7 worked example (50 M live, target 200 B)
    const plan = planStepUp({
      startCells: 50e6,
      viability: 1,
      targetCells: 200e9,
      agitation: 'stir',
      vessels: equipment.vesselsL,
    });
    const cells = ladderCells(50e6, plan.steps, 'stir');
    plan.steps.forEach((s, i) => expect(cells[i]).toBeCloseTo(s.expectedCells, -3));
  });
});

describe('computeBrewPlan', () => {
  it('plans a lager from bottle dregs: target, ladder, range, schedule', () => {
    const p = computeBrewPlan(lager());
    // source: docs/yeast-math.md §3, 1.5 M/mL/°P (Fix [PUB-2])
    expect(p.targetCells).toBeCloseTo(targetPitchCells({ volumeL: 20, plato: platoFromSg(1.048), rate: 'lager' }), 0);
    expect(p.noStarterNeeded).toBe(false);
    expect(p.stepUp.feasible).toBe(true);
    expect(p.steps[0]!.inoculationCellsPerMl).toBeGreaterThanOrEqual(0.5e6); // §7 rule 3, 0.5 M/mL floor [CP]
    expect(p.steps[0]!.volumeL).toBeLessThanOrEqual(0.25); // 150 M live cells fit at most 300 mL
    expect(p.steps[0]!.sg).toBeCloseTo(1.022, 4); // §7 rule 4
    expect(p.steps[0]!.lmeGrams).toBeCloseTo(
      lmeForStarter({ volumeL: p.steps[0]!.volumeL, plato: p.steps[0]!.plato }),
      9,
    );
    expect(p.final.low).toBeLessThan(p.final.cells);
    expect(p.final.high).toBeGreaterThan(p.final.cells);
    expect(p.verdict.kind).not.toBe('under');
    expect(p.schedule.fitsInTime).toBe(true);
    expect(p.steps.at(-1)!.endAt).toEqual(p.schedule.coldCrashStartAt);
    expect(p.schedule.brewAt!.getTime() - p.schedule.coldCrashStartAt.getTime()).toBe(24 * 3.6e6);
  });
  it('says no starter is needed when the culture already has enough', () => {
    // source: §7 rule 7 (target already met: zero steps)
    const slurry: CultureCellsInput = {
      form: 'slurry_unwashed',
      madeAt: now,
      storageTempC: 2,
      cells: { cells: 400e9, low: 100e9, high: 700e9 },
    };
    const p = computeBrewPlan(
      lager({ cultures: [slurry], target: { kind: 'batch', volumeL: 20, plato: 12, rate: 'ale' } }),
    );
    expect(p.noStarterNeeded).toBe(true);
    expect(p.steps).toHaveLength(0);
  });
  it('offers a shorter plan when the brew date is too soon', () => {
    // rules of docs/yeast-math.md §11 (best plan that fits the time)
    const p = computeBrewPlan(lager({ brewAt: new Date(now.getTime() + 60 * 3.6e6) }));
    expect(p.schedule.fitsInTime).toBe(false);
    expect(p.schedule.hoursShort).toBeGreaterThan(0);
    expect(p.steps[0]!.startAt.getTime()).toBeGreaterThanOrEqual(now.getTime());
  });
  it('reports the largest first vessel when the start is too small for the smallest one', () => {
    // source: §7 rule 3, 0.5 M/mL floor [CP]
    const tiny: CultureCellsInput = { ...dregs, cells: { cells: 5e7, low: 1e7, high: 1e8 } }; // 15 M viable
    const p = computeBrewPlan(lager({ cultures: [tiny] }));
    expect(p.stepUp.feasible).toBe(false);
    expect(p.maxFirstVesselMl).toBe(30);
  });
  it('re-plans the rest from a measured count', () => {
    // rules of docs/yeast-math.md §11 (re-optimisation after a count)
    const first = computeBrewPlan(lager());
    const s = first.steps[0]!;
    const startedAt = s.startAt;
    const completedAt = new Date(startedAt.getTime() + s.hours * 3.6e6);
    const measured = { cells: s.expectedCells / 4, low: s.expectedCells / 5, high: s.expectedCells / 3 };
    const next = computeBrewPlan(
      lager({
        now: completedAt,
        executed: [
          {
            volumeL: s.volumeL,
            plato: s.plato,
            hours: s.hours,
            start: s.startCells,
            expectedCells: s.expectedCells,
            startedAt,
            completedAt,
            measured,
          },
        ],
      }),
    );
    expect(next.startCells).toEqual(measured);
    expect(next.steps[0]!.startCells.cells).toBe(measured.cells);
    expect(next.steps[0]!.sg).toBeCloseTo(1.036, 3); // awake culture: no second low-gravity feed
    expect(next.steps.every((x) => x.volumeL >= s.volumeL)).toBe(true);
  });
  it('a growth correction below 1 needs more starter', () => {
    // source: §11, the correction scales the new cells of every step
    const a = computeBrewPlan(lager());
    const b = computeBrewPlan(lager({ growthCorrection: 0.5 }));
    expect(b.stepUp.totalDmeGrams).toBeGreaterThanOrEqual(a.stepUp.totalDmeGrams);
    expect(b.growthCorrection).toBe(0.5);
  });
});
