import { sql } from 'drizzle-orm';
import { REMINDER_DEFAULTS } from '@barmkeep/schemas';
import type { Db } from '../../db/client';
import { anchorSql, epochKeySql, noticeStored, pref, scopedTo } from './sql';

const DAY = 86_400_000;

/*
 * A rule's last notice for a culture as it stands (viability and storage: "on the day"; generation:
 * at the owner's limit) needs no second look until the culture or the setting changes. After the
 * engine stores a pass's notices, these statements take the cultures whose last notice is now stored
 * out of the rule's index, so steady-state passes read only what is still pending. Each is one
 * set-based statement; rows another pass holds are skipped (SKIP LOCKED) and taken next time. The
 * notice is probed per row through its dedupe index (`noticeStored`).
 */

/** The "on the day" viability key for the current anchor and the owner's threshold (as the rule writes it). */
export const viabilityDueKey = sql`${pref.threshold}::text || ':due:' || ${epochKeySql(anchorSql)}`;
/** The "on the day" storage key for the current due date. */
export const storageDueKey = sql`'due:' || ${epochKeySql(sql`c.attention_due_at`)}`;

/** Due notices fire at most a local calendar day before the date, hence a two-day bound. */
const dueBound = (now: Date) => new Date(now.getTime() + 2 * DAY);

export async function clearViabilityPending(db: Db, now: Date, userIds?: string[]): Promise<void> {
  await db.execute(sql`
    update cultures set viability_check_at = null
    where id in (
      select c.id from cultures c left join notification_preferences p on p.user_id = c.owner_user_id
      where c.viability_check_at is not null and c.viability_check_at < ${dueBound(now)}::timestamptz
        and not c.viability_stale ${scopedTo(userIds)}
        and ${noticeStored('culture.viability', viabilityDueKey)}
      for update of c skip locked)`);
}

export async function clearStoragePending(db: Db, now: Date, userIds?: string[]): Promise<void> {
  await db.execute(sql`
    update cultures set storage_check_at = null
    where id in (
      select c.id from cultures c
      where c.storage_check_at is not null and c.state in ('active', 'stored')
        and c.storage_check_at < ${dueBound(now)}::timestamptz ${scopedTo(userIds)}
        and ${noticeStored('culture.storage', storageDueKey)}
      for update of c skip locked)`);
}

/**
 * The lowest generation limit anyone has (people without a settings row have the default), as an
 * index bound: no culture below it can reach its owner's limit.
 */
export const lowestGenerationLimit = sql`least(${REMINDER_DEFAULTS.generationLimit}, (select min(generation_limit) from notification_preferences))`;

export async function markGenerationNoticed(db: Db, userIds?: string[]): Promise<void> {
  await db.execute(sql`
    update cultures set generation_noticed = true
    where id in (
      select c.id from cultures c left join notification_preferences p on p.user_id = c.owner_user_id
      where not c.generation_noticed and c.state in ('active', 'stored')
        and c.generation >= ${lowestGenerationLimit} ${scopedTo(userIds)}
        and ${noticeStored('culture.generation', sql`${pref.generationLimit}::text`)}
      for update of c skip locked)`);
}
