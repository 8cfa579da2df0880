import { useMutation, useQueryClient } from '@tanstack/react-query';
import type {
  CalendarFeedDto,
  EmailDelivery,
  EmailPreferencesDto,
  NotificationPreferencesDto,
  NotificationPreferencesUpdateInput,
} from '@barmkeep/schemas';
import { api } from '../client';
import { notificationKeys, reminderKeys } from './queries';

export function useMarkReadMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (id: string) => api.post<{ unreadCount: number }>(`/notifications/${encodeURIComponent(id)}/read`),
    onSuccess: async ({ unreadCount }) => {
      queryClient.setQueryData(notificationKeys.unreadCount(), unreadCount);
      await queryClient.invalidateQueries({ queryKey: notificationKeys.lists() });
    },
  });
}

export function useMarkAllReadMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => api.post<{ unreadCount: number }>('/notifications/read-all'),
    onSuccess: async ({ unreadCount }) => {
      queryClient.setQueryData(notificationKeys.unreadCount(), unreadCount);
      await queryClient.invalidateQueries({ queryKey: notificationKeys.lists() });
    },
  });
}

export function useUpdateReminderPreferencesMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: NotificationPreferencesUpdateInput) =>
      api.patch<{ preferences: NotificationPreferencesDto }>('/reminder-preferences', input).then((r) => r.preferences),
    onSuccess: (prefs) => queryClient.setQueryData(reminderKeys.preferences(), prefs),
  });
}

export function useCreateCalendarFeedMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => api.post<{ feed: CalendarFeedDto }>('/calendar-feed').then((r) => r.feed),
    onSuccess: (feed) => queryClient.setQueryData(reminderKeys.calendarFeed(), { ...feed, url: undefined }),
  });
}

export function useRevokeCalendarFeedMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => api.delete<{ feed: CalendarFeedDto }>('/calendar-feed').then((r) => r.feed),
    onSuccess: (feed) => queryClient.setQueryData(reminderKeys.calendarFeed(), feed),
  });
}

export function useSetEmailDeliveryMutation(token: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (emailDelivery: EmailDelivery) =>
      api
        .patch<{ preferences: EmailPreferencesDto }>(`/email-preferences/${encodeURIComponent(token)}`, {
          emailDelivery,
        })
        .then((r) => r.preferences),
    onSuccess: (prefs) => queryClient.setQueryData(reminderKeys.emailPreferences(token), prefs),
  });
}
