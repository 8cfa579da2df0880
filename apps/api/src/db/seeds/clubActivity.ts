import { makePlanCreateSchema, ClubListingCreateSchema, StrainRequestCreateSchema } from '@barmkeep/schemas';
import type { Db } from '../client';
import type { ServiceContext } from '../../services/context';
import { createRequest, listCulture } from '../../services/clubBank';
import { createPlan } from '../../services/planning';

const DAY = 86_400_000;
/** `days` from now at a round UTC hour (09:00 or 19:00 in Berlin in winter), as a person would set it. */
const dayAt = (now: Date, days: number, utcHour: number) => {
  const d = new Date(now.getTime() + days * DAY);
  d.setUTCHours(utcHour, 0, 0, 0);
  return d.toISOString();
};

/**
 * The invented club at work, through the same services the API uses: two strains in the bank, a
 * member's request waiting for its keeper, and a starter plan for a lager brew day next week. Runs
 * after the demo cultures, in the seeding transaction. Nothing here is sent by mail: the notices it
 * raises wait in the app, and the worker mails only what it finds due.
 */
export interface DemoPerson {
  id: string;
  name: string;
  email: string;
  siteRole: 'user' | 'admin';
}

export async function seedDemoClubActivity(db: Db, people: readonly DemoPerson[], now = new Date()): Promise<void> {
  const ctx = {
    db,
    now: () => now,
    appUrl: '',
    mailer: { send: async () => {} },
    lucia: undefined as never,
  } satisfies ServiceContext;
  const club = 'demo-club-millrace';
  const as = (id: string) => {
    const p = people.find((x) => x.id === id);
    if (!p) throw new Error(`demo person ${id} is missing`);
    return { id: p.id, name: p.name, email: p.email, role: p.siteRole, timeZone: 'Europe/Berlin' };
  };
  const [odile, bram, pia] = [as('demo-user-odile'), as('demo-user-bram'), as('demo-user-pia')];

  const slurry = await listCulture(
    ctx,
    bram,
    club,
    ClubListingCreateSchema.parse({
      cultureId: 'demo-culture-weir-slurry',
      note: 'Slurry from the club porter, kept under beer. Bring a clean jar on Thursday.',
    }),
  );
  await listCulture(
    ctx,
    odile,
    club,
    ClubListingCreateSchema.parse({
      cultureId: 'demo-culture-heron-slant',
      note: 'A slant to grow up; ask a week ahead.',
    }),
  );
  await createRequest(
    ctx,
    pia,
    club,
    StrainRequestCreateSchema.parse({
      listingId: slurry.id,
      message: 'Could I have some for a best bitter in two weeks?',
      neededBy: dayAt(now, 12, 18),
      wantedForm: 'slurry_washed',
    }),
  );
  await createPlan(
    ctx,
    pia,
    makePlanCreateSchema(() => now).parse({
      name: 'Lockkeeper lager, spring',
      purpose: 'batch',
      cultureIds: ['demo-culture-lock-lager'],
      batchVolumeL: 20,
      ogPlato: 12,
      beerType: 'lager',
      brewAt: dayAt(now, 8, 8),
    }),
  );
}
