import { eq, sql, type SQL } from 'drizzle-orm';
import { cultures, users, type CultureRow } from '../db/schema';
import { findCultureById } from '../db/queries/cultures';
import { findClubTies } from '../db/queries/clubs';
import { forbidden, notFound, validationFailed } from '../lib/errors';
import type { Db } from '../db/client';

/**
 * Who may see and change a culture. THE one place that decides it: routes, services and queries
 * ask here. Today only the owner may do either; the clubs work extends these functions (a club
 * culture with visibility 'club' becomes visible to members, editable by stewards) and nothing else.
 */
export interface Actor {
  id: string;
}

type AccessFields = Pick<CultureRow, 'ownerUserId' | 'ownerClubId' | 'visibility'>;

export function canView(actor: Actor, c: AccessFields): boolean {
  return c.ownerUserId === actor.id;
}

export function canEdit(actor: Actor, c: AccessFields): boolean {
  return c.ownerUserId === actor.id;
}

/** May `actor` start a new culture from `parent` (re-culture, split, harvest)? */
export function canUseAsParent(actor: Actor, parent: AccessFields): boolean {
  return canEdit(actor, parent);
}

/** Whom a person shares a club with: loaded once per lineage with `loadLineageTies`. */
export interface LineageTies {
  clubIds: ReadonlySet<string>;
  coMemberIds: ReadonlySet<string>;
}

/**
 * The middle level, for lineage trees only. A culture kept by someone who shares a club with the
 * actor (or owned by one of the actor's clubs) shows its place in the strain's path: strain name,
 * generation, form, state, suspicion and the keeper's name. Never its notes, log, photos or where
 * it is kept; those stay behind `canView`.
 */
export function canSeeInLineage(actor: Actor, c: AccessFields, ties: LineageTies): boolean {
  if (canView(actor, c)) return true;
  if (c.ownerClubId !== null && ties.clubIds.has(c.ownerClubId)) return true;
  return ties.coMemberIds.has(c.ownerUserId);
}

export async function loadLineageTies(db: Db, actor: Actor): Promise<LineageTies> {
  return findClubTies(db, actor.id);
}

/**
 * The SQL predicate matching exactly the cultures `canView` allows, for lists and exports. The
 * library's cached pages are dropped per keeper (`l:<owner>` notifications, decision 0050): a
 * wider predicate needs those notifications widened to match.
 */
export function visibleCulturesWhere(actor: Actor): SQL {
  return eq(cultures.ownerUserId, actor.id);
}

/**
 * `visibleCulturesWhere` with the actor left as the placeholder `actorId`, for a statement that is
 * prepared once and run with `{ actorId: actor.id }`. Change the two together.
 */
export const visibleCulturesTemplate: SQL = eq(cultures.ownerUserId, sql.placeholder('actorId'));

/**
 * How many cultures `visibleCulturesTemplate` matches, as a scalar SQL expression with the same
 * placeholder: the owner's counter (users.culture_count, kept by triggers in migration 0014), so
 * the library's first page does not count the whole library. Change it with the two above.
 */
export const visibleCulturesTotalTemplate: SQL = sql`(select ${users.cultureCount} from ${users} where ${users.id} = ${sql.placeholder('actorId')})`;

/** Someone else's culture is indistinguishable from one that does not exist: always 404. */
export function assertCanView(actor: Actor, c: CultureRow | undefined): CultureRow {
  if (!c || !canView(actor, c)) throw notFound('This culture');
  return c;
}

/** Invisible is 404; visible but not editable (possible once clubs share cultures) is 403. */
export function assertCanEdit(actor: Actor, c: CultureRow | undefined): CultureRow {
  const row = assertCanView(actor, c);
  if (!canEdit(actor, row)) throw forbidden('Only the keeper of this culture can change it');
  return row;
}

export async function loadCultureForView(db: Db, actor: Actor, id: string): Promise<CultureRow> {
  return assertCanView(actor, await findCultureById(db, id));
}

export async function loadCultureForEdit(db: Db, actor: Actor, id: string): Promise<CultureRow> {
  return assertCanEdit(actor, await findCultureById(db, id));
}

/** A parent the actor may not use gets the same answer as a parent that does not exist. */
export function assertUsableParent(actor: Actor, parent: CultureRow | undefined, field = 'body.parentId'): CultureRow {
  if (!parent || !canUseAsParent(actor, parent)) {
    throw validationFailed({ [field]: ['No culture you may re-culture from has this id'] });
  }
  return parent;
}
