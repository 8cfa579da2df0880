import { Link } from 'react-router';
import { useQuery } from '@tanstack/react-query';
import { Inbox, Mail, RefreshCw } from 'lucide-react';
import { devMailQueries, recipients } from '../api/devMail/queries';
import { isApiError } from '../api/client';
import { Button, EmptyState, Loading, Notice, PageHeader } from '../components';
import { formatDateTime } from '../lib/format';

export function Component() {
  const inbox = useQuery(devMailQueries.list());

  return (
    <>
      <title>Local inbox · Barmkeep</title>
      <PageHeader
        title="Local inbox"
        description="Mail this copy of Barmkeep has sent, caught before it leaves the machine. Newest first."
        actions={
          <Button
            variant="secondary"
            icon={<RefreshCw aria-hidden className="size-4" />}
            busy={inbox.isFetching}
            busyLabel="Checking…"
            onClick={() => void inbox.refetch()}
          >
            Check for new mail
          </Button>
        }
      />
      {inbox.isPending ? <Loading label="Opening the inbox…" /> : null}
      {inbox.isError ? (
        isApiError(inbox.error) && inbox.error.status === 404 ? (
          <Notice tone="info" title="No local inbox here">
            This server sends real e-mail, so there is nothing to show. The local inbox exists only in development and
            test setups.
          </Notice>
        ) : (
          <Notice tone="danger" title="Could not open the inbox" live="assertive">
            {inbox.error.message}
          </Notice>
        )
      ) : null}
      {inbox.isSuccess && inbox.data.length === 0 ? (
        <EmptyState icon={<Inbox aria-hidden className="size-10" />} title="No mail yet">
          <p>Ask for a password reset or sign up, then check again.</p>
        </EmptyState>
      ) : null}
      {inbox.isSuccess && inbox.data.length > 0 ? (
        <ul className="divide-y divide-rule overflow-hidden rounded-lg border border-rule bg-paper-raised">
          {inbox.data.map((message) => (
            <li key={message.id}>
              <Link
                to={`/dev/mail/${encodeURIComponent(message.id)}`}
                className="flex gap-3 px-4 py-3 hover:bg-paper-sunk"
                data-message-id={message.id}
              >
                <Mail aria-hidden className="mt-1 size-4 shrink-0 text-accent" />
                <span className="flex min-w-0 flex-1 flex-col gap-0.5 sm:flex-row sm:items-baseline sm:justify-between sm:gap-4">
                  <span className="min-w-0">
                    <span className="block font-medium text-accent">{message.subject || '(no subject)'}</span>
                    <span className="block truncate text-sm text-ink-muted">To {recipients(message)}</span>
                  </span>
                  <time dateTime={message.receivedAt} className="num shrink-0 text-sm text-ink-muted">
                    {formatDateTime(message.receivedAt)}
                  </time>
                </span>
              </Link>
            </li>
          ))}
        </ul>
      ) : null}
    </>
  );
}
