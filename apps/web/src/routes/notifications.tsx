import { useState } from 'react';
import { Link } from 'react-router';
import { useQuery } from '@tanstack/react-query';
import { BellOff, Check } from 'lucide-react';
import { NOTIFICATION_KIND_LABELS, type NotificationDto, type NotificationKind } from '@barmkeep/schemas';
import { notificationQueries } from '../api/notifications/queries';
import { useMarkAllReadMutation, useMarkReadMutation } from '../api/notifications/mutations';
import { authQueries } from '../api/auth/queries';
import { Button, Card, EmptyState, Loading, Notice, PageHeader, cx } from '../components';

function when(iso: string, timeZone: string) {
  return new Intl.DateTimeFormat(undefined, { dateStyle: 'medium', timeStyle: 'short', timeZone }).format(
    new Date(iso),
  );
}

function NoticeRow({ n, timeZone }: { n: NotificationDto; timeZone: string }) {
  const markRead = useMarkReadMutation();
  const unread = n.readAt === null;
  return (
    <li>
      <Card className={cx('space-y-2', unread ? 'border-l-4 border-l-accent' : 'opacity-90')}>
        <p className="text-xs font-medium tracking-wide text-ink-muted uppercase">
          {unread ? <span className="text-accent-strong">Unread · </span> : null}
          {NOTIFICATION_KIND_LABELS[n.kind as NotificationKind] ?? 'Notice'}
        </p>
        <h2 className="font-semibold">
          <Link
            to={n.link}
            className="underline decoration-rule-strong underline-offset-4 hover:decoration-accent"
            onClick={() => {
              if (unread) markRead.mutate(n.id);
            }}
          >
            {n.title}
          </Link>
        </h2>
        {n.body ? <p className="text-sm text-ink-muted">{n.body}</p> : null}
        <div className="flex flex-wrap items-center justify-between gap-2">
          <p className="text-xs text-ink-muted">
            <span className="sr-only">Sent </span>
            <time dateTime={n.createdAt}>{when(n.createdAt, timeZone)}</time>
          </p>
          {unread ? (
            <Button
              variant="quiet"
              className="min-h-9 px-2 text-sm"
              icon={<Check aria-hidden className="size-4" />}
              busy={markRead.isPending}
              busyLabel="Marking…"
              onClick={() => markRead.mutate(n.id)}
            >
              Mark read
            </Button>
          ) : null}
        </div>
      </Card>
    </li>
  );
}

export function Component() {
  const [unreadOnly, setUnreadOnly] = useState(false);
  const { data: user } = useQuery(authQueries.me());
  const list = useQuery(notificationQueries.list({ unread: unreadOnly }));
  const markAll = useMarkAllReadMutation();
  const unread = list.data?.unreadCount ?? 0;
  return (
    <>
      <title>Notices · Barmkeep</title>
      <PageHeader
        title="Notices"
        description="Reminders about your cultures and plans, and club requests. Set what you get on the Account page."
        actions={
          <>
            <Button
              variant="secondary"
              className="min-h-10 text-sm"
              onClick={() => setUnreadOnly((v) => !v)}
              aria-pressed={unreadOnly}
            >
              {unreadOnly ? 'Show all' : 'Only unread'}
            </Button>
            <Button
              variant="secondary"
              className="min-h-10 text-sm"
              disabled={unread === 0}
              busy={markAll.isPending}
              busyLabel="Marking…"
              onClick={() => markAll.mutate()}
            >
              Mark all read
            </Button>
          </>
        }
      />
      {list.isError ? (
        <Notice tone="danger" title="Could not load your notices">
          {list.error.message}
        </Notice>
      ) : !list.data || !user ? (
        <Loading />
      ) : list.data.notifications.length === 0 ? (
        <EmptyState
          icon={<BellOff aria-hidden className="size-8" />}
          title={unreadOnly ? 'Nothing unread' : 'No notices yet'}
        >
          Barmkeep tells you here, and by e-mail, before a culture drops below your viability threshold, reaches its
          storage time or generation limit, and before each planned starter step.
        </EmptyState>
      ) : (
        <>
          <p className="mb-3 text-sm text-ink-muted" aria-live="polite">
            <span className="num">{unread}</span> unread
          </p>
          <ul className="space-y-3">
            {list.data.notifications.map((n) => (
              <NoticeRow key={n.id} n={n} timeZone={user.timeZone} />
            ))}
          </ul>
        </>
      )}
    </>
  );
}
