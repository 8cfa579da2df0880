import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ClubDto, InvitationSignUpInput, UserDto } from '@barmkeep/schemas';
import { api } from '../client';
import { authKeys, authQueries } from '../auth/queries';
import { clubKeys } from '../clubs/queries';
import { invitationKeys } from './queries';

export function useAcceptInvitationMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (token: string) => api.post<{ club: ClubDto }>('/invitations/accept', { token }).then((r) => r.club),
    onSuccess: async (club) => {
      queryClient.setQueryData(clubKeys.detail(club.id), club);
      queryClient.removeQueries({ queryKey: invitationKeys.all });
      await queryClient.invalidateQueries({ queryKey: clubKeys.lists() });
    },
  });
}

export function useInvitationSignUpMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: InvitationSignUpInput) =>
      api.post<{ user: UserDto; clubId: string }>('/invitations/sign-up', input),
    onSuccess: async ({ user }) => {
      queryClient.removeQueries({ predicate: (query) => query.queryKey[0] !== authKeys.all[0] });
      queryClient.setQueryData(authKeys.me(), user);
      await queryClient.prefetchQuery(authQueries.me());
    },
  });
}
