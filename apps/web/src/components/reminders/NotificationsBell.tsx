import { Link } from 'react-router';
import { useQuery } from '@tanstack/react-query';
import { Bell } from 'lucide-react';
import { notificationQueries } from '../../api/notifications/queries';
import { cx } from '../cx';

/** The header link to the notices, with the unread count in words for screen readers. */
export function NotificationsBell({ className }: { className?: string }) {
  const { data: unread = 0 } = useQuery(notificationQueries.unreadCount());
  const label = unread === 0 ? 'Notices, none unread' : `Notices, ${unread} unread`;
  return (
    <Link
      to="/notifications"
      aria-label={label}
      title={label}
      className={cx(
        'relative inline-flex min-h-10 min-w-10 items-center justify-center gap-1 rounded-md px-2 text-ink-muted hover:bg-paper-sunk hover:text-ink',
        className,
      )}
    >
      <Bell aria-hidden className="size-5" />
      {unread > 0 ? (
        <span
          aria-hidden
          data-testid="unread-count"
          className="num min-w-5 rounded-full bg-accent px-1.5 text-center text-xs leading-5 font-semibold text-paper-raised"
        >
          {unread > 99 ? '99+' : unread}
        </span>
      ) : null}
    </Link>
  );
}
