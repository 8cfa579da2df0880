import { useMutation, useQueryClient } from '@tanstack/react-query';
import type {
  AuthSignInInput,
  AuthSignUpInput,
  PasswordResetConfirmInput,
  PasswordResetRequestInput,
  UserDto,
} from '@barmkeep/schemas';
import { api } from '../client';
import { authKeys, authQueries } from './queries';

export function useSignInMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: AuthSignInInput) => api.post<{ user: UserDto }>('/auth/sign-in', input),
    onSuccess: ({ user }) => {
      // Drop anything cached for a previous person before showing this one's data.
      queryClient.removeQueries({ predicate: (query) => query.queryKey[0] !== authKeys.all[0] });
      queryClient.setQueryData(authKeys.me(), user);
    },
  });
}

export function useSignUpMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: AuthSignUpInput) => api.post<{ user: UserDto }>('/auth/sign-up', input),
    onSuccess: async () => {
      queryClient.removeQueries({ predicate: (query) => query.queryKey[0] !== authKeys.all[0] });
      // Ask the server whether sign-up also started a session. The `me` query
      // may have no observer on this page, so fetch it explicitly (prefetch never throws).
      await queryClient.invalidateQueries({ queryKey: authKeys.all });
      await queryClient.prefetchQuery(authQueries.me());
    },
  });
}

export function useSignOutMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => api.post<void>('/auth/sign-out'),
    onSuccess: () => {
      queryClient.clear();
      queryClient.setQueryData(authKeys.me(), null);
    },
  });
}

export function usePasswordResetRequestMutation() {
  return useMutation({
    mutationFn: (input: PasswordResetRequestInput) => api.post<void>('/auth/password-reset/request', input),
  });
}

export function usePasswordResetConfirmMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: PasswordResetConfirmInput) => api.post<void>('/auth/password-reset/confirm', input),
    onSuccess: async () => {
      // A reset may end existing sessions; find out who (if anyone) is signed in now.
      await queryClient.invalidateQueries({ queryKey: authKeys.all });
      await queryClient.prefetchQuery(authQueries.me());
    },
  });
}
