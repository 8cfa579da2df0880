import { sql } from 'drizzle-orm';
import { maxStorageDays, type CultureForm, type StorageAction } from '@barmkeep/core';
import type { NewNotice } from '../../../db/queries/notifications';
import type { ReminderRule } from '../types';
import { asDate, capitalize, cultureWords, dayWords, epochKey, whenWords } from '../format';
import { cultureScope, epochKeySql, noticeExists, noticeStored, pref, warnHorizon } from '../sql';
import { clearStoragePending, storageDueKey } from '../marks';

const KIND = 'culture.storage';

const ACTION_WORDS: Record<StorageAction, string> = {
  starter: 'make a starter from it or use it',
  refresh: 'refresh it',
  subculture: 're-culture it',
  discard: 'use it or discard it',
};

interface Row extends Record<string, unknown> {
  id: string;
  user_id: string;
  strain_name: string;
  form: CultureForm;
  location_label: string;
  storage_temp_c: number;
  due_at: Date | string;
  time_zone: string;
  days_left: number;
  warn_sent: boolean;
}

/**
 * The maximum storage time for the form and temperature (core `maxStorageDays`, kept by the
 * culture library in `cultures.attention_due_at`) is near or past. Entirely in SQL: only cultures
 * within their warning window whose "on the day" notice is not stored come back. Moving a culture
 * changes its due date and so its key: the new date is announced. Once the "on the day" notice is
 * stored the pass clears `storage_check_at` (marks.ts; a trigger sets it again when the due date
 * moves), so the range query on that column's index leaves the culture out.
 */
export const storageRule: ReminderRule = {
  kind: KIND,
  async collect({ db, now, userIds }) {
    const scope = cultureScope(KIND, userIds);
    const localToday = sql`(${now}::timestamptz at time zone u.time_zone)::date`;
    const dueLocal = sql`(c.attention_due_at at time zone u.time_zone)::date`;
    const key = (stage: string) => sql`${`${stage}:`} || ${epochKeySql(sql`c.attention_due_at`)}`;
    const horizon = await warnHorizon(db, now, userIds);
    const { rows } = await db.execute<Row>(sql`
      select c.id, c.owner_user_id as user_id, c.strain_name, c.form, c.location_label, c.storage_temp_c,
        c.attention_due_at as due_at, u.time_zone, (${dueLocal} - ${localToday}) as days_left,
        ${noticeStored(KIND, key('warn'))} as warn_sent
      ${scope.from}
      where c.storage_check_at < ${horizon}::timestamptz
        and c.attention_due_at < ${now}::timestamptz + make_interval(days => ${pref.warnDays} + 2)
        and ${scope.where}
        and ${dueLocal} - ${pref.warnDays} <= ${localToday}
        and not ${noticeExists(KIND, storageDueKey)}`);

    const notices: NewNotice[] = [];
    for (const r of rows) {
      const dueAt = asDate(r.due_at);
      const stage = r.days_left <= 0 ? 'due' : 'warn';
      if (stage === 'warn' && r.warn_sent) continue;
      const limit = maxStorageDays(r.form, r.storage_temp_c);
      const what = cultureWords({ strainName: r.strain_name, form: r.form, locationLabel: r.location_label });
      const title =
        r.days_left < 0
          ? `${capitalize(what)} passed its storage time on ${dayWords(dueAt, now, r.time_zone)}`
          : `${capitalize(what)} reaches its storage time ${whenWords(dueAt, now, r.time_zone)}`;
      notices.push({
        userId: r.user_id,
        kind: KIND,
        subjectId: r.id,
        dedupeKey: `${stage}:${epochKey(dueAt)}`,
        title,
        body: `About ${limit.days} days is the usual limit for this form at ${r.storage_temp_c} °C: ${ACTION_WORDS[limit.action]}. (${limit.source})`,
        link: `/cultures/${r.id}`,
        dueAt,
      });
    }
    return notices;
  },
  afterStore: ({ db, now, userIds }) => clearStoragePending(db, now, userIds),
};
