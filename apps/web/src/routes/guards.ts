import { redirect, type LoaderFunctionArgs } from 'react-router';
import type { QueryClient } from '@tanstack/react-query';
import { authQueries } from '../api/auth/queries';
import { safeNextPath } from '../lib/formErrors';

/** The sign-in URL that brings the person back to `path` afterwards. */
export function signInPathFor(path: string): string {
  return path === '/' ? '/sign-in' : `/sign-in?next=${encodeURIComponent(path)}`;
}

/** Loader for the signed-in layout: signed-out people go to /sign-in. */
export function requireUserLoader(queryClient: QueryClient) {
  return async ({ request }: LoaderFunctionArgs) => {
    const user = await queryClient.ensureQueryData(authQueries.me());
    if (!user) {
      const url = new URL(request.url);
      throw redirect(signInPathFor(url.pathname + url.search));
    }
    return null;
  };
}

/** Loader for sign-in and sign-up: signed-in people go home (or where they were headed). */
export function guestOnlyLoader(queryClient: QueryClient) {
  return async ({ request }: LoaderFunctionArgs) => {
    const user = await queryClient.ensureQueryData(authQueries.me());
    if (user) {
      const next = safeNextPath(new URL(request.url).searchParams.get('next'));
      throw redirect(next ?? '/');
    }
    return null;
  };
}
