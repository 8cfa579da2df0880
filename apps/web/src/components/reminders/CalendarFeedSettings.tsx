import { useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { CalendarPlus, Copy } from 'lucide-react';
import { reminderQueries } from '../../api/notifications/queries';
import { useCreateCalendarFeedMutation, useRevokeCalendarFeedMutation } from '../../api/notifications/mutations';
import { Button } from '../Button';
import { Card } from '../Card';
import { Loading } from '../Loading';
import { Notice } from '../Notice';

const dateOf = (iso: string) => new Intl.DateTimeFormat(undefined, { dateStyle: 'medium' }).format(new Date(iso));

/** The private calendar address: made here, shown once, replaceable and revocable. */
export function CalendarFeedSettings() {
  const { data: feed } = useQuery(reminderQueries.calendarFeed());
  const create = useCreateCalendarFeedMutation();
  const revoke = useRevokeCalendarFeedMutation();
  const [copied, setCopied] = useState(false);
  const url = feed?.active ? create.data?.url : undefined;
  return (
    <Card className="mt-8 space-y-4" aria-labelledby="calendar-heading">
      <div>
        <h2 id="calendar-heading" className="text-lg font-semibold">
          Calendar
        </h2>
        <p className="text-sm text-ink-muted">
          A private address your calendar app can subscribe to: starter steps, brew days, and the dates to re-culture or
          use each culture by. Anyone with the address can read it, so keep it to yourself.
        </p>
      </div>
      {!feed ? (
        <Loading />
      ) : (
        <>
          {url ? (
            <div className="space-y-2">
              <label htmlFor="calendar-url" className="text-sm font-medium">
                Your calendar address (shown only now; copy it into your calendar app)
              </label>
              <div className="flex flex-col gap-2 sm:flex-row">
                <input
                  id="calendar-url"
                  readOnly
                  value={url}
                  onFocus={(e) => e.currentTarget.select()}
                  className="num min-h-11 w-full min-w-0 rounded-md border border-rule-strong bg-paper px-3 text-sm"
                />
                <Button
                  variant="secondary"
                  icon={<Copy aria-hidden className="size-4" />}
                  onClick={async () => {
                    await navigator.clipboard?.writeText(url).catch(() => undefined);
                    setCopied(true);
                  }}
                >
                  {copied ? 'Copied' : 'Copy'}
                </Button>
              </div>
            </div>
          ) : null}
          <p className="text-sm" data-testid="calendar-status">
            {feed.active
              ? `An address is active (made ${dateOf(feed.createdAt!)}${feed.lastUsedAt ? `, last read ${dateOf(feed.lastUsedAt)}` : ', not read yet'}).`
              : 'No calendar address yet.'}
          </p>
          <div className="flex flex-wrap gap-2">
            <Button
              icon={<CalendarPlus aria-hidden className="size-4" />}
              busy={create.isPending}
              busyLabel="Making…"
              onClick={() => {
                setCopied(false);
                create.mutate();
              }}
            >
              {feed.active ? 'Make a new address' : 'Make a calendar address'}
            </Button>
            {feed.active ? (
              <Button
                variant="secondary"
                busy={revoke.isPending}
                busyLabel="Turning off…"
                onClick={() => revoke.mutate()}
              >
                Turn the address off
              </Button>
            ) : null}
          </div>
          {feed.active ? <p className="text-xs text-ink-muted">A new address stops the old one working.</p> : null}
          {revoke.isSuccess && !feed.active ? (
            <Notice tone="success" live="polite" word="Turned off">
              The old address no longer works.
            </Notice>
          ) : null}
        </>
      )}
    </Card>
  );
}
