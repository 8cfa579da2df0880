import { queryOptions } from '@tanstack/react-query';
import type { InvitationPreviewDto } from '@barmkeep/schemas';
import { api } from '../client';

export const invitationKeys = {
  all: ['invitations'] as const,
  preview: (token: string) => [...invitationKeys.all, 'preview', token] as const,
};

export const invitationQueries = {
  /** POST because the token travels in the body, not in a URL. */
  preview: (token: string) =>
    queryOptions({
      queryKey: invitationKeys.preview(token),
      queryFn: () =>
        api.post<{ invitation: InvitationPreviewDto }>('/invitations/lookup', { token }).then((r) => r.invitation),
      retry: false,
      staleTime: 60_000,
    }),
};
