import { queryOptions } from '@tanstack/react-query';
import type {
  CalendarFeedDto,
  EmailPreferencesDto,
  NotificationListDto,
  NotificationPreferencesDto,
} from '@barmkeep/schemas';
import { api } from '../client';

export const notificationKeys = {
  all: ['notifications'] as const,
  lists: () => [...notificationKeys.all, 'list'] as const,
  list: (filters: { unread: boolean }) => [...notificationKeys.lists(), filters] as const,
  unreadCount: () => [...notificationKeys.all, 'unread-count'] as const,
};

export const reminderKeys = {
  all: ['reminders'] as const,
  preferences: () => [...reminderKeys.all, 'preferences'] as const,
  calendarFeed: () => [...reminderKeys.all, 'calendar-feed'] as const,
  emailPreferences: (token: string) => [...reminderKeys.all, 'email-preferences', token] as const,
};

export const notificationQueries = {
  list: (filters: { unread: boolean }) =>
    queryOptions({
      queryKey: notificationKeys.list(filters),
      queryFn: ({ signal }) =>
        api.get<NotificationListDto>(`/notifications?limit=50${filters.unread ? '&unread=true' : ''}`, signal),
    }),
  /** Polled for the header badge; cheap on the server (a partial index on unread rows). */
  unreadCount: () =>
    queryOptions({
      queryKey: notificationKeys.unreadCount(),
      queryFn: ({ signal }) =>
        api.get<{ unreadCount: number }>('/notifications/unread-count', signal).then((r) => r.unreadCount),
      refetchInterval: 60_000,
    }),
};

export const reminderQueries = {
  preferences: () =>
    queryOptions({
      queryKey: reminderKeys.preferences(),
      queryFn: ({ signal }) =>
        api
          .get<{ preferences: NotificationPreferencesDto }>('/reminder-preferences', signal)
          .then((r) => r.preferences),
    }),
  calendarFeed: () =>
    queryOptions({
      queryKey: reminderKeys.calendarFeed(),
      queryFn: ({ signal }) => api.get<{ feed: CalendarFeedDto }>('/calendar-feed', signal).then((r) => r.feed),
    }),
  emailPreferences: (token: string) =>
    queryOptions({
      queryKey: reminderKeys.emailPreferences(token),
      queryFn: ({ signal }) =>
        api
          .get<{ preferences: EmailPreferencesDto }>(`/email-preferences/${encodeURIComponent(token)}`, signal)
          .then((r) => r.preferences),
      retry: false,
    }),
};
