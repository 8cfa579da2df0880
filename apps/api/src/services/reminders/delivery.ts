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

type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];

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

async function recipients(db: Db | Tx, appUrl: string, userIds: string[]) {
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
 * E-mails each pending notice of people who want one e-mail per notice. Each notice is taken in a
 * transaction of its own with FOR UPDATE SKIP LOCKED and stays locked while it is sent: another
 * worker skips it, and a worker that dies mid-send (SIGKILL, lost host) loses its connection, so
 * PostgreSQL rolls the claim back and the next pass sends the notice. Only a death between the
 * provider accepting the message and the commit a few milliseconds later can send one twice.
 */
export async function sendEachNotices(deps: DeliveryDeps, now: Date): Promise<number> {
  const { db, mailer, appUrl } = deps;
  await skipUnwanted(db, now);
  let sent = 0;
  const failed: string[] = [];
  for (;;) {
    const outcome = await db.transaction(async (tx) => {
      const { rows } = await tx.execute<ClaimedRow>(sql`
        select n.id, n.user_id, n.kind, n.title, n.body, n.link from notifications n
        left join notification_preferences p on p.user_id = n.user_id
        where n.email_state = 'pending' and n.digest_id is null
          and coalesce(p.email_delivery, 'each') = 'each'
          and n.created_at <= ${now}::timestamptz
          ${failed.length ? sql`and n.id <> all(${sql.param(failed)}::text[])` : sql``}
        order by n.created_at, n.id
        limit 1
        for update of n skip locked`);
      const n = rows[0];
      if (!n) return 'done' as const;
      const r = (await recipients(tx, appUrl, [n.user_id])).get(n.user_id);
      if (!r) {
        failed.push(n.id);
        return 'skipped' as const;
      }
      try {
        await mailer.send(reminderMail(r, toMailNotice(appUrl, n)));
      } catch (err) {
        deps.logger?.warn({ err, notificationId: n.id }, 'reminder e-mail failed; it will be retried');
        failed.push(n.id);
        return 'failed' as const;
      }
      await tx.execute(
        sql`update notifications set email_state = 'sent', email_claimed_at = ${now}::timestamptz, emailed_at = ${now}::timestamptz where id = ${n.id}`,
      );
      return 'sent' as const;
    });
    if (outcome === 'done') break;
    if (outcome === 'sent') sent += 1;
  }
  return sent;
}

interface DigestRow extends Record<string, unknown> {
  id: string;
  user_id: string;
}

class NothingToSend extends Error {}

/**
 * One digest per person per local day, at or after their digest hour in their time zone, with
 * every notice still waiting. The (person, local date) unique index decides which worker sends it.
 * Each digest is one transaction: the digest row, the notices it takes and their 'sent' mark
 * commit together after the provider accepted the e-mail; a worker dying mid-send rolls it all
 * back, so the next pass sends the digest instead of leaving its notices tied to a dead one.
 */
export async function sendDigests(deps: DeliveryDeps, now: Date): Promise<number> {
  const { db, mailer, appUrl } = deps;
  await skipUnwanted(db, now);
  const { rows: due } = await db.execute<{ user_id: string }>(sql`
    select u.id as user_id
    from users u join notification_preferences p on p.user_id = u.id
    where p.email_delivery = 'digest'
      and extract(hour from (${now}::timestamptz at time zone u.time_zone)) >= p.digest_hour
      and not exists (select 1 from notification_digests d where d.user_id = u.id
                      and d.local_date = (${now}::timestamptz at time zone u.time_zone)::date)
      and exists (select 1 from notifications n where n.user_id = u.id and n.email_state = 'pending'
                  and n.digest_id is null and n.created_at <= ${now}::timestamptz)`);
  let sent = 0;
  for (const { user_id: userId } of due) {
    try {
      const done = await db.transaction(async (tx) => {
        const { rows: digests } = await tx.execute<DigestRow>(sql`
          insert into notification_digests (id, user_id, local_date, created_at)
          select gen_random_uuid()::text, u.id, (${now}::timestamptz at time zone u.time_zone)::date, ${now}::timestamptz
          from users u where u.id = ${userId}
          on conflict (user_id, local_date) do nothing
          returning id, user_id`);
        const d = digests[0];
        if (!d) return false; // another worker sent (or is sending) today's digest
        const { rows: notices } = await tx.execute<ClaimedRow & { due_at: Date | string | null }>(sql`
          update notifications set digest_id = ${d.id}, email_claimed_at = ${now}::timestamptz
          where user_id = ${userId} and email_state = 'pending' and digest_id is null and created_at <= ${now}::timestamptz
          returning id, user_id, kind, title, body, link, due_at, created_at`);
        const r = (await recipients(tx, appUrl, [userId])).get(userId);
        if (!r || notices.length === 0) throw new NothingToSend();
        notices.sort(
          (a, b) =>
            (a.due_at ? asDate(a.due_at).getTime() : Infinity) - (b.due_at ? asDate(b.due_at).getTime() : Infinity),
        );
        await mailer.send(
          digestMail(
            r,
            dayWords(now, now, r.timeZone),
            notices.map((n) => toMailNotice(appUrl, n)),
            appUrl,
          ),
        );
        await tx.execute(
          sql`update notifications set email_state = 'sent', emailed_at = ${now}::timestamptz where digest_id = ${d.id}`,
        );
        await tx.execute(sql`update notification_digests set sent_at = ${now}::timestamptz where id = ${d.id}`);
        return true;
      });
      if (done) sent += 1;
    } catch (err) {
      // rolled back: the notices wait for the next pass
      if (!(err instanceof NothingToSend))
        deps.logger?.warn({ err, userId }, 'digest e-mail failed; it will be retried');
    }
  }
  return sent;
}
