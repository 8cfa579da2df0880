import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router';
import { authQueries } from '../api/auth/queries';
import { planningQueries } from '../api/planning/queries';
import { ButtonLink, Card, EmptyState, Loading, Notice, PageHeader } from '../components';
import { formatWhen } from '../lib/planningFormat';

const words = {
  planned: 'Planned',
  in_progress: 'Starter under way',
  pitched: 'Pitched',
  cancelled: 'Called off',
} as const;

export function Component() {
  const me = useQuery(authQueries.me());
  const plans = useQuery(planningQueries.plans());
  return (
    <>
      <PageHeader
        title="Starter plans"
        actions={
          <>
            <ButtonLink to="/plans/new">Plan a starter</ButtonLink>
            <ButtonLink to="/batches" variant="secondary">
              Batches
            </ButtonLink>
          </>
        }
      />
      {plans.isPending || !me.data ? (
        <Loading />
      ) : plans.isError ? (
        <Notice tone="danger" title={plans.error.message} />
      ) : plans.data.length === 0 ? (
        <EmptyState title="No plans yet" action={<ButtonLink to="/plans/new">Plan a starter</ButtonLink>}>
          Plan the starter for your next brew day, or grow a jar of sediment to a pitchable size.
        </EmptyState>
      ) : (
        <ul className="space-y-3">
          {plans.data.map((p) => (
            <li key={p.id}>
              <Card className="p-4 sm:p-4">
                <Link
                  to={`/plans/${p.id}`}
                  className="text-lg font-semibold text-accent underline-offset-4 hover:underline"
                >
                  {p.name}
                </Link>
                <p className="text-ink-muted">
                  {words[p.status]} · {p.strainNames.join(' + ') || 'culture no longer available'} ·{' '}
                  {p.stepsDone === 0
                    ? 'no step done yet'
                    : p.stepsDone === 1
                      ? '1 step done'
                      : `${p.stepsDone} steps done`}
                  {p.brewAt ? (
                    <>
                      {' '}
                      · brew <span className="num">{formatWhen(p.brewAt, me.data!.timeZone)}</span>
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
