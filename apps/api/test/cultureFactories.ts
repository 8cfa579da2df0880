import type { CultureCreateInput } from '@barmkeep/schemas';

let n = 0;
const day = 86_400_000;
export const daysAgo = (d: number, from = new Date()) => new Date(from.getTime() - d * day).toISOString();

/** A bottle-dregs culture of an invented beer, harvested `ageDays` ago. */
export function buildDregs(overrides: Partial<CultureCreateInput> = {}): CultureCreateInput {
  n += 1;
  return {
    strainName: `Lantern Farmhouse house culture ${n}`,
    species: 'Saccharomyces cerevisiae',
    tags: ['saison', 'dregs'],
    form: 'bottle_dregs',
    origin: { origin: 'bottle_dregs', beerName: `Hollow Oak Saison no. ${n}`, bottleCount: 2, pasteurized: 'no' },
    locationLabel: 'Fridge door',
    storageTempC: 4,
    madeAt: daysAgo(2),
    ...overrides,
  };
}

export function buildSlurry(
  parentId: string | undefined,
  overrides: Partial<CultureCreateInput> = {},
): CultureCreateInput {
  n += 1;
  return {
    strainName: `Quarry Lager slurry ${n}`,
    form: 'slurry_unwashed',
    origin: { origin: 'batch_slurry', batchName: `Batch ${n}: Quarry Pale`, crop: 'bottom', washed: false },
    ...(parentId ? { parentId } : {}),
    amount: { volumeMl: 200 },
    locationLabel: 'Back shelf',
    storageTempC: 3,
    madeAt: daysAgo(1),
    ...overrides,
  };
}

export function buildReculture(parentId: string, overrides: Partial<CultureCreateInput> = {}): CultureCreateInput {
  n += 1;
  return {
    strainName: `Re-culture ${n}`,
    form: 'slant',
    origin: { origin: 'reculture', method: 'slant' },
    parentId,
    storageTempC: 4,
    madeAt: daysAgo(0.5),
    ...overrides,
  };
}
