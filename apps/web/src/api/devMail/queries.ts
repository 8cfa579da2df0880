import { queryOptions } from '@tanstack/react-query';
import { api } from '../client';

/** A message caught by the local fake SMTP server (development and tests only). */
export interface DevMailMessage {
  id: string;
  /** One address or several. */
  to: string | string[];
  from: string;
  subject: string;
  text: string;
  html: string;
  receivedAt: string;
}

export function recipients(message: Pick<DevMailMessage, 'to'>): string {
  return Array.isArray(message.to) ? message.to.join(', ') : message.to;
}

export const devMailKeys = {
  all: ['devMail'] as const,
  lists: () => [...devMailKeys.all, 'list'] as const,
  details: () => [...devMailKeys.all, 'detail'] as const,
  detail: (id: string) => [...devMailKeys.details(), id] as const,
};

export const devMailQueries = {
  list: () =>
    queryOptions({
      queryKey: devMailKeys.lists(),
      queryFn: async ({ signal }) => (await api.get<{ messages: DevMailMessage[] }>('/dev/mail', signal)).messages,
      retry: false,
    }),
  detail: (id: string) =>
    queryOptions({
      queryKey: devMailKeys.detail(id),
      queryFn: async ({ signal }) =>
        (await api.get<{ message: DevMailMessage }>(`/dev/mail/${encodeURIComponent(id)}`, signal)).message,
      retry: false,
    }),
};
