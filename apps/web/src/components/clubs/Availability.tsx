import { CircleCheck, CircleMinus, ShieldAlert } from 'lucide-react';
import type { ClubListingDto } from '@barmkeep/schemas';

/** Whether a bank entry can be asked for, as a word with an icon. */
export function availabilityOf(
  l: ClubListingDto,
  myId: string | undefined,
): { word: string; tone: 'ok' | 'no' | 'danger' } {
  if (l.suspect || l.state === 'quarantined') return { word: 'No: suspect', tone: 'danger' };
  if (l.stock && l.stock.unitsLeft === 0) return { word: 'No: none left', tone: 'no' };
  if (l.keeper.id === myId) return { word: l.stock ? 'You hold it' : 'Yours', tone: 'no' };
  if (l.myRequest) return { word: 'You asked', tone: 'ok' };
  if (l.canRequest) return { word: 'Yes', tone: 'ok' };
  return { word: 'Not now', tone: 'no' };
}

export function Availability({ listing, myId }: { listing: ClubListingDto; myId: string | undefined }) {
  const a = availabilityOf(listing, myId);
  const Icon = a.tone === 'ok' ? CircleCheck : a.tone === 'danger' ? ShieldAlert : CircleMinus;
  const colour = a.tone === 'ok' ? 'text-accent-strong' : a.tone === 'danger' ? 'text-danger' : 'text-ink-muted';
  return (
    <span className={`inline-flex items-center gap-1 whitespace-nowrap ${colour}`}>
      <Icon aria-hidden className="size-4" />
      {a.word}
    </span>
  );
}
