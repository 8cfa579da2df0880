import { useMutation, useQueryClient } from '@tanstack/react-query';
import type {
  ClubCreateInput,
  ClubDto,
  ClubInvitationCreateInput,
  ClubInvitationDto,
  ClubMemberDto,
  ClubMemberUpdateInput,
  ClubUpdateInput,
} from '@barmkeep/schemas';
import { api } from '../client';
import { clubKeys } from './queries';

const clubPath = (clubId: string) => `/clubs/${encodeURIComponent(clubId)}`;

export function useCreateClubMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: ClubCreateInput) => api.post<{ club: ClubDto }>('/clubs', input).then((r) => r.club),
    onSuccess: async (club) => {
      queryClient.setQueryData(clubKeys.detail(club.id), club);
      await queryClient.invalidateQueries({ queryKey: clubKeys.lists() });
    },
  });
}

export function useUpdateClubMutation(clubId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: ClubUpdateInput) => api.patch<{ club: ClubDto }>(clubPath(clubId), input).then((r) => r.club),
    onSuccess: async (club) => {
      queryClient.setQueryData(clubKeys.detail(clubId), club);
      await queryClient.invalidateQueries({ queryKey: clubKeys.lists() });
    },
  });
}

export function useDeleteClubMutation(clubId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => api.delete<void>(clubPath(clubId)),
    onSuccess: async () => {
      queryClient.removeQueries({ queryKey: clubKeys.detail(clubId) });
      await queryClient.invalidateQueries({ queryKey: clubKeys.lists() });
    },
  });
}

export function useLeaveClubMutation(clubId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => api.post<void>(`${clubPath(clubId)}/leave`),
    onSuccess: async () => {
      queryClient.removeQueries({ queryKey: clubKeys.detail(clubId) });
      await queryClient.invalidateQueries({ queryKey: clubKeys.lists() });
    },
  });
}

export function useChangeMemberRoleMutation(clubId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ userId, ...input }: ClubMemberUpdateInput & { userId: string }) =>
      api
        .patch<{ member: ClubMemberDto }>(`${clubPath(clubId)}/members/${encodeURIComponent(userId)}`, input)
        .then((r) => r.member),
    // the actor's own role may have changed too: refresh the whole club
    onSettled: () => queryClient.invalidateQueries({ queryKey: clubKeys.detail(clubId) }),
  });
}

export function useRemoveMemberMutation(clubId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (userId: string) => api.delete<void>(`${clubPath(clubId)}/members/${encodeURIComponent(userId)}`),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: clubKeys.detail(clubId) }),
  });
}

export function useInviteMutation(clubId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: ClubInvitationCreateInput) =>
      api.post<{ invitation: ClubInvitationDto }>(`${clubPath(clubId)}/invitations`, input).then((r) => r.invitation),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: clubKeys.invitations(clubId) }),
  });
}

export function useRevokeInvitationMutation(clubId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (invitationId: string) =>
      api.delete<{ invitation: ClubInvitationDto }>(
        `${clubPath(clubId)}/invitations/${encodeURIComponent(invitationId)}`,
      ),
    onSettled: () => queryClient.invalidateQueries({ queryKey: clubKeys.invitations(clubId) }),
  });
}
