import { useQuery } from '@tanstack/react-query';
import { Plus } from 'lucide-react';
import { authQueries } from '../api/auth/queries';
import { cultureQueries } from '../api/cultures/queries';
import { ButtonLink, EmptyState, Loading, Mark, PageHeader } from '../components';
import { CultureLibrary } from './cultures/library';

export function Component() {
  const { data: user } = useQuery(authQueries.me());
  const firstName = user?.name.split(/\s+/)[0];
  const any = useQuery(cultureQueries.list({ sort: 'attention', dir: 'asc', page: 1, pageSize: 1 }));
  if (any.isPending) return <Loading label="Loading your cultures…" />;
  if (any.data && any.data.total > 0) {
    return (
      <>
        <title>Your cultures · Barmkeep</title>
        <PageHeader
          title="Your cultures"
          description={firstName ? `${firstName}, this is everything you are keeping alive.` : undefined}
          actions={
            <ButtonLink to="/cultures/new" icon={<Plus aria-hidden className="size-5" />}>
              Add a culture
            </ButtonLink>
          }
        />
        <CultureLibrary />
      </>
    );
  }

  return (
    <>
      <title>Your cultures · Barmkeep</title>
      <PageHeader
        title="Your cultures"
        description={firstName ? `${firstName}, this is everything you are keeping alive.` : undefined}
      />
      <EmptyState
        icon={<Mark className="size-14" />}
        title="Nothing in the keep yet"
        action={
          <ButtonLink to="/cultures/new" icon={<Plus aria-hidden className="size-5" />}>
            Add your first culture
          </ButtonLink>
        }
      >
        <p>
          Log a culture you have on hand — a fresh pack, a jar of saved slurry, a slant, dregs from a bottle. Barmkeep
          notes where it came from, estimates how many cells are still alive, and reminds you before it gets too old to
          pitch.
        </p>
      </EmptyState>
    </>
  );
}
