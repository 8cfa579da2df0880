import type supertest from 'supertest';
import type { TestApp } from '../helpers';

/**
 * The vocabulary of the authorization matrix (test/access.test.ts). Each router keeps its table of
 * expected statuses beside it in src/routes/<resource>/access.ts; this file only holds types and
 * the `statuses` helper, so importing it from src costs nothing at run time.
 */

export type Agent = ReturnType<typeof supertest.agent>;

/** Who calls. `owner`, `steward` and `member` hold that role in the case's club. */
export const ROLES = ['anonymous', 'stranger', 'member', 'steward', 'owner', 'admin'] as const;
export type Role = (typeof ROLES)[number];

/**
 * What the request acts on.
 * - `none`: nothing in particular (lists, sign-in, create).
 * - `own`: something of the caller's own (for `anonymous`: someone else's; they own nothing).
 * - `other`: something of a person the caller has no tie to (not in any of the caller's clubs),
 *   or a club the caller is not in.
 * - `club`: something of the case's club: the club itself, or a culture a fellow member keeps and
 *   shares with the club.
 */
export const SCOPES = ['none', 'own', 'other', 'club'] as const;
export type Scope = (typeof SCOPES)[number];

export type Statuses = Record<Role, number>;

/** Expected statuses in ROLES order: anonymous, stranger, member, steward, owner, admin. */
export const statuses = (
  anonymous: number,
  stranger: number,
  member: number,
  steward: number,
  owner: number,
  admin: number,
): Statuses => ({ anonymous, stranger, member, steward, owner, admin });

/** The same status for everyone signed in, `anonymous` for the rest. */
export const signedIn = (status: number, anonymous = 401): Statuses =>
  statuses(anonymous, status, status, status, status, status);

export interface AccessPerson {
  id: string;
  email: string;
  password: string;
  name: string;
  agent: Agent;
}

export interface AccessCase {
  role: Role;
  scope: Scope;
  /** the caller; null when anonymous */
  me: AccessPerson | null;
  /** whose resource the request acts on: me (own), a neighbour (other), a fellow club member (club) */
  holder: AccessPerson;
  /** a fresh club for this case: stranger/member/steward/owner hold their roles in it (scope
   * `other`: a club only the neighbour is in) */
  clubId: string;
}

export interface Prepared {
  /** values for the route's :params */
  vars?: Record<string, string>;
  body?: object;
  query?: Record<string, string>;
  /** a multipart upload instead of a JSON body */
  attach?: { field: string; file: Buffer; filename: string; fields?: Record<string, string> };
  /** send with this agent instead of the caller's usual one (for routes that end the session) */
  agent?: Agent;
}

export interface AccessEntry {
  /** expected status per role, for every scope this route can act in */
  expect: Partial<Record<Scope, Statuses>>;
  /** builds what the route acts on; returns path values and the body */
  prepare?: (w: AccessWorld, c: AccessCase) => Promise<Prepared>;
  /** a fixed JSON body, when prepare gives none */
  body?: object;
  /** what the route deliberately shows to whoever holds its secret: 'club-about' (an invitation's
   * preview of its club) or 'holder' (the holder's own data, e.g. a calendar feed by its secret
   * address) */
  shows?: 'club-about' | 'holder';
}

/** 'METHOD /api/full/path/:param' → entry, exactly as the router declares the path. */
export type AccessTable = Record<string, AccessEntry>;

export interface AccessWorld {
  t: TestApp;
  people: Record<Exclude<Role, 'anonymous'> | 'neighbour' | 'clubKeeper', AccessPerson>;
  /** A culture held by `c.holder`, shared with `c.clubId` in the `club` scope; returns its id. */
  culture(c: AccessCase): Promise<string>;
  /** A photo on that culture, uploaded by its holder; returns its id. */
  photo(c: AccessCase, cultureId: string): Promise<string>;
  /** A small real PNG. */
  png(): Promise<Buffer>;
  /** Another signed-in browser for the same person (to end without breaking the next case). */
  freshSession(p: AccessPerson): Promise<Agent>;
  /** A brand-new signed-in person with no ties to anyone. */
  throwawayPerson(): Promise<AccessPerson>;
  /** A plain member added to the club. */
  extraMember(clubId: string): Promise<AccessPerson>;
  /** An open invitation to the club, written straight to the database. */
  invitation(clubId: string, email?: string): Promise<{ id: string; token: string }>;
  /** A valid password-reset token for the person. */
  resetToken(p: AccessPerson): Promise<string>;
  /** A unique e-mail address nobody has used. */
  freshEmail(): string;
  /** The mark put into a person's private text; the matrix fails if anyone else's response holds it. */
  privateMark(userId: string): string;
  /** The mark put into a club's shared text; only its members may see it. */
  clubMark(clubId: string): string;
}
