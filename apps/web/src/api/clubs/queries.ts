import { queryOptions } from '@tanstack/react-query';
import type { ClubDto, ClubInvitationDto, ClubMemberDto } from '@barmkeep/schemas';
import { api } from '../client';

export const clubKeys = {
  all: ['clubs'] as const,
  lists: () => [...clubKeys.all, 'list'] as const,
  list: () => [...clubKeys.lists(), 'mine'] as const,
  details: () => [...clubKeys.all, 'detail'] as const,
  detail: (clubId: string) => [...clubKeys.details(), clubId] as const,
  members: (clubId: string) => [...clubKeys.detail(clubId), 'members'] as const,
  invitations: (clubId: string) => [...clubKeys.detail(clubId), 'invitations'] as const,
};

export const clubQueries = {
  list: () =>
    queryOptions({
      queryKey: clubKeys.list(),
      queryFn: ({ signal }) => api.get<{ clubs: ClubDto[] }>('/clubs', signal).then((r) => r.clubs),
    }),
  detail: (clubId: string) =>
    queryOptions({
      queryKey: clubKeys.detail(clubId),
      queryFn: ({ signal }) =>
        api.get<{ club: ClubDto }>(`/clubs/${encodeURIComponent(clubId)}`, signal).then((r) => r.club),
    }),
  members: (clubId: string) =>
    queryOptions({
      queryKey: clubKeys.members(clubId),
      queryFn: ({ signal }) =>
        api
          .get<{ members: ClubMemberDto[] }>(`/clubs/${encodeURIComponent(clubId)}/members`, signal)
          .then((r) => r.members),
    }),
  invitations: (clubId: string) =>
    queryOptions({
      queryKey: clubKeys.invitations(clubId),
      queryFn: ({ signal }) =>
        api
          .get<{ invitations: ClubInvitationDto[] }>(`/clubs/${encodeURIComponent(clubId)}/invitations`, signal)
          .then((r) => r.invitations),
    }),
};
