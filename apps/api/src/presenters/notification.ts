import {
  REMINDER_DEFAULTS,
  type NotificationDto,
  type NotificationKind,
  type NotificationPreferencesDto,
} from '@barmkeep/schemas';
import type { NotificationPreferencesRow, NotificationRow } from '../db/schema';

export function presentNotification(n: NotificationRow): NotificationDto {
  return {
    id: n.id,
    kind: n.kind,
    subjectId: n.subjectId,
    title: n.title,
    body: n.body,
    link: n.link,
    dueAt: n.dueAt?.toISOString() ?? null,
    createdAt: n.createdAt.toISOString(),
    readAt: n.readAt?.toISOString() ?? null,
  };
}

export function presentPreferences(
  p: NotificationPreferencesRow | undefined,
  timeZone: string,
): NotificationPreferencesDto {
  return {
    emailDelivery: p?.emailDelivery ?? REMINDER_DEFAULTS.emailDelivery,
    digestHour: p?.digestHour ?? REMINDER_DEFAULTS.digestHour,
    viabilityThresholdPct: p?.viabilityThresholdPct ?? REMINDER_DEFAULTS.viabilityThresholdPct,
    warnDays: p?.warnDays ?? REMINDER_DEFAULTS.warnDays,
    generationLimit: p?.generationLimit ?? REMINDER_DEFAULTS.generationLimit,
    stepLeadHours: p?.stepLeadHours ?? REMINDER_DEFAULTS.stepLeadHours,
    mutedKinds: (p?.mutedKinds ?? []) as NotificationKind[],
    timeZone,
  };
}

/** "o•••@example.test": enough to recognise one's address on a page reached without signing in. */
export function emailHint(email: string): string {
  const [local = '', domain = ''] = email.split('@');
  return `${local.slice(0, 1)}•••@${domain}`;
}
