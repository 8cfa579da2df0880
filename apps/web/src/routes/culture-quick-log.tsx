import { useState, type FormEvent } from 'react';
import { Link, useParams } from 'react-router';
import { useQuery } from '@tanstack/react-query';
import {
  CultureEventCreateSchema,
  CultureStateChangeSchema,
  type CultureDetailDto,
  type CultureEventCreateInput,
} from '@barmkeep/schemas';
import { cultureQueries } from '../api/cultures/queries';
import { useAddEventMutation, useChangeStateMutation } from '../api/cultures/mutations';
import { isApiError } from '../api/client';
import { Button, Card, Loading, Notice, TextField } from '../components';

type Action = 'counted' | 'fed' | 'moved' | 'discarded';
const ACTIONS: { id: Action; label: string }[] = [
  { id: 'counted', label: 'Count' },
  { id: 'fed', label: 'Fed' },
  { id: 'moved', label: 'Moved' },
  { id: 'discarded', label: 'Discarded' },
];

const numberOrUndefined = (v: FormDataEntryValue | null) =>
  v === null || String(v).trim() === '' ? undefined : Number(v);

/** zod issues as { field: message }, for the few fields on this screen. */
function fieldErrors(issues: { path: PropertyKey[]; message: string }[]) {
  const out: Record<string, string> = {};
  for (const i of issues) out[String(i.path.at(-1) ?? 'form')] ??= i.message;
  return out;
}

function QuickLog({ culture }: { culture: CultureDetailDto }) {
  const [action, setAction] = useState<Action>('counted');
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [done, setDone] = useState<string | null>(null);
  const addEvent = useAddEventMutation(culture.id);
  const changeState = useChangeStateMutation(culture.id);
  const busy = addEvent.isPending || changeState.isPending;
  const kept = ['active', 'stored', 'quarantined'].includes(culture.state);

  async function submit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    setDone(null);
    const f = new FormData(e.currentTarget);
    try {
      if (action === 'discarded') {
        const parsed = CultureStateChangeSchema.safeParse({ state: 'discarded', notes: String(f.get('notes') ?? '') });
        if (!parsed.success) return setErrors(fieldErrors(parsed.error.issues));
        await changeState.mutateAsync({ state: 'discarded', notes: parsed.data.notes });
        setErrors({});
        return setDone('Marked as discarded.');
      }
      const data =
        action === 'counted'
          ? {
              cellsCounted: numberOrUndefined(f.get('cellsCounted')),
              squaresCounted: numberOrUndefined(f.get('squaresCounted')),
              dilution: numberOrUndefined(f.get('dilution')),
              live: numberOrUndefined(f.get('live')),
              dead: numberOrUndefined(f.get('dead')),
            }
          : action === 'fed'
            ? { volumeMl: numberOrUndefined(f.get('volumeMl')) }
            : {
                locationLabel: String(f.get('locationLabel') ?? '').trim() || undefined,
                storageTempC: numberOrUndefined(f.get('storageTempC')),
              };
      const input = { kind: action, notes: String(f.get('notes') ?? ''), data } as CultureEventCreateInput;
      const parsed = CultureEventCreateSchema.safeParse(input);
      if (!parsed.success) return setErrors(fieldErrors(parsed.error.issues));
      await addEvent.mutateAsync(input);
      setErrors({});
      e.currentTarget?.reset();
      setDone(action === 'counted' ? 'Count logged.' : action === 'fed' ? 'Feed logged.' : 'Move logged.');
    } catch (err) {
      setErrors({ form: isApiError(err) ? err.message : 'Could not save; try again.' });
    }
  }

  return (
    <div className="space-y-4">
      <Card className="space-y-1">
        <p className="num text-sm text-ink-muted">
          <span className="sr-only">Label code </span>
          {culture.labelCode}
        </p>
        <h1 className="text-xl font-semibold">{culture.strainName}</h1>
        <p className="text-sm text-ink-muted">
          Generation <span className="num">{culture.generation}</span> · {culture.state.replace('_', ' ')} ·{' '}
          <span className="num">{Math.round(culture.projectedViability * 100)}%</span> viable (projected)
          {culture.locationLabel ? ` · ${culture.locationLabel}` : ''}
        </p>
        <Link to={`/cultures/${culture.id}`} className="text-sm text-accent-strong underline underline-offset-4">
          Open the full culture page
        </Link>
      </Card>
      {!kept ? (
        <Notice title={`This culture is ${culture.state.replace('_', ' ')}`}>Nothing more to log here.</Notice>
      ) : (
        <>
          <div role="group" aria-label="What happened" className="grid grid-cols-2 gap-2 sm:grid-cols-4">
            {ACTIONS.map((a) => (
              <Button
                key={a.id}
                variant={action === a.id ? 'primary' : 'secondary'}
                aria-pressed={action === a.id}
                onClick={() => {
                  setAction(a.id);
                  setErrors({});
                  setDone(null);
                }}
              >
                {a.label}
              </Button>
            ))}
          </div>
          <form onSubmit={submit} noValidate className="space-y-3" aria-label={`Log: ${action}`}>
            {errors.form ? <Notice tone="danger" live="assertive" title={errors.form} /> : null}
            {action === 'counted' ? (
              <div className="grid grid-cols-2 gap-3">
                <TextField
                  label="Cells counted"
                  name="cellsCounted"
                  type="number"
                  inputMode="numeric"
                  error={errors.cellsCounted}
                />
                <TextField
                  label="Squares counted"
                  name="squaresCounted"
                  type="number"
                  inputMode="numeric"
                  error={errors.squaresCounted}
                />
                <TextField
                  label="Dilution factor"
                  name="dilution"
                  type="number"
                  inputMode="decimal"
                  defaultValue="1"
                  error={errors.dilution}
                />
                <span />
                <TextField label="Live (stain)" name="live" type="number" inputMode="numeric" error={errors.live} />
                <TextField label="Dead (stain)" name="dead" type="number" inputMode="numeric" error={errors.dead} />
              </div>
            ) : action === 'fed' ? (
              <>
                <TextField
                  label="Wort added (mL)"
                  name="volumeMl"
                  type="number"
                  inputMode="decimal"
                  error={errors.volumeMl}
                />
                <p className="text-sm text-ink-muted">
                  Let boiled wort cool, covered, before it goes in; hot glass can crack and scald.
                </p>
              </>
            ) : action === 'moved' ? (
              <div className="grid grid-cols-2 gap-3">
                <TextField
                  label="New place"
                  name="locationLabel"
                  defaultValue={culture.locationLabel}
                  error={errors.locationLabel}
                />
                <TextField
                  label="Kept at (°C)"
                  name="storageTempC"
                  type="number"
                  inputMode="decimal"
                  error={errors.storageTempC ?? errors.data}
                />
              </div>
            ) : (
              <p>Mark this culture as discarded. It leaves your kept cultures and its reminders stop.</p>
            )}
            <TextField label="Note (optional)" name="notes" error={errors.notes} />
            <Button
              type="submit"
              variant={action === 'discarded' ? 'danger' : 'primary'}
              busy={busy}
              busyLabel="Saving…"
            >
              {action === 'discarded' ? 'Discard it' : 'Log it'}
            </Button>
          </form>
          {done ? (
            <Notice tone="success" live="polite" word="Saved">
              {done}
            </Notice>
          ) : null}
        </>
      )}
    </div>
  );
}

/** What a jar label's QR code opens: log a count, a feed, a move or a discard in a few taps. */
export function Component() {
  const { id = '' } = useParams();
  const culture = useQuery(cultureQueries.detail(id));
  return (
    <>
      <title>Quick log · Barmkeep</title>
      {culture.isError ? (
        <Notice
          tone="danger"
          title={
            isApiError(culture.error) && culture.error.status === 404
              ? 'No culture of yours has this label'
              : 'Could not load'
          }
        >
          {isApiError(culture.error) && culture.error.status === 404
            ? 'It may belong to someone else, or have been removed.'
            : culture.error.message}
        </Notice>
      ) : culture.data ? (
        <QuickLog culture={culture.data} />
      ) : (
        <Loading />
      )}
    </>
  );
}
