import { IN_USE_STATES } from '@barmkeep/schemas';
import { descendantsOf, insertEvents, markSuspect } from '../db/queries/cultures';
import { clubsTouchingCultures, insertActivity } from '../db/queries/clubBank';
import type { DbOrTx } from '../db/queries/clubs';
import type { CultureRow } from '../db/schema';
import { newId } from '../lib/ids';
import { notify } from './notify';

/**
 * Contamination confirmed in `root` reaches every descendant, whoever keeps it and whichever club
 * it passed through: descendants in other people's keeping are flagged suspect (pointing at the
 * root), each of their keepers is told once, and every club the lineage passed through records
 * the quarantine in its feed. The actor's own descendants are flagged as they chose in the
 * quarantine form; nothing of anyone's private record is read or shown.
 */
export async function alertLineage(
  ctx: { db: DbOrTx; now: () => Date },
  actorId: string,
  root: Pick<CultureRow, 'id' | 'strainName'>,
  eventId: string,
): Promise<{ othersFlagged: number; keepersNotified: number }> {
  const now = ctx.now();
  const below = await descendantsOf(ctx.db, root.id);
  const kept = below.filter((d) => IN_USE_STATES.includes(d.state));
  const others = kept.filter((d) => d.owner_user_id !== actorId);
  await markSuspect(
    ctx.db,
    others.map((d) => d.id),
    { fromCultureId: root.id, since: now },
  );
  await insertEvents(
    ctx.db,
    others.map((d) => ({
      id: newId(),
      cultureId: d.id,
      authorUserId: actorId,
      kind: 'contamination_suspected' as const,
      occurredAt: now,
      notes: `Contamination confirmed in an ancestor kept by someone else (${root.strainName})`,
      data: { fromCultureId: root.id, fromEventId: eventId, acrossOwners: true },
    })),
  );
  const byKeeper = new Map<string, typeof others>();
  for (const d of others) byKeeper.set(d.owner_user_id, [...(byKeeper.get(d.owner_user_id) ?? []), d]);
  for (const [userId, theirs] of byKeeper) {
    const first = theirs[0]!;
    const names = [...new Set(theirs.map((d) => d.strain_name))].slice(0, 3).join(', ');
    await notify(ctx, {
      userId,
      kind: 'culture.lineage_contamination',
      subjectId: first.id,
      dedupeKey: `contamination:${eventId}`,
      title: `Contamination confirmed upstream of ${theirs.length === 1 ? first.strain_name : `${theirs.length} of your cultures`}`,
      body:
        `An ancestor, ${root.strainName}, was confirmed contaminated and quarantined by its keeper. ` +
        `Flagged as suspect: ${names}${theirs.length > 3 ? '…' : ''}. Keep ${theirs.length === 1 ? 'it' : 'them'} apart and check before you pitch.`,
      link: `/cultures/${first.id}`,
    });
  }
  for (const clubId of await clubsTouchingCultures(ctx.db, [root.id, ...below.map((d) => d.id)])) {
    await insertActivity(ctx.db, {
      id: newId(),
      clubId,
      actorUserId: actorId,
      kind: 'culture_quarantined',
      cultureId: root.id,
      data: { strainName: root.strainName, descendantsFlagged: kept.length },
      createdAt: now,
    });
  }
  return { othersFlagged: others.length, keepersNotified: byKeeper.size };
}
