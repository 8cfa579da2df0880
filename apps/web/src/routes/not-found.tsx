import { Link, useLocation } from 'react-router';
import { Compass } from 'lucide-react';
import { buttonClasses } from '../components';

export function Component() {
  const { pathname } = useLocation();
  return (
    <div className="mx-auto max-w-lg space-y-4 py-8">
      <title>Page not found · Barmkeep</title>
      <p className="flex items-center gap-2 font-semibold text-ink-muted">
        <Compass aria-hidden className="size-5" /> Not found
      </p>
      <h1 className="text-2xl font-semibold tracking-tight">Nothing is filed under this address</h1>
      <p className="text-ink-muted">
        There is no page at <code className="num rounded bg-paper-sunk px-1.5 py-0.5 break-all">{pathname}</code>. It
        may have moved, or the link was mistyped.
      </p>
      <Link to="/" className={buttonClasses('primary')}>
        Go to your cultures
      </Link>
    </div>
  );
}
