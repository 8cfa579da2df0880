import { sql } from 'drizzle-orm';
import { REMINDER_DEFAULTS } from '@barmkeep/schemas';
import type { NewNotice } from '../../../db/queries/notifications';
import type { ReminderRule } from '../types';
import { listPlannedEvents } from '../plannedEvents';
import { epochKey, whenWithTime } from '../format';

const KIND = 'plan.step';
const MAX_LEAD_HOURS = 168;

interface PrefRow extends Record<string, unknown> {
  user_id: string;
  step_lead_hours: number;
  muted: boolean;
}

/**
 * Planned starter steps, the cold crash and brew day: a notice `stepLeadHours` before each
 * (default 12), in the person's time zone ("step 2 starts tonight at 20:00").
 */
export const planStepRule: ReminderRule = {
  kind: KIND,
  async collect({ db, now, userIds }) {
    const events = await listPlannedEvents(db, {
      ...(userIds ? { userIds } : {}),
      from: now,
      now,
      to: new Date(now.getTime() + MAX_LEAD_HOURS * 3_600_000),
    });
    if (events.length === 0) return [];
    const people = [...new Set(events.map((e) => e.userId))];
    const { rows } = await db.execute<PrefRow>(sql`
      select u.id as user_id, coalesce(p.step_lead_hours, ${REMINDER_DEFAULTS.stepLeadHours}) as step_lead_hours,
        coalesce(p.muted_kinds, '{}'::text[]) @> array[${KIND}]::text[] as muted
      from users u left join notification_preferences p on p.user_id = u.id
      where u.id = any(${sql.param(people)}::text[])`);
    const prefs = new Map(rows.map((r) => [r.user_id, r]));
    const notices: NewNotice[] = [];
    for (const e of events) {
      const p = prefs.get(e.userId);
      if (!p || p.muted) continue;
      if (e.at.getTime() - now.getTime() > p.step_lead_hours * 3_600_000) continue;
      const when = whenWithTime(e.at, now, e.timeZone);
      const title =
        e.kind === 'brew'
          ? `Brew day for ${e.planName} is ${when}`
          : e.kind === 'crash'
            ? `Chill the starter for ${e.planName} ${when}, so it can be decanted before brewing`
            : `${e.title} ${when}`;
      notices.push({
        userId: e.userId,
        kind: KIND,
        subjectId: e.planId,
        dedupeKey: `${e.key}:${epochKey(e.at)}`,
        title,
        body:
          e.kind === 'brew'
            ? 'Have the pitch ready: decant the spent starter wort and let the yeast warm towards pitching temperature.'
            : 'Hot wort and glass: let a boiled starter cool covered before handling, and never seal a fermenting vessel airtight.',
        link: `/plans/${e.planId}`,
        dueAt: e.at,
      });
    }
    return notices;
  },
};
