import { eq } from 'drizzle-orm';
import type { EmailPreferencesDto, NotificationListDto, NotificationPreferencesDto } from '@barmkeep/schemas';
import type { ServiceContext } from './context';
import type { Actor } from './cultureAccess';
import {
  countUnreadNotices,
  findNoticeForUser,
  findPreferences,
  findPreferencesByToken,
  listNoticesForUser,
  markNoticesRead,
  updatePreferences,
  type PreferencesPatch,
} from '../db/queries/notifications';
import { users } from '../db/schema';
import { notFound } from '../lib/errors';
import { emailHint, presentNotification, presentPreferences } from '../presenters/notification';

/** A person only ever sees and changes their own notices: every query is keyed by their id. */
export async function listNotifications(
  ctx: ServiceContext,
  actor: Actor,
  q: { unread: boolean; before?: string; limit: number },
): Promise<NotificationListDto> {
  const rows = await listNoticesForUser(ctx.db, {
    userId: actor.id,
    unreadOnly: q.unread,
    limit: q.limit,
    ...(q.before ? { before: new Date(q.before) } : {}),
  });
  return { notifications: rows.map(presentNotification), unreadCount: await countUnreadNotices(ctx.db, actor.id) };
}

export async function unreadCount(ctx: ServiceContext, actor: Actor) {
  return { unreadCount: await countUnreadNotices(ctx.db, actor.id) };
}

export async function markRead(ctx: ServiceContext, actor: Actor, id: string) {
  const n = await findNoticeForUser(ctx.db, actor.id, id);
  if (!n) throw notFound('This notice');
  await markNoticesRead(ctx.db, { userId: actor.id, ids: [id], now: ctx.now() });
  return unreadCount(ctx, actor);
}

export async function markAllRead(ctx: ServiceContext, actor: Actor) {
  await markNoticesRead(ctx.db, { userId: actor.id, now: ctx.now() });
  return unreadCount(ctx, actor);
}

async function timeZoneOf(ctx: ServiceContext, userId: string): Promise<string> {
  const [u] = await ctx.db.select({ timeZone: users.timeZone }).from(users).where(eq(users.id, userId)).limit(1);
  return u?.timeZone ?? 'UTC';
}

export async function getReminderPreferences(ctx: ServiceContext, actor: Actor): Promise<NotificationPreferencesDto> {
  return presentPreferences(await findPreferences(ctx.db, actor.id), await timeZoneOf(ctx, actor.id));
}

export async function updateReminderPreferences(
  ctx: ServiceContext,
  actor: Actor,
  patch: PreferencesPatch,
): Promise<NotificationPreferencesDto> {
  const row = await updatePreferences(ctx.db, actor.id, patch, ctx.now());
  return presentPreferences(row, await timeZoneOf(ctx, actor.id));
}

/** The secret link in every reminder e-mail: it alone authorizes reading and changing e-mail delivery. */
async function byToken(ctx: ServiceContext, token: string) {
  const prefs = await findPreferencesByToken(ctx.db, token);
  if (!prefs) throw notFound('This preferences link');
  const [u] = await ctx.db.select({ email: users.email }).from(users).where(eq(users.id, prefs.userId)).limit(1);
  if (!u) throw notFound('This preferences link');
  return { prefs, email: u.email };
}

export async function getEmailPreferences(ctx: ServiceContext, token: string): Promise<EmailPreferencesDto> {
  const { prefs, email } = await byToken(ctx, token);
  return { emailHint: emailHint(email), emailDelivery: prefs.emailDelivery };
}

export async function setEmailDelivery(
  ctx: ServiceContext,
  token: string,
  emailDelivery: EmailPreferencesDto['emailDelivery'],
): Promise<EmailPreferencesDto> {
  const { prefs, email } = await byToken(ctx, token);
  const row = await updatePreferences(ctx.db, prefs.userId, { emailDelivery }, ctx.now());
  return { emailHint: emailHint(email), emailDelivery: row.emailDelivery };
}
