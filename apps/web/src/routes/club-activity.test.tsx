import { describe, expect, it } from 'vitest';
import { CLUB_ACTIVITY_KINDS, type ClubActivityDto } from '@barmkeep/schemas';
import { describeActivity } from './club-activity';

const entry = (over: Partial<ClubActivityDto>): ClubActivityDto => ({
  id: 'a1',
  kind: 'strain_requested',
  actorName: 'Wren Tallow',
  cultureId: 'c1',
  requestId: null,
  data: { strainName: 'Orchard Ale' },
  createdAt: '2026-03-14T09:30:00.000Z',
  ...over,
});

describe('club activity sentences', () => {
  it('says who took a request back and for which strain', () => {
    const { text } = describeActivity(
      entry({ kind: 'request_withdrawn', requestId: 'r1', data: { strainName: 'Orchard Ale', listingId: 'l1' } }),
    );
    expect(text).toBe('Wren Tallow took back their request for Orchard Ale');
  });

  it('still reads when the person or the strain is gone', () => {
    const { text } = describeActivity(entry({ kind: 'request_withdrawn', actorName: null, data: {} }));
    expect(text).toBe('A former member took back their request for a strain');
  });

  it('has a sentence of its own for every kind the feed can hold', () => {
    for (const kind of CLUB_ACTIVITY_KINDS) {
      const { text } = describeActivity(entry({ kind, data: { strainName: 'Orchard Ale', status: 'accepted' } }));
      // the fallback for an unknown kind is "<who>: <kind in words>"
      expect(text, kind).not.toMatch(/^Wren Tallow: /);
    }
  });
});
