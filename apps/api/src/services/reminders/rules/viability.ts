import { sql } from 'drizzle-orm';
import { viabilityCrossingAt, type CultureForm } from '@barmkeep/core';
import type { NewNotice } from '../../../db/queries/notifications';
import type { ReminderRule } from '../types';
import { asDate, capitalize, cultureWords, calendarDaysUntil, dayWords, epochKey, whenWords } from '../format';
import { cultureScope, epochKeySql, noticeExists, pref } from '../sql';

const KIND = 'culture.viability';
const DAY = 86_400_000;

interface Row extends Record<string, unknown> {
  id: string;
  user_id: string;
  strain_name: string;
  form: CultureForm;
  location_label: string;
  storage_temp_c: number;
  anchor_at: Date | string;
  start_viability: number | null;
  measured: boolean;
  time_zone: string;
  threshold_pct: number;
  warn_days: number;
  warn_sent: boolean;
}

/**
 * Projected viability falls to the person's threshold (default 50%): a warning `warnDays` calendar
 * days before in their time zone, and a notice on the day. The projection is anchored at the latest
 * stain count, else the made/harvest date; a new anchor (a fresh count) starts a new pair of notices.
 * The SQL selects, in one query, every kept culture whose "on the day" notice for its current anchor
 * and threshold is not stored yet; core's `viabilityCrossingAt` does the math for each row.
 */
export const viabilityRule: ReminderRule = {
  kind: KIND,
  async collect({ db, now, userIds }) {
    const scope = cultureScope(KIND, userIds);
    const anchor = sql`(case when c.measured_at is not null and c.measured_viability is not null then c.measured_at else c.made_at end)`;
    const key = (stage: string) => sql`${pref.threshold}::text || ${`:${stage}:`} || ${epochKeySql(anchor)}`;
    const { rows } = await db.execute<Row>(sql`
      select c.id, c.owner_user_id as user_id, c.strain_name, c.form, c.location_label, c.storage_temp_c,
        ${anchor} as anchor_at,
        case when c.measured_at is not null and c.measured_viability is not null then c.measured_viability end as start_viability,
        (c.measured_at is not null and c.measured_viability is not null) as measured,
        u.time_zone, ${pref.threshold} as threshold_pct, ${pref.warnDays} as warn_days,
        ${noticeExists(KIND, key('warn'))} as warn_sent
      ${scope.from}
      where ${scope.where} and not ${noticeExists(KIND, key('due'))}`);

    const notices: NewNotice[] = [];
    for (const r of rows) {
      const anchorAt = asDate(r.anchor_at);
      const threshold = r.threshold_pct / 100;
      const crossing = viabilityCrossingAt({
        form: r.form,
        anchorAt,
        storageTempC: r.storage_temp_c,
        threshold,
        ...(r.start_viability != null ? { startViability: r.start_viability } : {}),
      });
      if (!crossing.at) continue;
      // far from the window: no need to work out local calendar days (they differ from elapsed days by under 2)
      if (crossing.at.getTime() - now.getTime() > (r.warn_days + 2) * DAY) continue;
      const daysLeft = calendarDaysUntil(crossing.at, now, r.time_zone);
      const stage = daysLeft <= 0 ? 'due' : daysLeft <= r.warn_days ? 'warn' : null;
      if (!stage || (stage === 'warn' && r.warn_sent)) continue;
      const what = cultureWords({ strainName: r.strain_name, form: r.form, locationLabel: r.location_label });
      const pct = `${r.threshold_pct}%`;
      const basis = r.measured ? 'your latest stain count' : 'the date it was made or harvested';
      let title: string;
      if (stage === 'warn' || crossing.at > now) {
        title = `${capitalize(what)} drops below ${pct} viable ${whenWords(crossing.at, now, r.time_zone)}`;
      } else if (crossing.alreadyBelow) {
        title = `${capitalize(what)} is below ${pct} viable`;
      } else {
        title = `${capitalize(what)} fell below ${pct} viable on ${dayWords(crossing.at, now, r.time_zone)}`;
      }
      const body =
        stage === 'warn'
          ? `Projected from ${basis} at ${r.storage_temp_c} °C. Use it, make a starter, re-culture it or let it go before then.`
          : `Projected from ${basis} at ${r.storage_temp_c} °C. Before pitching, grow it up in a starter (a count tells you where it really stands), re-culture it, or let it go.`;
      notices.push({
        userId: r.user_id,
        kind: KIND,
        subjectId: r.id,
        dedupeKey: `${r.threshold_pct}:${stage}:${epochKey(anchorAt)}`,
        title,
        body,
        link: `/cultures/${r.id}`,
        dueAt: crossing.at,
      });
    }
    return notices;
  },
};
