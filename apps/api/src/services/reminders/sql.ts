import { sql, type SQL } from 'drizzle-orm';
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

/** A notice with this key already exists for the culture's owner. */
export const noticeExists = (kind: string, key: SQL) =>
  sql`exists (select 1 from notifications n where n.user_id = c.owner_user_id and n.kind = ${kind} and n.subject_id = c.id and n.dedupe_key = ${key})`;
