import { Link, Navigate, Outlet, useLocation } from 'react-router';
import { useQuery } from '@tanstack/react-query';
import { LogOut } from 'lucide-react';
import { authQueries } from '../api/auth/queries';
import { useSignOutMutation } from '../api/auth/mutations';
import { Button, Loading, Notice, cx } from '../components';
import { signInPathFor } from '../routes/guards';
import { Brand } from './Brand';
import { NotificationsBell } from '../components/reminders/NotificationsBell';

/** Each item is current on its own page and on the pages listed under it. */
const navItems = [
  { to: '/', label: 'Cultures', under: ['/cultures', '/labels'] },
  { to: '/plans', label: 'Brew day', under: ['/plans', '/batches'] },
  { to: '/clubs', label: 'Clubs', under: ['/clubs', '/invitation'] },
  { to: '/account', label: 'Account', under: ['/account', '/notifications'] },
] as const;

const isUnder = (pathname: string, prefix: string) => pathname === prefix || pathname.startsWith(`${prefix}/`);

export function MainNav({ className }: { className?: string }) {
  const { pathname } = useLocation();
  return (
    <nav aria-label="Main" className={className}>
      <ul className="flex gap-1">
        {navItems.map((item) => {
          const current = pathname === item.to || item.under.some((prefix) => isUnder(pathname, prefix));
          return (
            <li key={item.to}>
              <Link
                to={item.to}
                aria-current={current ? 'page' : undefined}
                className={cx(
                  'inline-flex min-h-11 items-center rounded-md px-2.5 font-medium whitespace-nowrap sm:px-3',
                  current
                    ? 'bg-accent-soft text-accent-strong underline decoration-2 underline-offset-6'
                    : 'text-ink-muted hover:bg-paper-sunk hover:text-ink',
                )}
              >
                {item.label}
              </Link>
            </li>
          );
        })}
      </ul>
    </nav>
  );
}

function PersonName({ name, email, className }: { name: string; email: string; className?: string }) {
  return (
    <span className={cx('min-w-0 truncate text-sm text-ink-muted', className)} title={email}>
      <span className="sr-only">Signed in as </span>
      {name}
    </span>
  );
}

/** The signed-in shell: header with navigation, the person's name and sign-out. */
export function Component() {
  const { data: user } = useQuery(authQueries.me());
  const location = useLocation();
  const signOut = useSignOutMutation();

  if (user === null) {
    // Signed out here (or the session ran out): go to sign-in, and come back
    // to this page afterwards unless the person chose to sign out.
    const leaving = signOut.isPending || signOut.isSuccess;
    return <Navigate to={leaving ? '/sign-in' : signInPathFor(location.pathname + location.search)} replace />;
  }
  if (user === undefined) return <Loading />;

  return (
    <div className="min-h-dvh">
      <a
        href="#main"
        className="sr-only focus:not-sr-only focus:absolute focus:top-2 focus:left-2 focus:z-10 focus:rounded focus:bg-paper-raised focus:px-3 focus:py-2"
      >
        Skip to content
      </a>
      <header className="border-b border-rule bg-paper-raised/60">
        <div className="mx-auto max-w-4xl px-4">
          <div className="flex items-center gap-6 py-3">
            <Brand />
            <MainNav className="hidden sm:block" />
            <div className="ml-auto flex min-w-0 items-center gap-3">
              <NotificationsBell />
              <PersonName name={user.name} email={user.email} className="hidden sm:inline" />
              <Button
                variant="secondary"
                className="min-h-10 px-3 text-sm"
                icon={<LogOut aria-hidden className="size-4" />}
                busy={signOut.isPending}
                busyLabel="Signing out…"
                onClick={() => signOut.mutate()}
              >
                Sign out
              </Button>
            </div>
          </div>
          {/* On phones the navigation and the name get a row of their own. */}
          <div className="flex flex-wrap items-center justify-between gap-x-3 pb-2 sm:hidden">
            <MainNav />
            <PersonName name={user.name} email={user.email} />
          </div>
        </div>
      </header>
      <main id="main" tabIndex={-1} className="mx-auto max-w-4xl px-4 py-6 outline-none sm:py-8">
        {signOut.isError ? (
          <Notice tone="danger" live="assertive" title="Could not sign out" className="mb-4">
            {signOut.error.message}
          </Notice>
        ) : null}
        <Outlet />
      </main>
    </div>
  );
}
