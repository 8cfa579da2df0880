import type { ComponentType } from 'react';
import { render } from '@testing-library/react';
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { createMemoryRouter, RouterProvider } from 'react-router';

/** Renders one page at `path` with a fresh QueryClient and a stub page for each other path it may go to. */
export function renderPage(
  Page: ComponentType,
  { path, url = path, otherPaths = [] }: { path: string; url?: string; otherPaths?: string[] },
) {
  const queryClient = new QueryClient({
    defaultOptions: { queries: { retry: false }, mutations: { retry: false } },
  });
  const router = createMemoryRouter(
    [{ path, Component: Page }, ...otherPaths.map((other) => ({ path: other, element: <p>Arrived at {other}</p> }))],
    { initialEntries: [url] },
  );
  const result = render(
    <QueryClientProvider client={queryClient}>
      <RouterProvider router={router} />
    </QueryClientProvider>,
  );
  return { ...result, router, queryClient };
}

export function jsonResponse(status: number, body: unknown): Response {
  return new Response(JSON.stringify(body), { status, headers: { 'Content-Type': 'application/json' } });
}
