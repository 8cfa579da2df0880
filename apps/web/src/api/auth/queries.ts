import { queryOptions } from '@tanstack/react-query';
import type { UserDto } from '@barmkeep/schemas';
import { api, isApiError } from '../client';

export const authKeys = {
  all: ['auth'] as const,
  me: () => [...authKeys.all, 'me'] as const,
};

/** Who is signed in. Resolves null (not an error) when nobody is. */
export async function fetchCurrentUser(signal?: AbortSignal): Promise<UserDto | null> {
  try {
    const { user } = await api.get<{ user: UserDto }>('/auth/me', signal);
    return user;
  } catch (error) {
    if (isApiError(error) && error.status === 401) return null;
    throw error;
  }
}

export const authQueries = {
  me: () =>
    queryOptions({
      queryKey: authKeys.me(),
      queryFn: ({ signal }) => fetchCurrentUser(signal),
      staleTime: 5 * 60 * 1000,
    }),
};
