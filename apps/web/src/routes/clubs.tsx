import { Link, useNavigate } from 'react-router';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { useQuery } from '@tanstack/react-query';
import { Users } from 'lucide-react';
import { ClubCreateSchema, clubLimits } from '@barmkeep/schemas';
import { clubQueries } from '../api/clubs/queries';
import { useCreateClubMutation } from '../api/clubs/mutations';
import { Button, Card, EmptyState, FormAlert, Loading, Notice, PageHeader, TextField } from '../components';
import { RoleBadge } from '../components/clubs/RoleBadge';
import { TextArea } from '../components/TextArea';
import { applyApiError } from '../lib/formErrors';

function StartClubForm() {
  const navigate = useNavigate();
  const createClub = useCreateClubMutation();
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting },
  } = useForm({ resolver: zodResolver(ClubCreateSchema), defaultValues: { name: '', description: '' } });

  const onSubmit = handleSubmit(async (values) => {
    try {
      const club = await createClub.mutateAsync(values);
      await navigate(`/clubs/${club.id}`);
    } catch (error) {
      applyApiError(error, setError, ['name', 'description']);
    }
  });

  return (
    <Card>
      <h2 className="mb-1 text-lg font-semibold">Start a club</h2>
      <p className="mb-4 text-sm text-ink-muted">
        You become its owner and can invite the others by e-mail. A club can keep a shared bank of strains.
      </p>
      <form onSubmit={onSubmit} noValidate className="space-y-4">
        <FormAlert message={errors.root?.server?.message} />
        <TextField
          label="Club name"
          maxLength={clubLimits.clubNameMax}
          error={errors.name?.message}
          {...register('name')}
        />
        <TextArea
          label="About the club"
          hint="Optional. Where you meet, what you brew, how the shared fridge works."
          maxLength={clubLimits.clubDescriptionMax}
          error={errors.description?.message}
          {...register('description')}
        />
        <Button type="submit" busy={isSubmitting} busyLabel="Starting the club…">
          Start the club
        </Button>
      </form>
    </Card>
  );
}

export function Component() {
  const clubs = useQuery(clubQueries.list());

  return (
    <>
      <title>Clubs · Barmkeep</title>
      <PageHeader title="Clubs" description="The clubs you belong to, and the strains you share with them." />
      <div className="grid gap-6 md:grid-cols-[3fr_2fr]">
        <section aria-labelledby="your-clubs" className="space-y-3">
          <h2 id="your-clubs" className="sr-only">
            Your clubs
          </h2>
          {clubs.isPending ? (
            <Loading />
          ) : clubs.isError ? (
            <Notice tone="danger" title="Could not load your clubs">
              {clubs.error.message}
            </Notice>
          ) : clubs.data.length === 0 ? (
            <EmptyState icon={<Users aria-hidden className="size-10" />} title="Not in a club yet">
              <p>
                Start one here, or ask a club’s owner or steward to invite you: the invitation arrives by e-mail with a
                link that works once.
              </p>
            </EmptyState>
          ) : (
            <ul className="space-y-3">
              {clubs.data.map((club) => (
                <li key={club.id}>
                  <Link
                    to={`/clubs/${club.id}`}
                    className="block rounded-lg border border-rule bg-paper-raised p-4 hover:border-accent focus-visible:border-accent"
                  >
                    <div className="flex flex-wrap items-center justify-between gap-2">
                      <span className="text-lg font-semibold text-accent-strong">{club.name}</span>
                      {club.myRole ? <RoleBadge role={club.myRole} /> : null}
                    </div>
                    {club.description ? <p className="mt-1 line-clamp-2 text-ink-muted">{club.description}</p> : null}
                    <p className="mt-2 text-sm text-ink-muted">
                      <span className="num">{club.memberCount}</span> {club.memberCount === 1 ? 'member' : 'members'}
                    </p>
                  </Link>
                </li>
              ))}
            </ul>
          )}
        </section>
        <StartClubForm />
      </div>
    </>
  );
}
