import { sql } from 'drizzle-orm';
import type { CultureForm } from '@barmkeep/core';
import type { NewNotice } from '../../../db/queries/notifications';
import type { ReminderRule } from '../types';
import { capitalize, cultureWords } from '../format';
import { cultureScope, noticeExists, noticeStored, pref } from '../sql';

const KIND = 'culture.best_by';

interface Row extends Record<string, unknown> {
  id: string;
  user_id: string;
  strain_name: string;
  form: CultureForm;
  location_label: string;
  best_by: string;
  days_left: number;
  warn_sent: boolean;
}

/**
 * A bought pack's printed best-by date is near or past: re-culture it (a starter) or discard it.
 * The date is a calendar date, compared with today in the person's time zone. All in SQL.
 */
export const bestByRule: ReminderRule = {
  kind: KIND,
  async collect({ db, now, userIds }) {
    const scope = cultureScope(KIND, userIds);
    const bestBy = sql`((c.origin_details->>'bestBy')::timestamptz at time zone 'UTC')::date`;
    const localToday = sql`(${now}::timestamptz at time zone u.time_zone)::date`;
    const key = (stage: string) => sql`${`${stage}:`} || to_char(${bestBy}, 'YYYY-MM-DD')`;
    const { rows } = await db.execute<Row>(sql`
      select c.id, c.owner_user_id as user_id, c.strain_name, c.form, c.location_label,
        to_char(${bestBy}, 'YYYY-MM-DD') as best_by, (${bestBy} - ${localToday}) as days_left,
        ${noticeStored(KIND, key('warn'))} as warn_sent
      ${scope.from}
      where ${scope.where} and c.origin = 'purchased' and c.form in ('liquid_pack', 'dry_pack')
        and c.origin_details ? 'bestBy'
        and ${bestBy} - ${pref.warnDays} <= ${localToday}
        and not ${noticeExists(KIND, key('due'))}`);
    const notices: NewNotice[] = [];
    for (const r of rows) {
      const stage = r.days_left <= 0 ? 'due' : 'warn';
      if (stage === 'warn' && r.warn_sent) continue;
      const what = capitalize(
        cultureWords({ strainName: r.strain_name, form: r.form, locationLabel: r.location_label }),
      );
      const title =
        r.days_left < 0
          ? `${what} is past its best-by date (${r.best_by})`
          : r.days_left === 0
            ? `${what} reaches its best-by date today`
            : `${what} reaches its best-by date in ${r.days_left} day${r.days_left === 1 ? '' : 's'} (${r.best_by})`;
      notices.push({
        userId: r.user_id,
        kind: KIND,
        subjectId: r.id,
        dedupeKey: `${stage}:${r.best_by}`,
        title,
        body: 'Past the best-by date a pack holds fewer live cells than its label says: make a starter from it (re-culture), or discard it.',
        link: `/cultures/${r.id}`,
        dueAt: new Date(`${r.best_by}T00:00:00Z`),
      });
    }
    return notices;
  },
};
