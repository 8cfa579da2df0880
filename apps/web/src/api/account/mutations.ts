import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { AccountPasswordChangeInput, AccountUpdateInput, UserDto } from '@barmkeep/schemas';
import { api } from '../client';
import { authKeys } from '../auth/queries';

/** The account is the signed-in user, so its cache entry is the `me` query. */
export function useUpdateAccountMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: AccountUpdateInput) => api.patch<{ user: UserDto }>('/account', input),
    onSuccess: async ({ user }) => {
      queryClient.setQueryData(authKeys.me(), user);
      await queryClient.invalidateQueries({ queryKey: authKeys.all, refetchType: 'none' });
    },
  });
}

/** A new password ends every other session; this browser keeps a fresh one, so nothing to refetch. */
export function useChangePasswordMutation() {
  return useMutation({
    mutationFn: (input: AccountPasswordChangeInput) => api.post<void>('/account/password', input),
  });
}
