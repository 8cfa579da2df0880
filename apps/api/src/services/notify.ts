import { REMINDER_DEFAULTS } from '@barmkeep/schemas';
import type { ServiceContext } from './context';
import { findPreferences, insertNotices } from '../db/queries/notifications';
import type { NotificationRow } from '../db/schema';

export interface NotifyInput {
  userId: string;
  /** e.g. 'club.request'; see NOTIFICATION_KINDS in @barmkeep/schemas */
  kind: string;
  /** what it is about: a request id, a culture id */
  subjectId: string;
  /** what makes this notice distinct for the subject, e.g. 'waiting' or 'reminder-2'; the same key never notifies twice */
  dedupeKey: string;
  title: string;
  body?: string;
  /** a path inside the app, e.g. /clubs/abc/requests/xyz */
  link: string;
  dueAt?: Date | null;
}

/**
 * Tell one person something, once. Any feature may call it: the notice appears in their list at
 * once, and the reminders worker e-mails it (each notice, or in the daily digest) as they chose.
 * Returns the new notice, or null when the same (person, kind, subject, dedupe key) exists already or
 * the person muted this kind.
 */
export async function notify(
  // a transaction works too, so a notice is written with the change it tells about
  ctx: { db: Parameters<typeof insertNotices>[0] } & Pick<ServiceContext, 'now'>,
  input: NotifyInput,
): Promise<NotificationRow | null> {
  const prefs = await findPreferences(ctx.db, input.userId);
  const muted: readonly string[] = prefs?.mutedKinds ?? REMINDER_DEFAULTS.mutedKinds;
  if (muted.includes(input.kind)) return null;
  const [row] = await insertNotices(
    ctx.db,
    [
      {
        userId: input.userId,
        kind: input.kind,
        subjectId: input.subjectId,
        dedupeKey: input.dedupeKey,
        title: input.title,
        body: input.body ?? '',
        link: input.link,
        dueAt: input.dueAt ?? null,
      },
    ],
    ctx.now(),
  );
  return row ?? null;
}
