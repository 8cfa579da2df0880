import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router';
import { authQueries } from '../api/auth/queries';
import { planningQueries } from '../api/planning/queries';
import { ButtonLink, Card, EmptyState, Loading, Notice, PageHeader } from '../components';
import { formatWhen } from '../lib/planningFormat';

export function Component() {
  const me = useQuery(authQueries.me());
  const batches = useQuery(planningQueries.batches());
  return (
    <>
      <PageHeader title="Batches" actions={<ButtonLink to="/plans">Starter plans</ButtonLink>} />
      {batches.isPending || !me.data ? (
        <Loading />
      ) : batches.isError ? (
        <Notice tone="danger" title={batches.error.message} />
      ) : batches.data.length === 0 ? (
        <EmptyState title="No batches yet">Pitch a starter plan into a batch and it is recorded here.</EmptyState>
      ) : (
        <ul className="space-y-3">
          {batches.data.map((b) => (
            <li key={b.id}>
              <Card className="p-4 sm:p-4">
                <Link
                  to={`/batches/${b.id}`}
                  className="text-lg font-semibold text-accent underline-offset-4 hover:underline"
                >
                  {b.name}
                </Link>
                <p className="text-ink-muted">
                  <span className="num">{formatWhen(b.brewedAt, me.data!.timeZone)}</span> ·{' '}
                  {b.pitches.map((p) => `${p.strainName} (gen. ${p.generation})`).join(' + ')}
                  {b.derived.apparentAttenuation != null ? (
                    <>
                      {' '}
                      · <span className="num">{b.derived.apparentAttenuation.toFixed(1)}%</span> apparent attenuation
                    </>
                  ) : null}
                </p>
              </Card>
            </li>
          ))}
        </ul>
      )}
    </>
  );
}
