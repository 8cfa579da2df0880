import { eq, type SQL } from 'drizzle-orm';
import { cultures, type CultureRow } from '../db/schema';
import { findCultureById } from '../db/queries/cultures';
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

/** The SQL predicate matching exactly the cultures `canView` allows, for lists and exports. */
export function visibleCulturesWhere(actor: Actor): SQL {
  return eq(cultures.ownerUserId, actor.id);
}

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
