import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { useQuery } from '@tanstack/react-query';
import { Link, useParams } from 'react-router';
import { CircleCheck, Hourglass, Play } from 'lucide-react';
import type { PlanDto, PlanStepLogDto, UserDto } from '@barmkeep/schemas';
import { authQueries } from '../api/auth/queries';
import { planningQueries } from '../api/planning/queries';
import { useCompleteStepMutation, useSetPlanStatusMutation, useStartStepMutation } from '../api/planning/mutations';
import { isApiError } from '../api/client';
import { Button, ButtonLink, Card, FormAlert, Loading, Notice, PageHeader, TextField } from '../components';
import { Cautions, PlanView } from '../components/planning/PlanView';
import {
  formatBatchVolume,
  formatCells,
  formatGravityFromPlato,
  formatHours,
  formatStarterVolume,
  formatWhen,
} from '../lib/planningFormat';

const statusWords: Record<PlanDto['status'], string> = {
  planned: 'Planned',
  in_progress: 'Starter under way',
  pitched: 'Pitched',
  cancelled: 'Called off',
};

interface CountForm {
  cellsCounted: string;
  squaresCounted: string;
  dilution: string;
  live: string;
  dead: string;
  notes: string;
}

function CompleteStepForm({ plan, step }: { plan: PlanDto; step: PlanStepLogDto }) {
  const complete = useCompleteStepMutation(plan.id);
  const [error, setError] = useState<string | undefined>();
  const [fieldErrors, setFieldErrors] = useState<Record<string, string>>({});
  const { register, handleSubmit } = useForm<CountForm>({
    defaultValues: { cellsCounted: '', squaresCounted: '5', dilution: '10', live: '', dead: '', notes: '' },
  });
  const n = (s: string) => (s.trim() === '' ? undefined : Number(s));
  const onSubmit = handleSubmit(async (v) => {
    setError(undefined);
    setFieldErrors({});
    const counted = n(v.cellsCounted);
    const count =
      counted === undefined
        ? undefined
        : {
            cellsCounted: counted,
            squaresCounted: n(v.squaresCounted) ?? 5,
            dilution: n(v.dilution) ?? 1,
            ...(n(v.live) !== undefined || n(v.dead) !== undefined ? { live: n(v.live), dead: n(v.dead) } : {}),
          };
    try {
      await complete.mutateAsync({ stepId: step.id, input: { ...(count ? { count } : {}), notes: v.notes } });
    } catch (err) {
      if (isApiError(err)) {
        const f: Record<string, string> = {};
        for (const [k, m] of Object.entries(err.fields)) f[k.replace(/^body\.(count\.)?/, '')] = m.join(' ');
        setFieldErrors(f);
        setError(err.message);
      } else setError('Something unexpected went wrong. Try again.');
    }
  });
  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4" aria-label={`Complete step ${step.position}`}>
      <FormAlert message={error} />
      <p className="text-ink-muted">
        Counted the finished starter? Enter the hemocytometer count and the plan re-works the remaining steps from it.
        Leave the count empty to carry on with the prediction.
      </p>
      <div className="grid grid-cols-1 gap-3 sm:grid-cols-3">
        <TextField
          label="Cells counted"
          inputMode="numeric"
          error={fieldErrors.cellsCounted}
          {...register('cellsCounted')}
        />
        <TextField
          label="Medium squares counted"
          inputMode="numeric"
          error={fieldErrors.squaresCounted}
          {...register('squaresCounted')}
        />
        <TextField
          label="Dilution factor (stain included)"
          inputMode="decimal"
          error={fieldErrors.dilution}
          {...register('dilution')}
        />
        <TextField
          label="Stain: clear (live) cells"
          inputMode="numeric"
          hint="Optional"
          error={fieldErrors.live}
          {...register('live')}
        />
        <TextField
          label="Stain: coloured (dead) cells"
          inputMode="numeric"
          hint="Optional"
          error={fieldErrors.dead}
          {...register('dead')}
        />
      </div>
      <p className="text-sm text-ink-muted">
        Without a stain the count is taken as all alive, as a freshly grown starter mostly is.
      </p>
      <TextField label="Notes" {...register('notes')} />
      <Button
        type="submit"
        busy={complete.isPending}
        busyLabel="Saving…"
        icon={<CircleCheck aria-hidden className="size-5" />}
      >
        Complete step {step.position}
      </Button>
    </form>
  );
}

function StepLog({ plan, user }: { plan: PlanDto; user: UserDto }) {
  if (plan.executed.length === 0) return null;
  return (
    <Card className="space-y-3">
      <h2 className="text-lg font-semibold">Steps so far</h2>
      <ol className="space-y-3">
        {plan.executed.map((s) => {
          const ratio = s.measured ? s.measured.cells / s.expectedCells : null;
          return (
            <li key={s.id} className="rounded-md border border-rule p-3" data-testid="logged-step">
              <p className="flex items-center gap-2 font-medium">
                {s.completedAt ? (
                  <CircleCheck aria-hidden className="size-5 text-accent" />
                ) : (
                  <Hourglass aria-hidden className="size-5 text-warn" />
                )}
                Step {s.position}: <span className="num">{formatStarterVolume(s.volumeL, user.unitSystem)}</span> at{' '}
                <span className="num">{formatGravityFromPlato(s.plato, user.gravityUnit)}</span> —{' '}
                {s.completedAt ? 'done' : 'under way'}
              </p>
              <dl className="mt-2 grid grid-cols-1 gap-2 text-sm sm:grid-cols-3">
                <div>
                  <dt className="text-ink-muted">Started</dt>
                  <dd className="num">{formatWhen(s.startedAt, user.timeZone)}</dd>
                </div>
                <div>
                  <dt className="text-ink-muted">Predicted at the end</dt>
                  <dd className="num">{formatCells(s.expectedCells)}</dd>
                </div>
                <div>
                  <dt className="text-ink-muted">Measured</dt>
                  <dd>
                    {s.measured ? (
                      <>
                        <span className="num">{formatCells(s.measured.cells)}</span>{' '}
                        <span className="text-ink-muted">
                          (<span className="num">{formatCells(s.measured.low)}</span> –{' '}
                          <span className="num">{formatCells(s.measured.high)}</span>),{' '}
                          <span className="num">{Math.round(ratio! * 100)}%</span> of predicted
                        </span>
                      </>
                    ) : s.completedAt ? (
                      'not counted'
                    ) : (
                      `expected to finish ${formatWhen(new Date(Date.parse(s.startedAt) + s.hours * 3.6e6), user.timeZone)}`
                    )}
                  </dd>
                </div>
              </dl>
              {s.notes ? <p className="mt-1 text-sm">{s.notes}</p> : null}
            </li>
          );
        })}
      </ol>
    </Card>
  );
}

/** Call the plan off (with a second, explicit step) or take a called-off plan up again. */
function PlanStatusControl({ plan }: { plan: PlanDto }) {
  const setStatus = useSetPlanStatusMutation(plan.id);
  const [asking, setAsking] = useState(false);
  if (plan.status === 'pitched') return null;
  if (plan.status === 'cancelled') {
    return (
      <Card className="space-y-3">
        <p>This plan is called off: no reminders come for it.</p>
        <Button variant="secondary" onClick={() => setStatus.mutate('planned')} busy={setStatus.isPending}>
          Take the plan up again
        </Button>
        {setStatus.error ? <p className="text-danger">{setStatus.error.message}</p> : null}
      </Card>
    );
  }
  return (
    <Card className="space-y-3">
      {asking ? (
        <>
          <p id="call-off-question">
            Call this plan off? Reminders for its steps and brew day stop; the steps you logged stay in the
            culture&apos;s history.
          </p>
          <div className="flex flex-wrap gap-3" role="group" aria-labelledby="call-off-question">
            <Button
              variant="danger"
              onClick={() => setStatus.mutate('cancelled', { onSuccess: () => setAsking(false) })}
              busy={setStatus.isPending}
            >
              Yes, call it off
            </Button>
            <Button variant="secondary" onClick={() => setAsking(false)}>
              Keep the plan
            </Button>
          </div>
        </>
      ) : (
        <Button variant="secondary" onClick={() => setAsking(true)}>
          Call this plan off
        </Button>
      )}
      {setStatus.error ? <p className="text-danger">{setStatus.error.message}</p> : null}
    </Card>
  );
}

function PlanPage({ plan, user }: { plan: PlanDto; user: UserDto }) {
  const start = useStartStepMutation(plan.id);
  const open = plan.executed.find((s) => !s.completedAt);
  const next = plan.computed.steps[0];
  const closed = plan.status === 'pitched' || plan.status === 'cancelled';
  const canPitch = !closed && !open && plan.purpose === 'batch';
  return (
    <>
      <PageHeader
        title={plan.name}
        description={
          <>
            {statusWords[plan.status]} ·{' '}
            {plan.cultures.map((c, i) => (
              <span key={c.id}>
                {i > 0 ? ' + ' : ''}
                {c.available ? (
                  <Link to={`/cultures/${c.id}`} className="text-accent underline">
                    {c.strainName}
                  </Link>
                ) : (
                  c.strainName
                )}
              </span>
            ))}
            {plan.batchVolumeL != null ? (
              <>
                {' '}
                · <span className="num">{formatBatchVolume(plan.batchVolumeL, user.unitSystem)}</span> at{' '}
                <span className="num">{formatGravityFromPlato(plan.ogPlato!, user.gravityUnit)}</span>
              </>
            ) : null}
            {plan.brewAt ? (
              <>
                {' '}
                · brew <span className="num">{formatWhen(plan.brewAt, user.timeZone)}</span>
              </>
            ) : null}
          </>
        }
        actions={
          canPitch ? (
            <ButtonLink to={`/batches/new?planId=${plan.id}`}>Pitch into a batch</ButtonLink>
          ) : plan.batchIds[0] ? (
            <ButtonLink to={`/batches/${plan.batchIds[0]}`} variant="secondary">
              The batch
            </ButtonLink>
          ) : null
        }
      />
      <div className="grid gap-6 lg:grid-cols-[minmax(0,1fr)_minmax(0,22rem)]">
        <div className="min-w-0 space-y-5">
          <StepLog plan={plan} user={user} />
          {!closed && open ? (
            <Card>
              <CompleteStepForm plan={plan} step={open} />
            </Card>
          ) : null}
          {!closed && !open && next ? (
            <Card className="flex flex-wrap items-center justify-between gap-3">
              <p>
                Next: step {plan.executed.length + 1},{' '}
                <span className="num">{formatStarterVolume(next.volumeL, user.unitSystem)}</span> for about{' '}
                <span className="num">{formatHours(next.hours)}</span>.
              </p>
              <Button
                onClick={() => start.mutate()}
                busy={start.isPending}
                icon={<Play aria-hidden className="size-5" />}
              >
                Start step {plan.executed.length + 1}
              </Button>
              {start.error ? <p className="w-full text-danger">{start.error.message}</p> : null}
            </Card>
          ) : null}
          {plan.growthCorrection !== 1 ? (
            <Notice title={`growth correction ${plan.growthCorrection.toFixed(2)} in use`}>
              From your own measured steps; change it under Account → Equipment.
            </Notice>
          ) : null}
          <h2 className="text-lg font-semibold">{plan.executed.length ? 'From here' : 'The plan'}</h2>
          <PlanView plan={plan.computed} units={user} stepOffset={plan.executed.length} />
          <p className="text-sm text-ink-muted">
            Worked out again by the server at <span className="num">{formatWhen(plan.computedAt, user.timeZone)}</span>{' '}
            from what you logged.
          </p>
          <PlanStatusControl plan={plan} />
        </div>
        <Cautions />
      </div>
    </>
  );
}

export function Component() {
  const { id = '' } = useParams();
  const me = useQuery(authQueries.me());
  const plan = useQuery(planningQueries.plan(id));
  if (plan.isPending || !me.data) return <Loading label="Loading the plan" />;
  if (plan.isError) return <Notice tone="danger" title={plan.error.message} />;
  return <PlanPage plan={plan.data} user={me.data} />;
}
