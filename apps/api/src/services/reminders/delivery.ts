import { sql } from 'drizzle-orm';
import type { Logger } from 'pino';
import type { Db } from '../../db/client';
import type { Mailer } from '../../mail/mailer';
import { ensurePreferences } from '../../db/queries/notifications';
import { digestMail, reminderMail, type MailNotice } from '../../mail/reminderTemplates';
import { asDate, dayWords } from './format';

export interface DeliveryDeps {
  db: Db;
  mailer: Mailer;
  appUrl: string;
  logger?: Pick<Logger, 'warn' | 'info'>;
}

/** A claim older than this is taken to be from a worker that died mid-send and may be taken again. */
const STALE_CLAIM_MS = 10 * 60_000;
const BATCH = 200;

interface ClaimedRow extends Record<string, unknown> {
  id: string;
  user_id: string;
  kind: string;
  title: string;
  body: string;
  link: string;
}

interface PersonRow extends Record<string, unknown> {
  id: string;
  email: string;
  name: string;
  time_zone: string;
}

export const preferencesUrl = (appUrl: string, token: string) =>
  `${appUrl}/email-preferences/${encodeURIComponent(token)}`;
export const unsubscribeUrl = (appUrl: string, token: string) =>
  `${appUrl}/api/email-preferences/${encodeURIComponent(token)}/unsubscribe`;

async function recipients(db: Db, appUrl: string, userIds: string[]) {
  const prefs = await ensurePreferences(db, userIds);
  const tokens = new Map(prefs.map((p) => [p.userId, p.emailToken]));
  const { rows } = await db.execute<PersonRow>(
    sql`select id, email, name, time_zone from users where id = any(${sql.param([...new Set(userIds)])}::text[])`,
  );
  return new Map(
    rows.map((u) => {
      const token = tokens.get(u.id)!;
      return [
        u.id,
        {
          to: u.email,
          name: u.name,
          timeZone: u.time_zone,
          preferencesUrl: preferencesUrl(appUrl, token),
          unsubscribeUrl: unsubscribeUrl(appUrl, token),
        },
      ];
    }),
  );
}

const toMailNotice = (appUrl: string, n: ClaimedRow): MailNotice => ({
  kind: n.kind,
  title: n.title,
  body: n.body,
  url: `${appUrl}${n.link}`,
});

/**
 * Notices that should not be e-mailed after all: the person chose no e-mail, or the culture is no
 * longer kept (pitched, used up, discarded since the notice fired).
 */
async function skipUnwanted(db: Db, now: Date) {
  await db.execute(sql`
    update notifications n set email_state = 'skipped', emailed_at = ${now}
    from notification_preferences p
    where p.user_id = n.user_id and n.email_state = 'pending' and p.email_delivery = 'none'`);
  await db.execute(sql`
    update notifications n set email_state = 'skipped', emailed_at = ${now}
    from cultures c
    where n.email_state = 'pending' and n.kind like 'culture.%' and c.id = n.subject_id
      and c.state not in ('active', 'stored', 'quarantined')`);
}

/**
 * E-mails each pending notice of people who want one e-mail per notice. Rows are claimed with
 * UPDATE … FOR UPDATE SKIP LOCKED, so two workers never take the same notice.
 */
export async function sendEachNotices(deps: DeliveryDeps, now: Date): Promise<number> {
  const { db, mailer, appUrl } = deps;
  await skipUnwanted(db, now);
  let sent = 0;
  for (;;) {
    const { rows } = await db.execute<ClaimedRow>(sql`
      with picked as (
        select n.id from notifications n
        left join notification_preferences p on p.user_id = n.user_id
        where n.email_state = 'pending' and n.digest_id is null
          and coalesce(p.email_delivery, 'each') = 'each'
          and (n.email_claimed_at is null or n.email_claimed_at < ${new Date(now.getTime() - STALE_CLAIM_MS)}::timestamptz)
          and n.created_at <= ${now}::timestamptz
        order by n.created_at, n.id
        limit ${BATCH}
        for update of n skip locked
      )
      update notifications n set email_claimed_at = ${now}::timestamptz
      from picked where n.id = picked.id
      returning n.id, n.user_id, n.kind, n.title, n.body, n.link`);
    if (rows.length === 0) break;
    const people = await recipients(
      db,
      appUrl,
      rows.map((r) => r.user_id),
    );
    for (const n of rows) {
      const r = people.get(n.user_id);
      if (!r) continue;
      try {
        await mailer.send(reminderMail(r, toMailNotice(appUrl, n)));
        await db.execute(
          sql`update notifications set email_state = 'sent', emailed_at = ${now}::timestamptz where id = ${n.id}`,
        );
        sent += 1;
      } catch (err) {
        deps.logger?.warn({ err, notificationId: n.id }, 'reminder e-mail failed; it will be retried');
      }
    }
    if (rows.length < BATCH) break;
  }
  return sent;
}

interface DigestRow extends Record<string, unknown> {
  id: string;
  user_id: string;
}

/**
 * One digest per person per local day, at or after their digest hour in their time zone, with
 * every notice still waiting. The (person, local date) unique index decides which worker sends it.
 */
export async function sendDigests(deps: DeliveryDeps, now: Date): Promise<number> {
  const { db, mailer, appUrl } = deps;
  await skipUnwanted(db, now);
  const { rows: digests } = await db.execute<DigestRow>(sql`
    insert into notification_digests (id, user_id, local_date, created_at)
    select gen_random_uuid()::text, u.id, (${now}::timestamptz at time zone u.time_zone)::date, ${now}::timestamptz
    from users u join notification_preferences p on p.user_id = u.id
    where p.email_delivery = 'digest'
      and extract(hour from (${now}::timestamptz at time zone u.time_zone)) >= p.digest_hour
      and exists (select 1 from notifications n where n.user_id = u.id and n.email_state = 'pending'
                  and n.digest_id is null and n.created_at <= ${now}::timestamptz)
    on conflict (user_id, local_date) do nothing
    returning id, user_id`);
  if (digests.length === 0) return 0;
  const people = await recipients(
    db,
    appUrl,
    digests.map((d) => d.user_id),
  );
  let sent = 0;
  for (const d of digests) {
    const { rows: notices } = await db.execute<ClaimedRow & { due_at: Date | string | null }>(sql`
      update notifications set digest_id = ${d.id}, email_claimed_at = ${now}::timestamptz
      where user_id = ${d.user_id} and email_state = 'pending' and digest_id is null and created_at <= ${now}::timestamptz
      returning id, user_id, kind, title, body, link, due_at, created_at`);
    const r = people.get(d.user_id);
    if (!r || notices.length === 0) continue;
    notices.sort(
      (a, b) => (a.due_at ? asDate(a.due_at).getTime() : Infinity) - (b.due_at ? asDate(b.due_at).getTime() : Infinity),
    );
    try {
      await mailer.send(
        digestMail(
          r,
          dayWords(now, now, r.timeZone),
          notices.map((n) => toMailNotice(appUrl, n)),
          appUrl,
        ),
      );
      await db.execute(
        sql`update notifications set email_state = 'sent', emailed_at = ${now}::timestamptz where digest_id = ${d.id}`,
      );
      await db.execute(sql`update notification_digests set sent_at = ${now}::timestamptz where id = ${d.id}`);
      sent += 1;
    } catch (err) {
      // Put them back for the next digest.
      await db.execute(
        sql`update notifications set digest_id = null, email_claimed_at = null where digest_id = ${d.id}`,
      );
      await db.execute(sql`delete from notification_digests where id = ${d.id}`);
      deps.logger?.warn({ err, digestId: d.id }, 'digest e-mail failed; it will be retried');
    }
  }
  return sent;
}
