import { bench, describe } from 'vitest';
import { growStarter, planStepUp } from '../src/index.js';

// A bottle-dregs start: 50 million viable cells to a 200 billion pitch.
const dregs = {
  startCells: 5e7,
  viability: 1,
  targetCells: 2e11,
  agitation: 'stir' as const,
  vessels: [0.05, 0.25, 0.5, 1, 2, 4],
};

let sink = 0;
const options = { time: 2000, warmupTime: 500 };

describe('planner vs one growth step', () => {
  bench(
    'planStepUp (dregs 5e7 → 2e11, 6 vessels)',
    () => {
      sink += planStepUp(dregs).finalCells;
    },
    options,
  );
  bench(
    'growStarter (one step)',
    () => {
      sink += growStarter({ startCells: 5e7, viability: 1, volumeL: 0.05, plato: 5.6, agitation: 'stir' }).endCells;
    },
    options,
  );
});

export { sink };
