import type { QueryClient } from '@tanstack/react-query';
import type { RouteObject } from 'react-router';
import { RootLayout, RootHydrateFallback } from './layouts/RootLayout';
import { RouteError } from './layouts/RouteError';
import { guestOnlyLoader, requireUserLoader } from './routes/guards';

/**
 * Every page and layout below the root is lazy-loaded, so the first visit to
 * /sign-in downloads only what that page needs.
 */
export function createRoutes(queryClient: QueryClient): RouteObject[] {
  return [
    {
      id: 'root',
      Component: RootLayout,
      HydrateFallback: RootHydrateFallback,
      ErrorBoundary: RouteError,
      children: [
        {
          id: 'guest',
          loader: guestOnlyLoader(queryClient),
          lazy: () => import('./layouts/AuthLayout'),
          children: [
            { path: 'sign-in', lazy: () => import('./routes/sign-in') },
            { path: 'sign-up', lazy: () => import('./routes/sign-up') },
            { path: 'forgot-password', lazy: () => import('./routes/forgot-password') },
          ],
        },
        {
          // Open whether or not someone is signed in: the link comes from an e-mail.
          lazy: () => import('./layouts/AuthLayout'),
          children: [
            { path: 'reset-password', lazy: () => import('./routes/reset-password') },
            { path: 'email-preferences/:token', lazy: () => import('./routes/email-preferences') },
            { path: 'invitation', lazy: () => import('./routes/invitation') },
          ],
        },
        {
          id: 'app',
          loader: requireUserLoader(queryClient),
          lazy: () => import('./layouts/AppLayout'),
          children: [
            { index: true, lazy: () => import('./routes/home') },
            { path: 'account', lazy: () => import('./routes/account') },
            { path: 'notifications', lazy: () => import('./routes/notifications') },
            { path: 'labels', lazy: () => import('./routes/labels') },
            { path: 'cultures/:id/quick', lazy: () => import('./routes/culture-quick-log') },
            { path: 'plans', lazy: () => import('./routes/plans') },
            { path: 'plans/new', lazy: () => import('./routes/plan-new') },
            { path: 'plans/:id', lazy: () => import('./routes/plan') },
            { path: 'batches', lazy: () => import('./routes/batches') },
            { path: 'batches/new', lazy: () => import('./routes/batch-new') },
            // recharts loads only with this page
            { path: 'batches/generations', lazy: () => import('./routes/generations') },
            { path: 'batches/:id', lazy: () => import('./routes/batch') },
            { path: 'cultures', lazy: () => import('./routes/cultures/library') },
            { path: 'cultures/new', lazy: () => import('./routes/cultures/new') },
            { path: 'cultures/:id', lazy: () => import('./routes/cultures/detail') },
            // d3-hierarchy loads only with this page, recharts only with the culture page
            { path: 'cultures/:id/lineage', lazy: () => import('./routes/cultures/lineage') },
            { path: 'clubs', lazy: () => import('./routes/clubs') },
            {
              path: 'clubs/:clubId',
              lazy: () => import('./routes/club'),
              children: [
                { index: true, lazy: () => import('./routes/club-about') },
                { path: 'bank', lazy: () => import('./routes/club-bank') },
                { path: 'stock', lazy: () => import('./routes/club-stock') },
                { path: 'requests', lazy: () => import('./routes/club-requests') },
                { path: 'activity', lazy: () => import('./routes/club-activity') },
                { path: 'members', lazy: () => import('./routes/club-members') },
                { path: 'invitations', lazy: () => import('./routes/club-invitations') },
                { path: 'settings', lazy: () => import('./routes/club-settings') },
              ],
            },
          ],
        },
        {
          // The local fake inbox, used to follow reset links in development and tests.
          path: 'dev/mail',
          lazy: () => import('./layouts/PlainLayout'),
          children: [
            { index: true, lazy: () => import('./routes/dev-mail') },
            { path: ':messageId', lazy: () => import('./routes/dev-mail-message') },
          ],
        },
        {
          lazy: () => import('./layouts/PlainLayout'),
          children: [{ path: '*', lazy: () => import('./routes/not-found') }],
        },
      ],
    },
  ];
}
