import { infiniteQueryOptions, queryOptions } from '@tanstack/react-query';
import type {
  ClubActivityDto,
  ClubDto,
  ClubInvitationDto,
  ClubListingDto,
  ClubMemberDto,
  ClubStockDto,
  StrainRequestDto,
} from '@barmkeep/schemas';
import { api } from '../client';

export const clubKeys = {
  all: ['clubs'] as const,
  lists: () => [...clubKeys.all, 'list'] as const,
  list: () => [...clubKeys.lists(), 'mine'] as const,
  details: () => [...clubKeys.all, 'detail'] as const,
  detail: (clubId: string) => [...clubKeys.details(), clubId] as const,
  members: (clubId: string) => [...clubKeys.detail(clubId), 'members'] as const,
  invitations: (clubId: string) => [...clubKeys.detail(clubId), 'invitations'] as const,
  bank: (clubId: string) => [...clubKeys.detail(clubId), 'bank'] as const,
  stock: (clubId: string) => [...clubKeys.detail(clubId), 'stock'] as const,
  requests: (clubId: string) => [...clubKeys.detail(clubId), 'requests'] as const,
  activity: (clubId: string) => [...clubKeys.detail(clubId), 'activity'] as const,
};

const clubPath = (clubId: string) => `/clubs/${encodeURIComponent(clubId)}`;
export const ACTIVITY_PAGE = 20;

export interface ClubActivityPage {
  activity: ClubActivityDto[];
  nextBefore: string | null;
}

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
  bank: (clubId: string) =>
    queryOptions({
      queryKey: clubKeys.bank(clubId),
      queryFn: ({ signal }) =>
        api.get<{ listings: ClubListingDto[] }>(`${clubPath(clubId)}/bank`, signal).then((r) => r.listings),
    }),
  stock: (clubId: string) =>
    queryOptions({
      queryKey: clubKeys.stock(clubId),
      queryFn: ({ signal }) =>
        api.get<{ stock: ClubStockDto[] }>(`${clubPath(clubId)}/stock`, signal).then((r) => r.stock),
    }),
  requests: (clubId: string) =>
    queryOptions({
      queryKey: clubKeys.requests(clubId),
      queryFn: ({ signal }) =>
        api.get<{ requests: StrainRequestDto[] }>(`${clubPath(clubId)}/requests`, signal).then((r) => r.requests),
    }),
  /** newest first, one page at a time (cursor: the last row's time and id) */
  activity: (clubId: string) =>
    infiniteQueryOptions({
      queryKey: clubKeys.activity(clubId),
      initialPageParam: null as string | null,
      queryFn: ({ signal, pageParam }) =>
        api.get<ClubActivityPage>(
          `${clubPath(clubId)}/activity?limit=${ACTIVITY_PAGE}${pageParam ? `&before=${encodeURIComponent(pageParam)}` : ''}`,
          signal,
        ),
      getNextPageParam: (last) => last.nextBefore,
    }),
};
