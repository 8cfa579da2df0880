import { Link, useParams } from 'react-router';
import { useQuery } from '@tanstack/react-query';
import { ArrowLeft } from 'lucide-react';
import { devMailQueries, recipients } from '../api/devMail/queries';
import { isApiError } from '../api/client';
import { Card, Loading, Notice } from '../components';
import { formatDateTime } from '../lib/format';
import { linkify } from '../lib/linkify';

export function Component() {
  const { messageId = '' } = useParams();
  const message = useQuery(devMailQueries.detail(messageId));

  return (
    <div className="space-y-4">
      <Link
        to="/dev/mail"
        className="inline-flex min-h-11 items-center gap-1.5 text-accent underline underline-offset-4"
      >
        <ArrowLeft aria-hidden className="size-4" /> All messages
      </Link>
      {message.isPending ? <Loading label="Opening the message…" /> : null}
      {message.isError ? (
        <Notice
          tone={isApiError(message.error) && message.error.status === 404 ? 'info' : 'danger'}
          title="Message not available"
        >
          {isApiError(message.error) && message.error.status === 404
            ? 'There is no message with this id in the local inbox. The inbox is emptied when the server restarts.'
            : message.error.message}
        </Notice>
      ) : null}
      {message.isSuccess ? (
        <Card className="space-y-4">
          <title>{`${message.data.subject} · Local inbox · Barmkeep`}</title>
          <h1 className="text-xl font-semibold tracking-tight">{message.data.subject || '(no subject)'}</h1>
          <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm">
            <dt className="text-ink-muted">From</dt>
            <dd className="break-all">{message.data.from}</dd>
            <dt className="text-ink-muted">To</dt>
            <dd className="break-all">{recipients(message.data)}</dd>
            <dt className="text-ink-muted">Received</dt>
            <dd>
              <time dateTime={message.data.receivedAt} className="num">
                {formatDateTime(message.data.receivedAt)}
              </time>
            </dd>
          </dl>
          <div className="border-t border-rule pt-4 font-mono text-sm leading-relaxed break-words whitespace-pre-wrap">
            {linkify(message.data.text, 'text-accent underline underline-offset-4 break-all')}
          </div>
        </Card>
      ) : null}
    </div>
  );
}
