import { useState } from 'react';
import { Link } from 'react-router';
import { useQuery } from '@tanstack/react-query';
import { Users } from 'lucide-react';
import type { CultureDetailDto } from '@barmkeep/schemas';
import { clubQueries } from '../../api/clubs/queries';
import { useListCultureMutation } from '../../api/clubs/mutations';
import { Button } from '../Button';
import { Card } from '../Card';
import { FormAlert, Notice } from '../Notice';
import { Select } from '../Select';
import { TextField } from '../TextField';

/** On a culture's page: offer it in one of my clubs' banks. */
export function OfferInClub({ culture }: { culture: CultureDetailDto }) {
  const clubs = useQuery(clubQueries.list());
  const mine = (clubs.data ?? []).filter((c) => c.myRole !== null);
  const [clubId, setClubId] = useState('');
  const [note, setNote] = useState('');
  const chosen = clubId || mine[0]?.id || '';
  const list = useListCultureMutation(chosen);
  const [listedIn, setListedIn] = useState<{ id: string; name: string } | null>(null);
  const offerable = !culture.suspect && ['active', 'stored'].includes(culture.state);
  if (!mine.length || !offerable) return null;
  return (
    <Card className="space-y-3">
      <h2 className="text-lg font-semibold">Offer it in a club</h2>
      <p className="text-sm text-ink-muted">
        Members see the strain, form, generation and today’s projected viability, and can ask you for some. Your notes,
        log and photos stay yours.
      </p>
      {listedIn ? (
        <Notice tone="success" live="polite" title={`Listed in ${listedIn.name}`}>
          <Link to={`/clubs/${listedIn.id}/bank`} className="text-accent underline">
            See the club’s bank
          </Link>
        </Notice>
      ) : null}
      <FormAlert message={list.error?.message} />
      <form
        noValidate
        className="grid gap-3 sm:grid-cols-[1fr_1fr_auto] sm:items-end"
        onSubmit={(e) => {
          e.preventDefault();
          list.mutate(
            { cultureId: culture.id, note: note.trim() },
            {
              onSuccess: () => {
                setListedIn({ id: chosen, name: mine.find((c) => c.id === chosen)?.name ?? 'the club' });
                setNote('');
              },
            },
          );
        }}
      >
        <Select
          label="Club"
          value={chosen}
          onChange={(e) => setClubId(e.target.value)}
          options={mine.map((c) => ({ value: c.id, label: c.name }))}
        />
        <TextField
          label="A note for the members"
          maxLength={500}
          value={note}
          onChange={(e) => setNote(e.target.value)}
        />
        <Button type="submit" variant="secondary" busy={list.isPending} icon={<Users aria-hidden className="size-4" />}>
          List in the bank
        </Button>
      </form>
    </Card>
  );
}
