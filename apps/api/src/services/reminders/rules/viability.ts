import { sql } from 'drizzle-orm';
import type { CultureForm } from '@barmkeep/core';
import type { NewNotice } from '../../../db/queries/notifications';
import type { ReminderRule } from '../types';
import { asDate, capitalize, cultureWords, calendarDaysUntil, dayWords, epochKey, whenWords } from '../format';
import { anchorSql, cultureScope, epochKeySql, noticeExists, noticeStored, pref, warnHorizon } from '../sql';
import { refreshViabilityCrossings } from '../crossings';
import { clearViabilityPending, viabilityDueKey } from '../marks';

const KIND = 'culture.viability';

interface Row extends Record<string, unknown> {
  id: string;
  user_id: string;
  strain_name: string;
  form: CultureForm;
  location_label: string;
  storage_temp_c: number;
  anchor_at: Date | string;
  crossing_at: Date | string;
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
 *
 * Core's `viabilityCrossingAt` does the math, once per change rather than once per pass: the pass
 * first brings stale `cultures.viability_crossing_at` up to date (crossings.ts; a trigger marks a
 * row stale when an input or the owner's threshold changes), then one indexed range query on
 * `viability_check_at` (the crossing, while its "on the day" notice is not stored) returns the kept
 * cultures whose crossing is within the warning window or past. Once that notice is stored the
 * pass clears `viability_check_at` (marks.ts), and the culture is out of the index until a change.
 */
export const viabilityRule: ReminderRule = {
  kind: KIND,
  async collect({ db, now, userIds }) {
    await refreshViabilityCrossings(db, userIds);
    const scope = cultureScope(KIND, userIds);
    const key = (stage: string) => sql`${pref.threshold}::text || ${`:${stage}:`} || ${epochKeySql(anchorSql)}`;
    const horizon = await warnHorizon(db, now, userIds);
    const { rows } = await db.execute<Row>(sql`
      select c.id, c.owner_user_id as user_id, c.strain_name, c.form, c.location_label, c.storage_temp_c,
        ${anchorSql} as anchor_at, c.viability_crossing_at as crossing_at,
        (c.measured_at is not null and c.measured_viability is not null) as measured,
        u.time_zone, ${pref.threshold} as threshold_pct, ${pref.warnDays} as warn_days,
        ${noticeStored(KIND, key('warn'))} as warn_sent
      ${scope.from}
      where c.viability_check_at < ${horizon}::timestamptz
        and c.viability_check_at < ${now}::timestamptz + make_interval(days => ${pref.warnDays} + 2)
        and not c.viability_stale and ${scope.where}
        and not ${noticeExists(KIND, viabilityDueKey)}`);

    const notices: NewNotice[] = [];
    for (const r of rows) {
      const anchorAt = asDate(r.anchor_at);
      const crossingAt = asDate(r.crossing_at);
      // core puts the crossing at the anchor itself when the start is already at or below the threshold
      const alreadyBelow = crossingAt.getTime() === anchorAt.getTime();
      const daysLeft = calendarDaysUntil(crossingAt, now, r.time_zone);
      const stage = daysLeft <= 0 ? 'due' : daysLeft <= r.warn_days ? 'warn' : null;
      if (!stage || (stage === 'warn' && r.warn_sent)) continue;
      const what = cultureWords({ strainName: r.strain_name, form: r.form, locationLabel: r.location_label });
      const pct = `${r.threshold_pct}%`;
      const basis = r.measured ? 'your latest stain count' : 'the date it was made or harvested';
      let title: string;
      if (stage === 'warn' || crossingAt > now) {
        title = `${capitalize(what)} drops below ${pct} viable ${whenWords(crossingAt, now, r.time_zone)}`;
      } else if (alreadyBelow) {
        title = `${capitalize(what)} is below ${pct} viable`;
      } else {
        title = `${capitalize(what)} fell below ${pct} viable on ${dayWords(crossingAt, now, r.time_zone)}`;
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
        dueAt: crossingAt,
      });
    }
    return notices;
  },
  afterStore: ({ db, now, userIds }) => clearViabilityPending(db, now, userIds),
};
