import { Outlet } from 'react-router';
import { Brand } from './Brand';

/** A narrow, centred column for signing in, signing up and resetting a password. */
export function Component() {
  return (
    <div className="mx-auto flex min-h-dvh w-full max-w-md flex-col px-4 py-8 sm:py-14">
      <header className="mb-8">
        <Brand />
        <p className="mt-2 text-ink-muted">A notebook for the yeast you keep alive between brew days.</p>
      </header>
      <main id="main" className="flex-1">
        <Outlet />
      </main>
    </div>
  );
}
