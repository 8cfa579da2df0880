import { Outlet } from 'react-router';
import { Brand } from './Brand';

/** Pages that anyone may see, signed in or not. */
export function Component() {
  return (
    <div className="min-h-dvh">
      <header className="border-b border-rule bg-paper-raised/60">
        <div className="mx-auto flex max-w-4xl items-center px-4 py-3">
          <Brand />
        </div>
      </header>
      <main id="main" className="mx-auto max-w-4xl px-4 py-8">
        <Outlet />
      </main>
    </div>
  );
}
