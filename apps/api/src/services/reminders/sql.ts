import { sql, type SQL } from 'drizzle-orm';
import type { Db } from '../../db/client';
import { REMINDER_DEFAULTS } from '@barmkeep/schemas';

/** Culture states a keeper is still holding and could act on (quarantined ones are being checked). */
export const REMINDED_STATES = ['active', 'stored'] as const;

/** `extract(epoch …)` in milliseconds as text, the same digits as `epochKey` in format.ts. */
export const epochKeySql = (expr: SQL) => sql`((extract(epoch from ${expr}) * 1000)::bigint)::text`;

/** The person's setting or its default (a missing preferences row means all defaults). */
export const pref = {
  threshold: sql`coalesce(p.viability_threshold_pct, ${REMINDER_DEFAULTS.viabilityThresholdPct})`,
  warnDays: sql`coalesce(p.warn_days, ${REMINDER_DEFAULTS.warnDays})`,
  generationLimit: sql`coalesce(p.generation_limit, ${REMINDER_DEFAULTS.generationLimit})`,
  stepLeadHours: sql`coalesce(p.step_lead_hours, ${REMINDER_DEFAULTS.stepLeadHours})`,
};

/** Joins and filters every culture rule shares: owner, their settings, live states, not muted. */
export function cultureScope(kind: string, userIds?: string[]): { from: SQL; where: SQL } {
  const from = sql`from cultures c
    join users u on u.id = c.owner_user_id
    left join notification_preferences p on p.user_id = c.owner_user_id`;
  const parts: SQL[] = [
    sql`c.state in ('active', 'stored')`,
    sql`not (coalesce(p.muted_kinds, '{}'::text[]) @> array[${kind}]::text[])`,
  ];
  if (userIds) parts.push(sql`c.owner_user_id = any(${sql.param(userIds)}::text[])`);
  return { from, where: sql.join(parts, sql` and `) };
}

/** `and c.owner_user_id = any(…)` when the pass is limited to some people. */
export const scopedTo = (userIds?: string[]) =>
  userIds ? sql`and c.owner_user_id = any(${sql.param(userIds)}::text[])` : sql``;

/** The projection's anchor: the latest stain count when there is one, else the made/harvest date. */
export const anchorSql = sql`(case when c.measured_at is not null and c.measured_viability is not null then c.measured_at else c.made_at end)`;

/** A notice with this key already exists for the culture's owner. */
export const noticeExists = (kind: string, key: SQL) =>
  sql`exists (select 1 from notifications n where n.user_id = c.owner_user_id and n.kind = ${kind} and n.subject_id = c.id and n.dedupe_key = ${key})`;

/**
 * The same test as a column in a select list. A scalar subquery with `limit 1` is probed per row
 * through the dedupe index; an EXISTS there may be planned as a hash over every notice of the kind.
 */
export const noticeStored = (kind: string, key: SQL) =>
  sql`coalesce((select true from notifications n where n.user_id = c.owner_user_id and n.kind = ${kind} and n.subject_id = c.id and n.dedupe_key = ${key} limit 1), false)`;

const DAY = 86_400_000;

/**
 * `now` plus the longest warning window anyone in the pass has (the default for people without a
 * settings row), plus two days for local calendar days: a constant upper bound on due dates and
 * crossings worth reading, so a range scan on an index can do the work. Each row still compares
 * with its owner's own `warn_days`.
 */
export async function warnHorizon(db: Db, now: Date, userIds?: string[]): Promise<Date> {
  const { rows } = await db.execute<{ days: number }>(sql`
    select greatest(${REMINDER_DEFAULTS.warnDays}, coalesce(max(warn_days), 0))::int as days
    from notification_preferences
    ${userIds ? sql`where user_id = any(${sql.param(userIds)}::text[])` : sql``}`);
  return new Date(now.getTime() + ((rows[0]?.days ?? REMINDER_DEFAULTS.warnDays) + 2) * DAY);
}
