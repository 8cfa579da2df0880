import { MutationCache, QueryCache, QueryClient } from '@tanstack/react-query';
import { isApiError } from './api/client';
import { authKeys } from './api/auth/queries';

/**
 * One QueryClient for the app. When any call reports that the session is
 * gone, the cached user becomes null and the signed-in layout sends the
 * person to the sign-in page.
 */
export function createQueryClient(): QueryClient {
  const onUnauthenticated = (error: unknown) => {
    if (isApiError(error) && error.status === 401 && error.code === 'unauthenticated') {
      queryClient.setQueryData(authKeys.me(), null);
    }
  };

  const queryClient: QueryClient = new QueryClient({
    queryCache: new QueryCache({ onError: onUnauthenticated }),
    mutationCache: new MutationCache({ onError: onUnauthenticated }),
    defaultOptions: {
      queries: {
        staleTime: 30 * 1000,
        retry: (failureCount, error) => {
          // Client errors will not fix themselves; network blips and 5xx might.
          if (isApiError(error) && error.status >= 400 && error.status < 500) return false;
          return failureCount < 2;
        },
      },
    },
  });
  return queryClient;
}
