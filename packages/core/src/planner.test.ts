import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { sgFromPlato } from './gravity.js';
import { AGITATIONS, growStarter, type Agitation } from './growth.js';
import {
  DEFAULT_FIRST_STEP_PLATO,
  DEFAULT_STARTER_PLATO,
  LOW_GRAVITY_FIRST_STEP_BELOW_CELLS,
  planStepUp,
  type PlanStepUpInput,
} from './planner.js';
import { dmeForStarter } from './wort.js';

const VESSELS = [0.05, 0.25, 0.5, 1, 2, 4];
const FLOOR = 0.5e6;

/**
 * An independent exhaustive search over every non-decreasing sequence of vessels, stepping with the
 * public growStarter and dmeForStarter. Returns the minimum step count and the least extract at it.
 */
function oracle(x: PlanStepUpInput): { steps: number; grams: number } | null {
  const factor = x.maxStepFactor ?? 10;
  const maxSteps = x.maxSteps ?? 6;
  const viable = x.startCells * x.viability;
  const firstPlato = viable < LOW_GRAVITY_FIRST_STEP_BELOW_CELLS ? DEFAULT_FIRST_STEP_PLATO : DEFAULT_STARTER_PLATO;
  const vols = [...new Set(x.vessels)].sort((a, b) => a - b);
  let best: { steps: number; grams: number } | null = null;
  const walk = (seq: number[]) => {
    if (seq.length > 0) {
      let cells = viable;
      let grams = 0;
      for (let i = 0; i < seq.length; i++) {
        const v = seq[i]!;
        const plato = i === 0 ? firstPlato : DEFAULT_STARTER_PLATO;
        if (cells / (v * 1000) < FLOOR) return;
        cells = growStarter({ startCells: cells, viability: 1, volumeL: v, plato, agitation: x.agitation }).endCells;
        grams += dmeForStarter({ volumeL: v, plato });
      }
      const last = seq[seq.length - 1]!;
      if (cells >= x.targetCells && last >= (x.minFinalVolume ?? 0)) {
        if (!best || seq.length < best.steps || (seq.length === best.steps && grams < best.grams - 1e-9)) {
          best = { steps: seq.length, grams };
        }
      }
    }
    if (seq.length === maxSteps) return;
    const prev = seq[seq.length - 1];
    for (const v of vols) {
      if (prev !== undefined && (v < prev || v > prev * factor * (1 + 1e-9))) continue;
      walk([...seq, v]);
    }
  };
  walk([]);
  return best;
}

describe('planStepUp: bottle dregs', () => {
  const plan = planStepUp({ startCells: 5e7, viability: 1, targetCells: 2e11, agitation: 'stir', vessels: VESSELS });

  it('reaches 200 B from 50 million cells', () => {
    expect(plan.feasible).toBe(true); // source: issue 3 requirement; Woodland Brewing Research, dregs stepped up over ~5 feeds [PUB]
    expect(plan.finalCells).toBeGreaterThanOrEqual(2e11);
  });
  it('starts with tens of mL of low-gravity wort, for days', () => {
    const first = plan.steps[0]!;
    expect(first.volumeL).toBeLessThanOrEqual(0.1); // source: reference §7, first step 20–50 mL [CP]; BrewingTechniques 2(3), 10–15 mL tubes [PUB]
    expect(first.sg).toBeGreaterThanOrEqual(1.02); // source: issue 3 practitioner example SG 1.026 [CP]; BrewingTechniques 1.020 [PUB]
    expect(first.sg).toBeLessThanOrEqual(1.026); // source: issue 3 practitioner example [CP]
    expect(first.hours).toBeGreaterThanOrEqual(48); // source: issue 3 practitioner example, about four days [CP]
  });
  it('never steps more than 10× in volume, and gravity rises to the pitching starter', () => {
    for (let i = 1; i < plan.steps.length; i++) {
      expect(plan.steps[i]!.volumeL / plan.steps[i - 1]!.volumeL).toBeLessThanOrEqual(10 + 1e-9); // source: Wyeast "Propagation", at most 10-fold [PUB]
    }
    const last = plan.steps[plan.steps.length - 1]!;
    expect(last.sg).toBeGreaterThanOrEqual(1.03); // source: J. Zainasheff, starters 1.030–1.040 [PUB-2]
    expect(last.sg).toBeLessThanOrEqual(1.04); // source: J. Zainasheff [PUB-2]
  });
  it('is the fewest steps, then the least extract', () => {
    const o = oracle({ startCells: 5e7, viability: 1, targetCells: 2e11, agitation: 'stir', vessels: VESSELS });
    expect(o).not.toBeNull();
    expect(plan.steps.length).toBe(o!.steps); // source: issue 3 requirement (fewest steps), independent exhaustive search
    expect(plan.totalDmeGrams).toBeCloseTo(o!.grams, 6); // source: issue 3 requirement (then least extract)
  });
});

describe('planStepUp: other cases', () => {
  it('a target already met needs no steps', () => {
    const p = planStepUp({ startCells: 3e11, viability: 0.9, targetCells: 2e11, agitation: 'stir', vessels: VESSELS });
    expect(p.feasible).toBe(true); // source: issue 3 requirement
    expect(p.steps).toHaveLength(0);
    expect(p.finalCells).toBeCloseTo(2.7e11, -6);
  });
  it('a fresh 100 B pack to 200 B is one 1 L stirred step', () => {
    const p = planStepUp({ startCells: 100e9, viability: 1, targetCells: 200e9, agitation: 'stir', vessels: VESSELS });
    expect(p.steps.map((s) => s.volumeL)).toEqual([1]); // source: reference §6a, 100 B in 1 L at 10 °P → ~245 B [CALC]
    expect(p.steps[0]!.sg).toBeCloseTo(sgFromPlato(DEFAULT_STARTER_PLATO), 9);
    expect(p.steps[0]!.hours).toBeLessThanOrEqual(36); // source: reference §7, stir plate 18–36 h [CP]
  });
  it('says why and how close when vessels are too small', () => {
    const p = planStepUp({
      startCells: 5e7,
      viability: 1,
      targetCells: 2e11,
      agitation: 'stir',
      vessels: [0.05, 0.25],
    });
    expect(p.feasible).toBe(false); // common practice: 250 mL cannot hold 200 B at sane density
    expect(p.reason).toMatch(/% of target/);
    expect(p.steps.length).toBeGreaterThan(0);
    expect(p.fractionOfTarget).toBeLessThan(1);
    expect(p.fractionOfTarget).toBeGreaterThan(0);
  });
  it('says so when the start is too small for the smallest vessel', () => {
    const p = planStepUp({ startCells: 5e6, viability: 1, targetCells: 2e11, agitation: 'stir', vessels: VESSELS });
    expect(p.feasible).toBe(false); // source: 0.5 M/mL floor [CP]
    expect(p.reason).toMatch(/smallest vessel/);
  });
  it('honours a tighter step factor and a minimum final volume', () => {
    const p = planStepUp({
      startCells: 5e7,
      viability: 1,
      targetCells: 2e11,
      agitation: 'stir',
      vessels: VESSELS,
      maxStepFactor: 4,
    });
    for (let i = 1; i < p.steps.length; i++)
      expect(p.steps[i]!.volumeL / p.steps[i - 1]!.volumeL).toBeLessThanOrEqual(4 + 1e-9); // source: German schools 4-fold (Raines-Casselman) [PUB-2]
    const q = planStepUp({
      startCells: 100e9,
      viability: 1,
      targetCells: 150e9,
      agitation: 'stir',
      vessels: VESSELS,
      minFinalVolume: 2,
    });
    expect(q.steps[q.steps.length - 1]!.volumeL).toBeGreaterThanOrEqual(2); // source: issue 3 requirement (minFinalVolume)
  });
  it('still starters need at least as many steps as stirred', () => {
    // source: reference §6b–c, still yields less than stirred [PUB-2]/[CP]
    const stir = planStepUp({ startCells: 5e7, viability: 1, targetCells: 2e11, agitation: 'stir', vessels: VESSELS });
    const still = planStepUp({
      startCells: 5e7,
      viability: 1,
      targetCells: 2e11,
      agitation: 'still',
      vessels: VESSELS,
    });
    expect(still.steps.length).toBeGreaterThanOrEqual(stir.steps.length);
  });
});

describe('planStepUp properties', () => {
  const vessels = fc.uniqueArray(fc.constantFrom(0.02, 0.05, 0.1, 0.25, 0.5, 1, 1.5, 2, 3, 4, 5), {
    minLength: 1,
    maxLength: 6,
  });
  const input = fc.record({
    startCells: fc.double({ min: 1e7, max: 5e11, noNaN: true }),
    viability: fc.double({ min: 0.2, max: 1, noNaN: true }),
    targetCells: fc.double({ min: 1e9, max: 1e12, noNaN: true }),
    agitation: fc.constantFrom<Agitation>(...AGITATIONS),
    vessels,
    maxStepFactor: fc.constantFrom(2, 4, 8, 10),
  });

  it('every plan respects vessel sizes, step factor and the floor, and reaches the target when feasible', () => {
    // source: issue 3 requirements; Wyeast 10-fold [PUB]; floor 0.5 M/mL [CP]
    fc.assert(
      fc.property(input, (x) => {
        const p = planStepUp(x);
        let cells = x.startCells * x.viability;
        p.steps.forEach((s, i) => {
          expect(x.vessels).toContain(s.volumeL);
          if (i > 0) expect(s.volumeL).toBeLessThanOrEqual(p.steps[i - 1]!.volumeL * x.maxStepFactor * (1 + 1e-9));
          expect(cells / (s.volumeL * 1000)).toBeGreaterThanOrEqual(FLOOR * (1 - 1e-12));
          expect(s.expectedCells).toBeGreaterThanOrEqual(cells * (1 - 1e-12));
          expect(s.dmeGrams).toBeGreaterThan(0);
          cells = s.expectedCells;
        });
        if (p.feasible) expect(p.finalCells).toBeGreaterThanOrEqual(x.targetCells);
        else expect(p.reason).toBeTruthy();
      }),
      { numRuns: 300 },
    );
  });

  it('matches an exhaustive search: fewest steps, then least extract', () => {
    // source: issue 3 requirement; independent brute force with the public growStarter
    fc.assert(
      fc.property(input, (x) => {
        const p = planStepUp(x);
        const o = oracle(x);
        expect(p.feasible).toBe(o !== null || x.startCells * x.viability >= x.targetCells);
        if (o && p.steps.length > 0) {
          expect(p.steps.length).toBe(o.steps);
          expect(Math.abs(p.totalDmeGrams - o.grams)).toBeLessThan(1e-6 * Math.max(1, o.grams));
        }
      }),
      { numRuns: 150 },
    );
  });
});
