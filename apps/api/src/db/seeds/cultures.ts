import type { Db } from '../client';
import { cultureEvents, cultures, type CultureInsert } from '../schema';
import { attentionOf } from '../../services/cultureHealth';

/**
 * Demo cultures for the invented Millrace Lane Fermenters. Every beer, batch and maker named here is
 * made up. Dates are relative to the moment of seeding so the demo always has something due soon.
 */
export async function seedDemoCultures(db: Db, now = new Date()): Promise<void> {
  const day = 86_400_000;
  const ago = (d: number) => new Date(now.getTime() - d * day);
  const base = (c: Omit<CultureInsert, 'stateChangedAt' | 'stateChangedBy'>): CultureInsert => {
    const row = { ...c, stateChangedAt: c.madeAt, stateChangedBy: c.ownerUserId } as CultureInsert;
    row.attentionDueAt =
      attentionOf({ form: row.form, storageTempC: row.storageTempC, madeAt: row.madeAt, state: row.state ?? 'stored' })
        ?.dueAt ?? null;
    return row;
  };
  const rows: CultureInsert[] = [
    base({
      id: 'demo-culture-heron-dregs',
      ownerUserId: 'demo-user-odile',
      strainName: 'Grey Heron farmhouse dregs',
      species: 'Mixed culture',
      tags: ['farmhouse', 'dregs'],
      origin: 'bottle_dregs',
      originDetails: { origin: 'bottle_dregs', beerName: 'Grey Heron Table Saison', bottleCount: 3, pasteurized: 'no' },
      form: 'bottle_dregs',
      amount: {},
      locationLabel: 'Fridge door, jar A',
      storageTempC: 4,
      madeAt: ago(5),
      state: 'stored',
    }),
    base({
      id: 'demo-culture-heron-slant',
      ownerUserId: 'demo-user-odile',
      parentId: 'demo-culture-heron-dregs',
      strainName: 'Grey Heron farmhouse (slant)',
      species: 'Mixed culture',
      tags: ['farmhouse'],
      origin: 'reculture',
      originDetails: { origin: 'reculture', method: 'slant' },
      form: 'slant',
      amount: { loops: 1 },
      locationLabel: 'Slant rack, row 1',
      storageTempC: 4,
      madeAt: ago(2),
      state: 'stored',
    }),
    base({
      id: 'demo-culture-weir-pack',
      ownerUserId: 'demo-user-bram',
      strainName: 'Weir Valley clean ale',
      species: 'Saccharomyces cerevisiae',
      tags: ['ale', 'clean'],
      origin: 'purchased',
      originDetails: {
        origin: 'purchased',
        maker: 'Nettlebed Yeastworks (invented)',
        lot: 'NB-2214',
        manufacturedOn: ago(40).toISOString(),
      },
      form: 'liquid_pack',
      amount: { packs: 1, packSize: 'standard' },
      locationLabel: 'Club fridge, top shelf',
      storageTempC: 3,
      madeAt: ago(40),
      state: 'stored',
    }),
    base({
      id: 'demo-culture-weir-slurry',
      ownerUserId: 'demo-user-bram',
      parentId: 'demo-culture-weir-pack',
      generation: 1,
      strainName: 'Weir Valley clean ale',
      species: 'Saccharomyces cerevisiae',
      tags: ['ale'],
      origin: 'batch_slurry',
      originDetails: { origin: 'batch_slurry', batchName: 'Batch 7: Towpath Bitter', crop: 'bottom', washed: false },
      form: 'slurry_unwashed',
      amount: { volumeMl: 250 },
      locationLabel: 'Club fridge, jar 3',
      storageTempC: 3,
      madeAt: ago(12),
      state: 'stored',
    }),
    base({
      id: 'demo-culture-lock-lager',
      ownerUserId: 'demo-user-pia',
      strainName: 'Lockkeeper lager',
      species: 'Saccharomyces pastorianus',
      tags: ['lager'],
      origin: 'gift',
      originDetails: { origin: 'gift', fromName: 'Bram Castellan' },
      form: 'frozen_glycerol',
      amount: { volumeMl: 2 },
      locationLabel: 'Freezer drawer, box L',
      storageTempC: -20,
      madeAt: ago(90),
      state: 'stored',
    }),
  ];
  await db.insert(cultures).values(rows);
  await db.insert(cultureEvents).values(
    rows.map((r) => ({
      id: `${r.id}-created`,
      cultureId: r.id,
      authorUserId: r.ownerUserId,
      kind: 'created' as const,
      occurredAt: r.madeAt,
      data: { origin: r.origin, parentId: r.parentId ?? null, generation: r.generation ?? 0 },
    })),
  );
}
