import { Outlet, ScrollRestoration } from 'react-router';
import { Loading } from '../components';

export function RootLayout() {
  return (
    <>
      <Outlet />
      <ScrollRestoration />
    </>
  );
}

/** Shown while the first page's loaders and code arrive. */
export function RootHydrateFallback() {
  return (
    <div className="mx-auto max-w-md px-4 py-16">
      <Loading label="Opening Barmkeep…" />
    </div>
  );
}
