import { sql } from 'drizzle-orm';
import { createEvents, type EventAttributes } from 'ics';
import { maxStorageDays, viabilityCrossingAt, type CultureForm } from '@barmkeep/core';
import { REMINDER_DEFAULTS, type CalendarFeedDto } from '@barmkeep/schemas';
import type { ServiceContext } from './context';
import type { Actor } from './cultureAccess';
import {
  findLiveFeed,
  findLiveFeedByHash,
  insertFeed,
  lockFeedOwner,
  revokeFeeds,
  touchFeed,
} from '../db/queries/calendarFeeds';
import { newId, newSecretToken, sha256 } from '../lib/ids';
import { notFound } from '../lib/errors';
import { listPlannedEvents } from './reminders/plannedEvents';
import { asDate, cultureWords, localDate, capitalize } from './reminders/format';

const DAY = 86_400_000;

const present = (row: { createdAt: Date; lastUsedAt: Date | null } | undefined, url?: string): CalendarFeedDto => ({
  active: Boolean(row),
  createdAt: row?.createdAt.toISOString() ?? null,
  lastUsedAt: row?.lastUsedAt?.toISOString() ?? null,
  ...(url ? { url } : {}),
});

const feedUrl = (ctx: ServiceContext, token: string) => `${ctx.appUrl}/api/calendar/${token}.ics`;

export async function getCalendarFeed(ctx: ServiceContext, actor: Actor): Promise<CalendarFeedDto> {
  return present(await findLiveFeed(ctx.db, actor.id));
}

/** A new secret address; any older one stops working. The address is only ever shown in this reply. */
export async function createCalendarFeed(ctx: ServiceContext, actor: Actor): Promise<CalendarFeedDto> {
  const token = newSecretToken();
  const now = ctx.now();
  const row = await ctx.db.transaction(async (tx) => {
    // Without the lock two requests both find nothing live to revoke, both insert, and the second
    // fails the one-live-feed index. Under it the second waits, then revokes the first's address.
    await lockFeedOwner(tx, actor.id);
    await revokeFeeds(tx, actor.id, now);
    return insertFeed(tx, { id: newId(), userId: actor.id, tokenHash: sha256(token), createdAt: now });
  });
  return present(row, feedUrl(ctx, token));
}

export async function revokeCalendarFeed(ctx: ServiceContext, actor: Actor): Promise<CalendarFeedDto> {
  await revokeFeeds(ctx.db, actor.id, ctx.now());
  return present(undefined);
}

interface CultureDateRow extends Record<string, unknown> {
  id: string;
  strain_name: string;
  form: CultureForm;
  location_label: string;
  storage_temp_c: number;
  attention_due_at: Date | string | null;
  anchor_at: Date | string;
  start_viability: number | null;
}

const dateArray = (ymd: string): [number, number, number] => {
  const [y, m, d] = ymd.split('-').map(Number);
  return [y!, m!, d!];
};

/**
 * The feed for the secret token: "re-culture by" dates (core's storage limit), the day viability
 * crosses the person's threshold, brew days, cold crashes and planned steps. All-day events use the
 * person's local date; timed ones are written in UTC so every calendar shows them in its own zone.
 */
export async function renderCalendarFeed(ctx: ServiceContext, token: string): Promise<string> {
  const feed = await findLiveFeedByHash(ctx.db, sha256(token));
  if (!feed) throw notFound('This calendar');
  const now = ctx.now();
  await touchFeed(ctx.db, feed.id, now);
  const { rows: people } = await ctx.db.execute<{ time_zone: string; threshold: number }>(sql`
    select u.time_zone, coalesce(p.viability_threshold_pct, ${REMINDER_DEFAULTS.viabilityThresholdPct}) as threshold
    from users u left join notification_preferences p on p.user_id = u.id where u.id = ${feed.userId}`);
  const person = people[0];
  if (!person) throw notFound('This calendar');
  const tz = person.time_zone;
  const { rows: cultures } = await ctx.db.execute<CultureDateRow>(sql`
    select c.id, c.strain_name, c.form, c.location_label, c.storage_temp_c, c.attention_due_at,
      case when c.measured_at is not null and c.measured_viability is not null then c.measured_at else c.made_at end as anchor_at,
      case when c.measured_at is not null and c.measured_viability is not null then c.measured_viability end as start_viability
    from cultures c where c.owner_user_id = ${feed.userId} and c.state in ('active', 'stored')`);

  const events: EventAttributes[] = [];
  const stamp = now.getTime();
  for (const c of cultures) {
    const what = capitalize(cultureWords({ strainName: c.strain_name, form: c.form, locationLabel: c.location_label }));
    const url = `${ctx.appUrl}/cultures/${c.id}`;
    if (c.attention_due_at) {
      const limit = maxStorageDays(c.form, c.storage_temp_c);
      const verb =
        limit.action === 'discard'
          ? 'Use or discard by'
          : limit.action === 'starter'
            ? 'Use or make a starter by'
            : 'Re-culture by';
      events.push({
        uid: `storage-${c.id}@barmkeep`,
        start: dateArray(localDate(asDate(c.attention_due_at), tz)),
        duration: { days: 1 },
        title: `${verb}: ${what}`,
        description: `About ${limit.days} days is the usual storage limit for this form at ${c.storage_temp_c} °C. ${url}`,
        url,
        transp: 'TRANSPARENT',
        busyStatus: 'FREE',
        lastModified: stamp,
      });
    }
    const crossing = viabilityCrossingAt({
      form: c.form,
      anchorAt: asDate(c.anchor_at),
      storageTempC: c.storage_temp_c,
      threshold: person.threshold / 100,
      ...(c.start_viability != null ? { startViability: c.start_viability } : {}),
    });
    if (crossing.at && !crossing.alreadyBelow && crossing.at.getTime() > now.getTime() - 30 * DAY) {
      events.push({
        uid: `viability-${c.id}@barmkeep`,
        start: dateArray(localDate(crossing.at, tz)),
        duration: { days: 1 },
        title: `Below ${person.threshold}% viable: ${what}`,
        description: `Projected viability falls below ${person.threshold}% on this day. ${url}`,
        url,
        transp: 'TRANSPARENT',
        busyStatus: 'FREE',
        lastModified: stamp,
      });
    }
  }
  const planned = await listPlannedEvents(ctx.db, {
    userIds: [feed.userId],
    from: new Date(stamp - 30 * DAY),
    to: new Date(stamp + 365 * DAY),
    now,
  });
  for (const e of planned) {
    events.push({
      uid: `plan-${e.planId}-${e.key}@barmkeep`,
      start: e.at.getTime(),
      startInputType: 'utc',
      startOutputType: 'utc',
      duration: { hours: 1 },
      title: e.title,
      url: `${ctx.appUrl}/plans/${e.planId}`,
      lastModified: stamp,
    });
  }
  const header = { productId: 'barmkeep/reminders', calName: 'Barmkeep' };
  if (events.length === 0) {
    // ics refuses an empty list; an empty VCALENDAR is still a valid feed
    return [
      'BEGIN:VCALENDAR',
      'VERSION:2.0',
      'CALSCALE:GREGORIAN',
      `PRODID:${header.productId}`,
      'METHOD:PUBLISH',
      `X-WR-CALNAME:${header.calName}`,
      'END:VCALENDAR',
      '',
    ].join('\r\n');
  }
  const { error, value } = createEvents(events, header);
  if (error || !value) throw error ?? new Error('calendar could not be written');
  return value;
}
