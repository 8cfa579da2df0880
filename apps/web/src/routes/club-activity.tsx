import { Link } from 'react-router';
import { useInfiniteQuery } from '@tanstack/react-query';
import {
  ArrowRightLeft,
  HandHeart,
  MessageSquareReply,
  PackageMinus,
  PackagePlus,
  ShieldAlert,
  Snowflake,
  Undo2,
  UserMinus,
  UserPlus,
  type LucideIcon,
} from 'lucide-react';
import type { ClubActivityDto } from '@barmkeep/schemas';
import { clubQueries } from '../api/clubs/queries';
import { Button, EmptyState, Loading, Notice } from '../components';
import { formatDateTime } from '../lib/format';
import { useClub } from './club';

const str = (v: unknown) => (typeof v === 'string' ? v : '');
const answerWords: Record<string, string> = {
  accepted: 'accepted a request',
  declined: 'declined a request',
  proposed: 'proposed another time for a request',
};

/** One feed row as a sentence, with an icon beside the words. */
export function describeActivity(a: ClubActivityDto): { Icon: LucideIcon; text: string; danger?: boolean } {
  const who = a.actorName ?? 'A former member';
  const strain = str(a.data.strainName);
  switch (a.kind) {
    case 'member_joined':
      return { Icon: UserPlus, text: `${who} joined the club` };
    case 'member_left':
      return { Icon: UserMinus, text: `${who} left the club` };
    case 'strain_listed':
      return { Icon: PackagePlus, text: `${who} listed ${strain} in the bank` };
    case 'strain_withdrawn':
      return { Icon: PackageMinus, text: `${who} took ${strain} out of the bank` };
    case 'strain_requested':
      return { Icon: HandHeart, text: `${who} asked for ${strain}` };
    case 'request_withdrawn':
      return { Icon: Undo2, text: `${who} took back their request for ${strain || 'a strain'}` };
    case 'request_answered':
      return { Icon: MessageSquareReply, text: `${who} ${answerWords[str(a.data.status)] ?? 'answered a request'}` };
    case 'handoff_received':
      return {
        Icon: ArrowRightLeft,
        text: `${who} received ${strain}${typeof a.data.generation === 'number' ? ` (generation ${a.data.generation})` : ''}`,
      };
    case 'culture_quarantined':
      return {
        Icon: ShieldAlert,
        danger: true,
        text: `${who} confirmed contamination in ${strain} and quarantined it; every culture grown from it is flagged`,
      };
    case 'stock_added':
      return {
        Icon: Snowflake,
        text: `${who} added ${strain} to the club’s stock (${String(a.data.units ?? '')} ${str(a.data.unit)}s)`,
      };
    case 'stock_withdrawn':
      return {
        Icon: Snowflake,
        text: `${who} took one ${str(a.data.unit)} of ${strain} out of the club’s stock (${String(a.data.unitsLeft ?? '')} left)`,
      };
    default: {
      // a kind this page does not know yet (a newer server): say what little we can
      const kind: string = a.kind;
      return { Icon: MessageSquareReply, text: `${who}: ${kind.replace(/_/g, ' ')}` };
    }
  }
}

export function Component() {
  const club = useClub();
  const feed = useInfiniteQuery(clubQueries.activity(club.id));
  if (feed.isPending) return <Loading />;
  if (feed.isError)
    return (
      <Notice tone="danger" title="Could not load the activity">
        {feed.error.message}
      </Notice>
    );
  const rows = feed.data.pages.flatMap((p) => p.activity);
  return (
    <section aria-labelledby="activity-heading" className="space-y-3">
      <h2 id="activity-heading" className="text-lg font-semibold">
        Activity
      </h2>
      {rows.length === 0 ? (
        <EmptyState title="Nothing has happened yet">
          <p>
            Strains listed in the{' '}
            <Link to="../bank" className="text-accent underline">
              bank
            </Link>
            , requests, handovers and quarantines show up here, newest first.
          </p>
        </EmptyState>
      ) : (
        <ol className="rounded-lg border border-rule bg-paper-raised px-4" aria-label="Club activity, newest first">
          {rows.map((a) => {
            const { Icon, text, danger } = describeActivity(a);
            return (
              <li key={a.id} className="flex items-start gap-3 border-b border-rule py-3 last:border-0">
                <Icon aria-hidden className={`mt-0.5 size-5 shrink-0 ${danger ? 'text-danger' : 'text-ink-muted'}`} />
                <div className="min-w-0">
                  <p className={danger ? 'font-medium text-danger' : undefined}>{text}</p>
                  <time className="num text-sm text-ink-muted" dateTime={a.createdAt}>
                    {formatDateTime(a.createdAt)}
                  </time>
                </div>
              </li>
            );
          })}
        </ol>
      )}
      {feed.hasNextPage ? (
        <Button
          variant="secondary"
          busy={feed.isFetchingNextPage}
          busyLabel="Loading…"
          onClick={() => void feed.fetchNextPage()}
        >
          Show older
        </Button>
      ) : rows.length > 0 ? (
        <p className="text-sm text-ink-muted">That is everything since the club started.</p>
      ) : null}
    </section>
  );
}
